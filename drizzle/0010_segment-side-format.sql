CREATE TYPE "public"."segment_format" AS ENUM('amrap', 'emom');--> statement-breakpoint
CREATE TYPE "public"."segment_side" AS ENUM('left', 'right');--> statement-breakpoint
ALTER TABLE "segments" ADD COLUMN "side" "segment_side";--> statement-breakpoint
ALTER TABLE "segments" ADD COLUMN "format" "segment_format";