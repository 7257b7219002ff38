ALTER TABLE "lessons" ADD COLUMN "published_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "lessons" ADD COLUMN "listed_minutes" double precision GENERATED ALWAYS AS (coalesce(published_seconds / 60.0, advertised_minutes::double precision)) STORED;--> statement-breakpoint
UPDATE "lessons" SET "published_at" = v."published_at" FROM "lesson_versions" v WHERE v."id" = "lessons"."published_version_id";--> statement-breakpoint
CREATE INDEX "lessons_library_idx" ON "lessons" USING btree ("studio_id","published_at" DESC NULLS LAST,"id") INCLUDE ("impact","difficulty","coach_id","listed_minutes") WHERE state = 'published' and published_version_id is not null;
