CREATE TABLE "check_count_stats" (
	"event_id" uuid NOT NULL,
	"taxon_id" uuid NOT NULL,
	"count" integer NOT NULL,
	"shard" smallint NOT NULL,
	"n" integer NOT NULL,
	CONSTRAINT "check_count_stats_event_id_taxon_id_count_shard_pk" PRIMARY KEY("event_id","taxon_id","count","shard")
);
--> statement-breakpoint
-- The unusual-count check mark (db/queries/check-marks.ts) reads the quartiles of ln(count)
-- over the non-rejected sightings of a taxon at an event. Sorting every such sighting on each
-- sync batch grew with the event (issue 18); this table keeps, per (event, taxon, count), how
-- many there are, folded in by statement-level triggers with transition tables (one upsert per
-- touched count per statement, as the results aggregates do).
-- A few counts of a few taxa take most records, so one row per count would make concurrent
-- sync batches queue on each other's row locks until commit. Each writing transaction takes a
-- shard of its own instead: the first free of 32 transaction-scoped advisory locks (from 0 up,
-- so that a quiet event uses one or two shards), waiting for one only when 32 transactions
-- write at once (with 8, the bench's closed loop of 50 clients on a pool of 20 queued for
-- them); only a shard's holder writes its rows, so writers never wait on a row. Readers sum
-- the shards (as many rows per count as writers were ever at once, at most 32).
-- A shard's n may go below zero (a record counted in one shard, removed through another);
-- the sum over shards is the count.
CREATE OR REPLACE FUNCTION ecotone_check_count_shard() RETURNS smallint
LANGUAGE plpgsql AS $$
DECLARE
  held text := current_setting('ecotone.check_count_shard', true);
  s int;
BEGIN
  -- Transaction-local setting: empty or missing before this transaction's first write.
  IF held IS NOT NULL AND held <> '' THEN RETURN held::smallint; END IF;
  FOR s IN 0..31 LOOP
    IF pg_try_advisory_xact_lock(180181, s) THEN
      PERFORM set_config('ecotone.check_count_shard', s::text, true);
      RETURN s;
    END IF;
  END LOOP;
  s := pg_backend_pid() % 32;
  PERFORM pg_advisory_xact_lock(180181, s);
  PERFORM set_config('ecotone.check_count_shard', s::text, true);
  RETURN s;
END;
$$;
--> statement-breakpoint
-- Static statements, one per operation (plpgsql keeps their plans; a branch that names a
-- transition table the operation lacks never runs). A statement that changes no count (most
-- updates: check marks, review notes) upserts nothing and takes no shard.
CREATE OR REPLACE FUNCTION ecotone_check_count_stats_sync() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
  IF TG_OP = 'INSERT' THEN
    INSERT INTO check_count_stats AS c (event_id, taxon_id, count, shard, n)
      SELECT d.event_id, d.taxon_id, d.count, ecotone_check_count_shard(), d.n FROM (
        SELECT event_id, taxon_id, count, count(*)::int AS n FROM ecotone_new
        WHERE review_state IN ('pending', 'approved', 'returned') AND taxon_id IS NOT NULL
        GROUP BY 1, 2, 3 ORDER BY 1, 2, 3
      ) d
    ON CONFLICT (event_id, taxon_id, count, shard) DO UPDATE SET n = c.n + excluded.n;
  ELSIF TG_OP = 'UPDATE' THEN
    INSERT INTO check_count_stats AS c (event_id, taxon_id, count, shard, n)
      SELECT d.event_id, d.taxon_id, d.count, ecotone_check_count_shard(), d.n FROM (
        SELECT event_id, taxon_id, count, sum(n)::int AS n FROM (
          SELECT event_id, taxon_id, count, 1 AS n FROM ecotone_new
          WHERE review_state IN ('pending', 'approved', 'returned') AND taxon_id IS NOT NULL
          UNION ALL
          SELECT event_id, taxon_id, count, -1 AS n FROM ecotone_old
          WHERE review_state IN ('pending', 'approved', 'returned') AND taxon_id IS NOT NULL
        ) u GROUP BY 1, 2, 3 HAVING sum(n) <> 0 ORDER BY 1, 2, 3
      ) d
    ON CONFLICT (event_id, taxon_id, count, shard) DO UPDATE SET n = c.n + excluded.n;
  ELSE
    INSERT INTO check_count_stats AS c (event_id, taxon_id, count, shard, n)
      SELECT d.event_id, d.taxon_id, d.count, ecotone_check_count_shard(), d.n FROM (
        SELECT event_id, taxon_id, count, -count(*)::int AS n FROM ecotone_old
        WHERE review_state IN ('pending', 'approved', 'returned') AND taxon_id IS NOT NULL
        GROUP BY 1, 2, 3 ORDER BY 1, 2, 3
      ) d
    ON CONFLICT (event_id, taxon_id, count, shard) DO UPDATE SET n = c.n + excluded.n;
  END IF;
  RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER sightings_check_count_insert AFTER INSERT ON sightings
  REFERENCING NEW TABLE AS ecotone_new FOR EACH STATEMENT EXECUTE FUNCTION ecotone_check_count_stats_sync();
--> statement-breakpoint
-- (A trigger with transition tables cannot name columns: an update that changes none of event,
-- taxon, count and state nets to zero and writes nothing.)
CREATE TRIGGER sightings_check_count_update AFTER UPDATE ON sightings
  REFERENCING OLD TABLE AS ecotone_old NEW TABLE AS ecotone_new FOR EACH STATEMENT EXECUTE FUNCTION ecotone_check_count_stats_sync();
--> statement-breakpoint
CREATE TRIGGER sightings_check_count_delete AFTER DELETE ON sightings
  REFERENCING OLD TABLE AS ecotone_old FOR EACH STATEMENT EXECUTE FUNCTION ecotone_check_count_stats_sync();
--> statement-breakpoint
-- The sightings already there.
INSERT INTO check_count_stats (event_id, taxon_id, count, shard, n)
  SELECT event_id, taxon_id, count, 0, count(*) FROM sightings
  WHERE review_state IN ('pending', 'approved', 'returned') AND taxon_id IS NOT NULL GROUP BY 1, 2, 3;
