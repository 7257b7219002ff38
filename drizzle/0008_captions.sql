CREATE TABLE "lesson_captions" (
	"lesson_id" uuid PRIMARY KEY NOT NULL,
	"version" integer NOT NULL,
	"language" text NOT NULL,
	"label" text NOT NULL,
	"cues" jsonb NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "player_preferences" (
	"user_id" text PRIMARY KEY NOT NULL,
	"captions_on" boolean DEFAULT false NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "lesson_captions" ADD CONSTRAINT "lesson_captions_lesson_id_lessons_id_fk" FOREIGN KEY ("lesson_id") REFERENCES "public"."lessons"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "player_preferences" ADD CONSTRAINT "player_preferences_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;