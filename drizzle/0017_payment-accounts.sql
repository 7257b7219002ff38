CREATE TABLE "payment_accounts" (
	"studio_id" uuid PRIMARY KEY NOT NULL,
	"provider_account_id" text NOT NULL,
	"details_submitted" boolean DEFAULT false NOT NULL,
	"charges_enabled" boolean DEFAULT false NOT NULL,
	"payouts_enabled" boolean DEFAULT false NOT NULL,
	"requirements_due" integer DEFAULT 0 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "payment_accounts_providerAccountId_unique" UNIQUE("provider_account_id")
);
--> statement-breakpoint
ALTER TABLE "billing_settings" ADD COLUMN "provider_account_id" text;--> statement-breakpoint
ALTER TABLE "promo_codes" ADD COLUMN "provider_account_id" text;--> statement-breakpoint
ALTER TABLE "subscriptions" ADD COLUMN "provider_account_id" text;--> statement-breakpoint
ALTER TABLE "payment_accounts" ADD CONSTRAINT "payment_accounts_studio_id_studios_id_fk" FOREIGN KEY ("studio_id") REFERENCES "public"."studios"("id") ON DELETE cascade ON UPDATE no action;