CREATE TABLE "result_session_taxa" (
	"event_id" uuid NOT NULL,
	"session_id" uuid NOT NULL,
	"taxon_id" uuid NOT NULL,
	"sightings" integer NOT NULL,
	CONSTRAINT "result_session_taxa_event_id_session_id_taxon_id_pk" PRIMARY KEY("event_id","session_id","taxon_id")
);
--> statement-breakpoint
CREATE TABLE "result_stamps" (
	"event_id" uuid PRIMARY KEY NOT NULL,
	"seq" bigint DEFAULT 1 NOT NULL
);
--> statement-breakpoint
CREATE TABLE "result_taxon_counts" (
	"event_id" uuid NOT NULL,
	"zone_key" uuid NOT NULL,
	"taxon_id" uuid NOT NULL,
	"individuals" bigint NOT NULL,
	"sightings" integer NOT NULL,
	CONSTRAINT "result_taxon_counts_event_id_zone_key_taxon_id_pk" PRIMARY KEY("event_id","zone_key","taxon_id")
);
--> statement-breakpoint
-- Results read aggregates, never every sighting (issue 7). Statement-level triggers with
-- transition tables fold a whole batch of inserted, updated or deleted sightings into the
-- two aggregate tables in one pass, so a sync batch or a bulk approval costs one upsert
-- per touched (zone, taxon) and (session, taxon), not one per row.
CREATE OR REPLACE FUNCTION ecotone_results_sync() RETURNS trigger
LANGUAGE plpgsql AS $$
DECLARE
  plus text := 'SELECT event_id, coalesce(zone_id, ''00000000-0000-0000-0000-000000000000''::uuid) AS zone_key, session_id, taxon_id, count::bigint AS individuals, 1 AS sightings FROM ecotone_new WHERE review_state = ''approved'' AND taxon_id IS NOT NULL';
  minus text := 'SELECT event_id, coalesce(zone_id, ''00000000-0000-0000-0000-000000000000''::uuid) AS zone_key, session_id, taxon_id, -count::bigint AS individuals, -1 AS sightings FROM ecotone_old WHERE review_state = ''approved'' AND taxon_id IS NOT NULL';
  delta text;
BEGIN
  -- The transition tables that exist depend on the operation, so the delta is built as text.
  delta := CASE TG_OP WHEN 'INSERT' THEN plus WHEN 'DELETE' THEN minus ELSE plus || ' UNION ALL ' || minus END;
  EXECUTE format($q$
    WITH d AS (%s),
    counts AS (
      INSERT INTO result_taxon_counts AS r (event_id, zone_key, taxon_id, individuals, sightings)
        SELECT event_id, zone_key, taxon_id, sum(individuals), sum(sightings) FROM d GROUP BY 1, 2, 3
        HAVING sum(individuals) <> 0 OR sum(sightings) <> 0 ORDER BY 1, 2, 3
      ON CONFLICT (event_id, zone_key, taxon_id) DO UPDATE
        SET individuals = r.individuals + excluded.individuals, sightings = r.sightings + excluded.sightings
      RETURNING 1
    ),
    stamps AS (
      INSERT INTO result_stamps AS r (event_id) SELECT DISTINCT event_id FROM d ORDER BY 1
      ON CONFLICT (event_id) DO UPDATE SET seq = r.seq + 1
      RETURNING 1
    )
    INSERT INTO result_session_taxa AS r (event_id, session_id, taxon_id, sightings)
      SELECT event_id, session_id, taxon_id, sum(sightings) FROM d WHERE session_id IS NOT NULL GROUP BY 1, 2, 3
      HAVING sum(sightings) <> 0 ORDER BY 1, 2, 3
    ON CONFLICT (event_id, session_id, taxon_id) DO UPDATE SET sightings = r.sightings + excluded.sightings
  $q$, delta);
  -- Rows that fell to zero go; the partial indexes below make finding them cheap.
  IF TG_OP <> 'INSERT' THEN
    DELETE FROM result_taxon_counts WHERE sightings <= 0;
    DELETE FROM result_session_taxa WHERE sightings <= 0;
  END IF;
  RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE INDEX result_taxon_counts_empty_idx ON result_taxon_counts (event_id) WHERE sightings <= 0;
--> statement-breakpoint
CREATE INDEX result_session_taxa_empty_idx ON result_session_taxa (event_id) WHERE sightings <= 0;
--> statement-breakpoint
CREATE TRIGGER sightings_results_insert AFTER INSERT ON sightings
  REFERENCING NEW TABLE AS ecotone_new FOR EACH STATEMENT EXECUTE FUNCTION ecotone_results_sync();
--> statement-breakpoint
CREATE TRIGGER sightings_results_update AFTER UPDATE ON sightings
  REFERENCING OLD TABLE AS ecotone_old NEW TABLE AS ecotone_new FOR EACH STATEMENT EXECUTE FUNCTION ecotone_results_sync();
--> statement-breakpoint
CREATE TRIGGER sightings_results_delete AFTER DELETE ON sightings
  REFERENCING OLD TABLE AS ecotone_old FOR EACH STATEMENT EXECUTE FUNCTION ecotone_results_sync();
--> statement-breakpoint
-- Fill the aggregates from the sightings already there.
INSERT INTO result_taxon_counts (event_id, zone_key, taxon_id, individuals, sightings)
  SELECT event_id, coalesce(zone_id, '00000000-0000-0000-0000-000000000000'::uuid), taxon_id, sum(count), count(*)
  FROM sightings WHERE review_state = 'approved' AND taxon_id IS NOT NULL GROUP BY 1, 2, 3;
--> statement-breakpoint
INSERT INTO result_session_taxa (event_id, session_id, taxon_id, sightings)
  SELECT event_id, session_id, taxon_id, count(*)
  FROM sightings WHERE review_state = 'approved' AND taxon_id IS NOT NULL AND session_id IS NOT NULL GROUP BY 1, 2, 3;
--> statement-breakpoint
INSERT INTO result_stamps (event_id) SELECT DISTINCT event_id FROM sightings;
