CREATE TABLE "sighting_versions" (
	"sighting_id" uuid NOT NULL,
	"version" integer NOT NULL,
	"session_id" uuid,
	"taxon_id" uuid,
	"description" text NOT NULL,
	"count" integer NOT NULL,
	"count_is_estimate" boolean NOT NULL,
	"observed_at" timestamp with time zone NOT NULL,
	"location" geometry(Point,4326) NOT NULL,
	"accuracy_m" real NOT NULL,
	"notes" text NOT NULL,
	"replaced_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "sighting_versions_sighting_id_version_pk" PRIMARY KEY("sighting_id","version")
);
--> statement-breakpoint
ALTER TABLE "events" ADD COLUMN "review_closes_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "sightings" ADD COLUMN "withdrawn_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "sighting_versions" ADD CONSTRAINT "sighting_versions_sighting_id_sightings_id_fk" FOREIGN KEY ("sighting_id") REFERENCES "public"."sightings"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "sighting_versions" ADD CONSTRAINT "sighting_versions_taxon_id_taxa_id_fk" FOREIGN KEY ("taxon_id") REFERENCES "public"."taxa"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "events" ADD CONSTRAINT "events_review_after_end" CHECK ("events"."review_closes_at" IS NULL OR "events"."review_closes_at" >= "events"."ends_at");--> statement-breakpoint
ALTER TABLE "sightings" ADD CONSTRAINT "sightings_withdrawn_not_approved" CHECK ("sightings"."withdrawn_at" IS NULL OR "sightings"."review_state" <> 'approved');--> statement-breakpoint
-- Earlier versions of a sighting are history: never changed, never erased (as reviews, 0002).
CREATE TRIGGER sighting_versions_append_only BEFORE UPDATE OR DELETE ON sighting_versions
  FOR EACH ROW EXECUTE FUNCTION ecotone_refuse_change();
--> statement-breakpoint
CREATE TRIGGER sighting_versions_no_truncate BEFORE TRUNCATE ON sighting_versions
  FOR EACH STATEMENT EXECUTE FUNCTION ecotone_refuse_change();
