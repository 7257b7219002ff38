CREATE TYPE "public"."recording_state" AS ENUM('uploading', 'processing', 'ready', 'failed');--> statement-breakpoint
CREATE TABLE "recordings" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"studio_id" uuid NOT NULL,
	"lesson_id" uuid NOT NULL,
	"created_by" text,
	"state" "recording_state" DEFAULT 'uploading' NOT NULL,
	"source_key" text NOT NULL,
	"upload_id" text,
	"file_name" text NOT NULL,
	"content_type" text NOT NULL,
	"size_bytes" bigint NOT NULL,
	"step" text,
	"progress" real DEFAULT 0 NOT NULL,
	"failure_reason" text,
	"warnings" text[] DEFAULT '{}'::text[] NOT NULL,
	"duration_seconds" real,
	"width" integer,
	"height" integer,
	"frame_rate" real,
	"has_audio" boolean,
	"output_prefix" text,
	"renditions" jsonb,
	"peaks_rate" integer,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"ready_at" timestamp with time zone
);
--> statement-breakpoint
ALTER TABLE "lessons" ADD COLUMN "current_recording_id" uuid;--> statement-breakpoint
ALTER TABLE "recordings" ADD CONSTRAINT "recordings_studio_id_studios_id_fk" FOREIGN KEY ("studio_id") REFERENCES "public"."studios"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "recordings" ADD CONSTRAINT "recordings_lesson_id_lessons_id_fk" FOREIGN KEY ("lesson_id") REFERENCES "public"."lessons"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "recordings" ADD CONSTRAINT "recordings_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "recordings_lesson_idx" ON "recordings" USING btree ("lesson_id");--> statement-breakpoint
CREATE INDEX "recordings_state_idx" ON "recordings" USING btree ("state","updated_at");