CREATE TABLE "result_session_lists" (
	"event_id" uuid NOT NULL,
	"session_id" uuid NOT NULL,
	"taxa" text NOT NULL,
	CONSTRAINT "result_session_lists_event_id_session_id_pk" PRIMARY KEY("event_id","session_id")
);
--> statement-breakpoint
CREATE TABLE "result_taxon_codes" (
	"taxon_id" uuid PRIMARY KEY NOT NULL,
	"code" integer GENERATED ALWAYS AS IDENTITY (sequence name "result_taxon_codes_code_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 2147483647 START WITH 1 CACHE 1),
	CONSTRAINT "result_taxon_codes_code_unique" UNIQUE("code")
);
--> statement-breakpoint
ALTER TABLE "result_taxon_codes" ADD CONSTRAINT "result_taxon_codes_taxon_id_taxa_id_fk" FOREIGN KEY ("taxon_id") REFERENCES "public"."taxa"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
-- Results' first read (issue 14): the presence list of every complete session was built on
-- each read from result_session_taxa (one row per session and taxon, ~600,000 at a million
-- sightings, through string_agg). Now each session's list is kept as one text of taxon codes
-- (ascending, comma-separated: read as is, where an int[] column would cost about twice as
-- much to send), changed by statement-level triggers on result_session_taxa itself: a code is
-- added when a (session, taxon) row becomes present (sightings > 0) and removed when it stops
-- being present. Adding and removing are applied to the row as it is when locked, so two
-- transactions changing the same session's taxa both land, in either order; the row locks
-- of result_session_taxa already order the changes of one (session, taxon).
-- Taxa get their code when they are created (a trigger on taxa), so every taxon has one.
CREATE OR REPLACE FUNCTION ecotone_taxon_codes_sync() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
  INSERT INTO result_taxon_codes (taxon_id) SELECT id FROM ecotone_new_taxa ORDER BY id ON CONFLICT (taxon_id) DO NOTHING;
  RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER taxa_result_codes AFTER INSERT ON taxa
  REFERENCING NEW TABLE AS ecotone_new_taxa FOR EACH STATEMENT EXECUTE FUNCTION ecotone_taxon_codes_sync();
--> statement-breakpoint
-- A list with codes added, and with codes removed ('' when none is left); both ascending.
CREATE OR REPLACE FUNCTION ecotone_codes_add(list text, more text) RETURNS text
LANGUAGE sql IMMUTABLE AS $$
  SELECT string_agg(x::text, ',' ORDER BY x)
  FROM (SELECT DISTINCT x FROM unnest(string_to_array(list, ',')::int[] || string_to_array(more, ',')::int[]) x) d
$$;
--> statement-breakpoint
CREATE OR REPLACE FUNCTION ecotone_codes_remove(list text, gone int[]) RETURNS text
LANGUAGE sql IMMUTABLE AS $$
  SELECT coalesce(string_agg(x::text, ',' ORDER BY x), '') FROM unnest(string_to_array(list, ',')::int[]) x WHERE x <> ALL (gone)
$$;
--> statement-breakpoint
-- Static statements in one branch per operation (each trigger has its own transition tables),
-- so their plans are kept; an update that changes no presence (one more sighting of a taxon
-- already present, the usual approval) stops at the first check.
CREATE OR REPLACE FUNCTION ecotone_session_lists_sync() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
  IF TG_OP = 'INSERT' THEN
    INSERT INTO result_session_lists AS l (event_id, session_id, taxa)
      SELECT n.event_id, n.session_id, string_agg(c.code::text, ',' ORDER BY c.code)
      FROM ecotone_lists_new n JOIN result_taxon_codes c ON c.taxon_id = n.taxon_id
      WHERE n.sightings > 0 GROUP BY 1, 2 ORDER BY 1, 2
    ON CONFLICT (event_id, session_id) DO UPDATE SET taxa = ecotone_codes_add(l.taxa, excluded.taxa);
  ELSIF TG_OP = 'UPDATE' THEN
    IF EXISTS (SELECT 1 FROM ecotone_lists_new n JOIN ecotone_lists_old o USING (event_id, session_id, taxon_id)
               WHERE (o.sightings > 0) <> (n.sightings > 0)) THEN
      INSERT INTO result_session_lists AS l (event_id, session_id, taxa)
        SELECT n.event_id, n.session_id, string_agg(c.code::text, ',' ORDER BY c.code)
        FROM ecotone_lists_new n JOIN ecotone_lists_old o USING (event_id, session_id, taxon_id)
        JOIN result_taxon_codes c ON c.taxon_id = n.taxon_id
        WHERE n.sightings > 0 AND o.sightings <= 0 GROUP BY 1, 2 ORDER BY 1, 2
      ON CONFLICT (event_id, session_id) DO UPDATE SET taxa = ecotone_codes_add(l.taxa, excluded.taxa);
      UPDATE result_session_lists l SET taxa = ecotone_codes_remove(l.taxa, r.codes)
      FROM (
        SELECT o.event_id, o.session_id, array_agg(c.code) AS codes
        FROM ecotone_lists_new n JOIN ecotone_lists_old o USING (event_id, session_id, taxon_id)
        JOIN result_taxon_codes c ON c.taxon_id = o.taxon_id
        WHERE o.sightings > 0 AND n.sightings <= 0 GROUP BY 1, 2
      ) r
      WHERE l.event_id = r.event_id AND l.session_id = r.session_id;
      -- A session with no taxon left has no row (found through the partial index below).
      DELETE FROM result_session_lists WHERE taxa = '';
    END IF;
  ELSE
    IF EXISTS (SELECT 1 FROM ecotone_lists_old WHERE sightings > 0) THEN
      UPDATE result_session_lists l SET taxa = ecotone_codes_remove(l.taxa, r.codes)
      FROM (
        SELECT o.event_id, o.session_id, array_agg(c.code) AS codes
        FROM ecotone_lists_old o JOIN result_taxon_codes c ON c.taxon_id = o.taxon_id
        WHERE o.sightings > 0 GROUP BY 1, 2
      ) r
      WHERE l.event_id = r.event_id AND l.session_id = r.session_id;
      DELETE FROM result_session_lists WHERE taxa = '';
    END IF;
  END IF;
  RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE INDEX result_session_lists_empty_idx ON result_session_lists (event_id) WHERE taxa = '';
--> statement-breakpoint
CREATE TRIGGER result_session_taxa_lists_insert AFTER INSERT ON result_session_taxa
  REFERENCING NEW TABLE AS ecotone_lists_new FOR EACH STATEMENT EXECUTE FUNCTION ecotone_session_lists_sync();
--> statement-breakpoint
CREATE TRIGGER result_session_taxa_lists_update AFTER UPDATE ON result_session_taxa
  REFERENCING OLD TABLE AS ecotone_lists_old NEW TABLE AS ecotone_lists_new FOR EACH STATEMENT EXECUTE FUNCTION ecotone_session_lists_sync();
--> statement-breakpoint
CREATE TRIGGER result_session_taxa_lists_delete AFTER DELETE ON result_session_taxa
  REFERENCING OLD TABLE AS ecotone_lists_old FOR EACH STATEMENT EXECUTE FUNCTION ecotone_session_lists_sync();
--> statement-breakpoint
-- Fill both from what is already there.
INSERT INTO result_taxon_codes (taxon_id) SELECT id FROM taxa ORDER BY id;
--> statement-breakpoint
INSERT INTO result_session_lists (event_id, session_id, taxa)
  SELECT st.event_id, st.session_id, string_agg(c.code::text, ',' ORDER BY c.code)
  FROM result_session_taxa st JOIN result_taxon_codes c ON c.taxon_id = st.taxon_id
  WHERE st.sightings > 0 GROUP BY 1, 2;
