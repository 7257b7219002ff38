CREATE TABLE "recording_audio_analyses" (
	"recording_id" uuid PRIMARY KEY NOT NULL,
	"studio_id" uuid NOT NULL,
	"analyzer_version" integer NOT NULL,
	"event_count" integer NOT NULL,
	"seconds" real NOT NULL,
	"analyzed_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "recording_events" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"recording_id" uuid NOT NULL,
	"at_seconds" double precision NOT NULL,
	"kind" text NOT NULL,
	"strength" real NOT NULL,
	"duration_seconds" real NOT NULL,
	"frequency_hz" real
);
--> statement-breakpoint
ALTER TABLE "recording_audio_analyses" ADD CONSTRAINT "recording_audio_analyses_recording_id_recordings_id_fk" FOREIGN KEY ("recording_id") REFERENCES "public"."recordings"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "recording_audio_analyses" ADD CONSTRAINT "recording_audio_analyses_studio_id_studios_id_fk" FOREIGN KEY ("studio_id") REFERENCES "public"."studios"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "recording_events" ADD CONSTRAINT "recording_events_recording_id_recordings_id_fk" FOREIGN KEY ("recording_id") REFERENCES "public"."recordings"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "recording_events_recording_idx" ON "recording_events" USING btree ("recording_id","at_seconds");