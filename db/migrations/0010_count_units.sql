CREATE TYPE "public"."count_unit" AS ENUM('individuals', 'stems', 'clumps', 'colonies', 'presence');--> statement-breakpoint
CREATE TABLE "event_count_units" (
	"event_id" uuid NOT NULL,
	"taxon_group" "taxon_group" NOT NULL,
	"unit" "count_unit" NOT NULL,
	CONSTRAINT "event_count_units_event_id_taxon_group_pk" PRIMARY KEY("event_id","taxon_group")
);
--> statement-breakpoint
ALTER TABLE "event_count_units" ADD CONSTRAINT "event_count_units_event_id_events_id_fk" FOREIGN KEY ("event_id") REFERENCES "public"."events"("id") ON DELETE cascade ON UPDATE no action;