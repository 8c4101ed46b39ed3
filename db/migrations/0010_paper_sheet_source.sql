CREATE TYPE "public"."sighting_source" AS ENUM('phone', 'paper_sheet');--> statement-breakpoint
ALTER TABLE "sightings" ADD COLUMN "source" "sighting_source" DEFAULT 'phone' NOT NULL;--> statement-breakpoint
ALTER TABLE "sightings" ADD COLUMN "transcribed_by" uuid;--> statement-breakpoint
ALTER TABLE "sightings" ADD CONSTRAINT "sightings_transcribed_by_users_id_fk" FOREIGN KEY ("transcribed_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;