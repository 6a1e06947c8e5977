CREATE TYPE "public"."colour_space" AS ENUM('srgb', 'lin-rec709', 'acescg', 'aces2065-1', 'data');--> statement-breakpoint
ALTER TABLE "stills" ADD COLUMN "colour_space" "colour_space" DEFAULT 'srgb' NOT NULL;--> statement-breakpoint
ALTER TABLE "stills" ADD COLUMN "pixel_aspect_ratio" real DEFAULT 1 NOT NULL;--> statement-breakpoint
ALTER TABLE "stills" ADD COLUMN "exr" jsonb;