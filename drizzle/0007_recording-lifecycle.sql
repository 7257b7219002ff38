CREATE TYPE "public"."recording_failure" AS ENUM('refused', 'interrupted');--> statement-breakpoint
CREATE TYPE "public"."recording_source" AS ENUM('upload', 'demo');--> statement-breakpoint
CREATE TYPE "public"."recording_step" AS ENUM('upload', 'probe', 'package', 'upload-outputs');--> statement-breakpoint
-- A new enum type instead of ADD VALUE: the migrator runs in one transaction, and a value added
-- there cannot be used by the backfill below until that transaction commits.
ALTER TYPE "public"."recording_state" RENAME TO "recording_state_before_cancelled";--> statement-breakpoint
CREATE TYPE "public"."recording_state" AS ENUM('uploading', 'processing', 'ready', 'failed', 'cancelled');--> statement-breakpoint
ALTER TABLE "recordings" ALTER COLUMN "state" DROP DEFAULT;--> statement-breakpoint
ALTER TABLE "recordings" ALTER COLUMN "state" SET DATA TYPE "public"."recording_state" USING "state"::text::"public"."recording_state";--> statement-breakpoint
ALTER TABLE "recordings" ALTER COLUMN "state" SET DEFAULT 'uploading';--> statement-breakpoint
DROP TYPE "public"."recording_state_before_cancelled";--> statement-breakpoint
ALTER TABLE "recordings" ADD COLUMN "source" "recording_source" DEFAULT 'upload' NOT NULL;--> statement-breakpoint
ALTER TABLE "recordings" ADD COLUMN "heartbeat_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "recordings" ADD COLUMN "failure_kind" "recording_failure";--> statement-breakpoint
ALTER TABLE "recordings" ADD COLUMN "container_seconds" real;--> statement-breakpoint
ALTER TABLE "recordings" ADD COLUMN "color_transfer" text;--> statement-breakpoint
ALTER TABLE "recordings" ADD COLUMN "loudness_lufs" real;--> statement-breakpoint
-- Backfill: demo recordings were marked by the upload id 'generated'.
UPDATE "recordings" SET "source" = 'demo', "upload_id" = NULL WHERE "upload_id" = 'generated';--> statement-breakpoint
-- Demo recordings still being generated had no state of their own: the seed makes them again.
UPDATE "recordings" SET "source" = 'demo', "state" = 'failed', "failure_kind" = 'interrupted', "step" = NULL,
  "failure_reason" = 'Making this demo recording stopped. It is made again the next time the demo data is loaded.'
  WHERE "step" = 'generate';--> statement-breakpoint
-- Cancelled uploads were marked by this sentence.
UPDATE "recordings" SET "state" = 'cancelled', "failure_reason" = NULL
  WHERE "state" = 'failed' AND "failure_reason" = 'You cancelled this upload. Add the file again to upload it.';--> statement-breakpoint
-- Earlier failures could all be retried; keep that for the ones whose upload finished.
UPDATE "recordings" SET "failure_kind" = CASE WHEN "upload_id" IS NOT NULL OR "source" = 'demo' THEN 'interrupted'::"recording_failure" ELSE 'refused'::"recording_failure" END
  WHERE "state" = 'failed' AND "failure_kind" IS NULL;--> statement-breakpoint
UPDATE "recordings" SET "step" = NULL WHERE "step" NOT IN ('upload', 'probe', 'package', 'upload-outputs');--> statement-breakpoint
ALTER TABLE "recordings" ALTER COLUMN "step" SET DATA TYPE "public"."recording_step" USING "step"::"public"."recording_step";
