CREATE TABLE "studio_slug_redirects" (
	"slug" text PRIMARY KEY NOT NULL,
	"studio_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "sessions" ADD COLUMN "current_studio_id" uuid;--> statement-breakpoint
ALTER TABLE "studios" ADD COLUMN "accent_colour" text DEFAULT '#B93A17' NOT NULL;--> statement-breakpoint
ALTER TABLE "studio_slug_redirects" ADD CONSTRAINT "studio_slug_redirects_studio_id_studios_id_fk" FOREIGN KEY ("studio_id") REFERENCES "public"."studios"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "sessions" ADD CONSTRAINT "sessions_current_studio_id_studios_id_fk" FOREIGN KEY ("current_studio_id") REFERENCES "public"."studios"("id") ON DELETE set null ON UPDATE no action;