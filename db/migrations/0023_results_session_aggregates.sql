CREATE TABLE "result_pending" (
	"event_id" uuid NOT NULL,
	"session_key" uuid NOT NULL,
	"user_id" uuid NOT NULL,
	"pending" integer NOT NULL,
	"returned" integer NOT NULL,
	CONSTRAINT "result_pending_event_id_session_key_user_id_pk" PRIMARY KEY("event_id","session_key","user_id")
);
--> statement-breakpoint
CREATE TABLE "result_session_zones" (
	"event_id" uuid NOT NULL,
	"session_id" uuid NOT NULL,
	"zone_key" uuid NOT NULL,
	"sightings" integer NOT NULL,
	CONSTRAINT "result_session_zones_event_id_session_id_zone_key_pk" PRIMARY KEY("event_id","session_id","zone_key")
);
--> statement-breakpoint
-- The zone each count session counts in, and the pending and returned figures, read from
-- aggregates instead of every sighting (issue 14). Statement-level triggers with transition
-- tables, as in 0007: one upsert per touched (session, zone) and (session, volunteer) per
-- statement. Their rows belong to one session or one volunteer, so phones syncing at the
-- same time never wait on each other here. Kept apart from 0007's function on purpose.
CREATE OR REPLACE FUNCTION ecotone_session_aggregates_sync() RETURNS trigger
LANGUAGE plpgsql AS $$
DECLARE
  plus text := 'SELECT event_id, session_id, user_id, coalesce(zone_id, ''00000000-0000-0000-0000-000000000000''::uuid) AS zone_key, review_state, 1 AS n FROM ecotone_new';
  minus text := 'SELECT event_id, session_id, user_id, coalesce(zone_id, ''00000000-0000-0000-0000-000000000000''::uuid) AS zone_key, review_state, -1 AS n FROM ecotone_old';
  delta text;
BEGIN
  delta := CASE TG_OP WHEN 'INSERT' THEN plus WHEN 'DELETE' THEN minus ELSE plus || ' UNION ALL ' || minus END;
  EXECUTE format($q$
    WITH d AS (%s),
    pend AS (
      INSERT INTO result_pending AS r (event_id, session_key, user_id, pending, returned)
        SELECT event_id, coalesce(session_id, '00000000-0000-0000-0000-000000000000'::uuid), user_id,
               coalesce(sum(n) FILTER (WHERE review_state = 'pending'), 0), coalesce(sum(n) FILTER (WHERE review_state = 'returned'), 0)
        FROM d WHERE review_state IN ('pending', 'returned') GROUP BY 1, 2, 3
        HAVING coalesce(sum(n) FILTER (WHERE review_state = 'pending'), 0) <> 0
            OR coalesce(sum(n) FILTER (WHERE review_state = 'returned'), 0) <> 0
        ORDER BY 1, 2, 3
      ON CONFLICT (event_id, session_key, user_id) DO UPDATE
        SET pending = r.pending + excluded.pending, returned = r.returned + excluded.returned
      RETURNING 1
    )
    INSERT INTO result_session_zones AS r (event_id, session_id, zone_key, sightings)
      SELECT event_id, session_id, zone_key, sum(n) FROM d WHERE session_id IS NOT NULL GROUP BY 1, 2, 3
      HAVING sum(n) <> 0 ORDER BY 1, 2, 3
    ON CONFLICT (event_id, session_id, zone_key) DO UPDATE SET sightings = r.sightings + excluded.sightings
  $q$, delta);
  -- Rows that fell to zero go (found through the partial indexes below).
  IF TG_OP <> 'INSERT' THEN
    DELETE FROM result_pending WHERE pending <= 0 AND returned <= 0;
    DELETE FROM result_session_zones WHERE sightings <= 0;
  END IF;
  RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE INDEX result_pending_empty_idx ON result_pending (event_id) WHERE pending <= 0 AND returned <= 0;
--> statement-breakpoint
CREATE INDEX result_session_zones_empty_idx ON result_session_zones (event_id) WHERE sightings <= 0;
--> statement-breakpoint
CREATE TRIGGER sightings_session_aggregates_insert AFTER INSERT ON sightings
  REFERENCING NEW TABLE AS ecotone_new FOR EACH STATEMENT EXECUTE FUNCTION ecotone_session_aggregates_sync();
--> statement-breakpoint
CREATE TRIGGER sightings_session_aggregates_update AFTER UPDATE ON sightings
  REFERENCING OLD TABLE AS ecotone_old NEW TABLE AS ecotone_new FOR EACH STATEMENT EXECUTE FUNCTION ecotone_session_aggregates_sync();
--> statement-breakpoint
CREATE TRIGGER sightings_session_aggregates_delete AFTER DELETE ON sightings
  REFERENCING OLD TABLE AS ecotone_old FOR EACH STATEMENT EXECUTE FUNCTION ecotone_session_aggregates_sync();
--> statement-breakpoint
-- Fill both from the sightings already there.
INSERT INTO result_session_zones (event_id, session_id, zone_key, sightings)
  SELECT event_id, session_id, coalesce(zone_id, '00000000-0000-0000-0000-000000000000'::uuid), count(*)
  FROM sightings WHERE session_id IS NOT NULL GROUP BY 1, 2, 3;
--> statement-breakpoint
INSERT INTO result_pending (event_id, session_key, user_id, pending, returned)
  SELECT event_id, coalesce(session_id, '00000000-0000-0000-0000-000000000000'::uuid), user_id,
         count(*) FILTER (WHERE review_state = 'pending'), count(*) FILTER (WHERE review_state = 'returned')
  FROM sightings WHERE review_state IN ('pending', 'returned') GROUP BY 1, 2, 3;
