ALTER TABLE "lessons" ADD COLUMN "cover_path" text;--> statement-breakpoint
ALTER TABLE "lessons" ADD COLUMN "cover_chosen" boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE "lessons" ADD COLUMN "review_requested_by" text;--> statement-breakpoint
ALTER TABLE "lessons" ADD COLUMN "review_requested_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "lessons" ADD COLUMN "review_note" text;--> statement-breakpoint
ALTER TABLE "lessons" ADD CONSTRAINT "lessons_review_requested_by_users_id_fk" FOREIGN KEY ("review_requested_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;