CREATE TYPE "public"."play_event_kind" AS ENUM('start', 'progress', 'seek', 'chapter', 'leave', 'finish');--> statement-breakpoint
CREATE TABLE "lesson_versions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"lesson_id" uuid NOT NULL,
	"number" integer NOT NULL,
	"recording_id" uuid NOT NULL,
	"snapshot" jsonb NOT NULL,
	"chapters_vtt" text NOT NULL,
	"duration_seconds" real NOT NULL,
	"warnings_acknowledged" boolean DEFAULT false NOT NULL,
	"published_by" text,
	"published_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "play_events" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"user_id" text NOT NULL,
	"lesson_id" uuid NOT NULL,
	"version_id" uuid NOT NULL,
	"kind" "play_event_kind" NOT NULL,
	"at_seconds" real NOT NULL,
	"from_seconds" real,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "play_progress" (
	"user_id" text NOT NULL,
	"lesson_id" uuid NOT NULL,
	"version_id" uuid NOT NULL,
	"position_seconds" real DEFAULT 0 NOT NULL,
	"work_watched_seconds" real DEFAULT 0 NOT NULL,
	"watched_spans" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"started_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"finished_at" timestamp with time zone
);
--> statement-breakpoint
ALTER TABLE "users" ADD COLUMN "caution_acknowledged_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "lessons" ADD COLUMN "published_version_id" uuid;--> statement-breakpoint
ALTER TABLE "lessons" ADD COLUMN "publish_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "lessons" ADD COLUMN "publish_scheduled_by" text;--> statement-breakpoint
ALTER TABLE "lessons" ADD COLUMN "publish_acknowledges_warnings" boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE "lessons" ADD COLUMN "search_document" text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE "lessons" ADD COLUMN "published_seconds" real;--> statement-breakpoint
ALTER TABLE "lesson_versions" ADD CONSTRAINT "lesson_versions_lesson_id_lessons_id_fk" FOREIGN KEY ("lesson_id") REFERENCES "public"."lessons"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lesson_versions" ADD CONSTRAINT "lesson_versions_recording_id_recordings_id_fk" FOREIGN KEY ("recording_id") REFERENCES "public"."recordings"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lesson_versions" ADD CONSTRAINT "lesson_versions_published_by_users_id_fk" FOREIGN KEY ("published_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "play_events" ADD CONSTRAINT "play_events_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "play_events" ADD CONSTRAINT "play_events_lesson_id_lessons_id_fk" FOREIGN KEY ("lesson_id") REFERENCES "public"."lessons"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "play_events" ADD CONSTRAINT "play_events_version_id_lesson_versions_id_fk" FOREIGN KEY ("version_id") REFERENCES "public"."lesson_versions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "play_progress" ADD CONSTRAINT "play_progress_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "play_progress" ADD CONSTRAINT "play_progress_lesson_id_lessons_id_fk" FOREIGN KEY ("lesson_id") REFERENCES "public"."lessons"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "play_progress" ADD CONSTRAINT "play_progress_version_id_lesson_versions_id_fk" FOREIGN KEY ("version_id") REFERENCES "public"."lesson_versions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "lesson_versions_lesson_number_idx" ON "lesson_versions" USING btree ("lesson_id","number");--> statement-breakpoint
CREATE INDEX "play_events_lesson_idx" ON "play_events" USING btree ("lesson_id","created_at");--> statement-breakpoint
CREATE UNIQUE INDEX "play_progress_user_lesson_idx" ON "play_progress" USING btree ("user_id","lesson_id");--> statement-breakpoint
ALTER TABLE "lessons" ADD CONSTRAINT "lessons_publish_scheduled_by_users_id_fk" FOREIGN KEY ("publish_scheduled_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "lessons_search_idx" ON "lessons" USING gin (to_tsvector('english', "search_document"));