-- Issue 18, "past one machine": sightings, and the aggregate tables keyed by event, partitioned
-- by event with PostgreSQL's declarative partitioning. Written by hand (drizzle-kit has no
-- partition syntax); db/schema.ts describes the same columns, keys and indexes, and the
-- snapshot of this migration matches it, so `drizzle-kit generate` afterwards finds no change.
--
-- HASH (event_id) with a fixed modulus of 16, not LIST with one partition per event:
-- - The app connects as ecotone_app, which may read and write rows only (db/roles.ts). One
--   partition per event would need DDL at run time (a SECURITY DEFINER function owned by
--   ecotone, called by a trigger on events), CREATE TABLE … PARTITION OF takes an ACCESS
--   EXCLUSIVE lock on sightings (every sync batch and desk page waits while an event is
--   created), and a DEFAULT partition would still be needed so no row is ever refused, with
--   each new partition scanning it. A fixed set of hash partitions needs no run-time DDL, no
--   elevated function, and never refuses a row.
-- - Several events share a partition (16 partitions; events hash over them). Every query of
--   one event still reads one partition (plan-time pruning on event_id = $1), and inside it
--   the indexes lead with event_id as before, so a neighbour event costs index depth, not a
--   scan. What HASH gives up: detaching one event's rows as a table (archive with
--   DELETE … WHERE event_id, or re-split). Growing: a modulus-16 partition can be replaced by
--   two of modulus 32 (remainders r and r+16) one at a time, since moduli only need to divide
--   each other.
--
-- Keys: a partitioned table's primary key must hold the partition key, so sightings' key is
-- (id, event_id). id first: a look-up by id alone, should one be needed, is one index probe
-- per partition, 16 small probes, not a scan.
-- A unique index cannot span partitions, so the id is unique across events because it is a
-- v4 uuid made on the device (collision odds ~1e-37 per pair), and
-- every look-up of a sighting names its event (the desk, decisions, sync, check marks, photos,
-- reports, a volunteer's own data), and two rows of two events with one id never mix. Within
-- one event the primary key refuses a second row with the same id, so sync's ON CONFLICT
-- (id, event_id) keeps resends idempotent, and a resend of another person's id in the same
-- event is still refused ("id_taken"). An id already used in another event is stored as a
-- row of this event (before, the global key refused it); only a broken client would send one.
-- Tables referencing sightings (photos, reviews, sighting_versions) get event_id, filled here
-- from their sighting, and their foreign keys become (sighting_id, event_id) → sightings
-- (id, event_id) with the same ON DELETE behaviours (photos cascade, the other two restrict).
-- The aggregate tables' keys already lead with event_id.
--
-- Converting an existing database: this file runs in the migrator's one transaction. Each
-- table is renamed away, a partitioned table of the same columns, defaults and checks is
-- created with its 16 partitions, the rows are moved with one INSERT … SELECT, the old table
-- is dropped, and the keys, indexes (built after the load), triggers, foreign keys and the
-- app role's grants are put back under their former names. The aggregate tables' rows are
-- moved as they are (they already match the sightings). Time on the million-sighting bench
-- database: scripts/bench-notes.md ("Sightings partitioned by event").
SET LOCAL maintenance_work_mem = '256MB';
--> statement-breakpoint
ALTER TABLE "photos" DROP CONSTRAINT "photos_sighting_id_sightings_id_fk";
--> statement-breakpoint
ALTER TABLE "reviews" DROP CONSTRAINT "reviews_sighting_id_sightings_id_fk";
--> statement-breakpoint
ALTER TABLE "sighting_versions" DROP CONSTRAINT "sighting_versions_sighting_id_sightings_id_fk";
--> statement-breakpoint
-- event_id on the referencing tables, from their sightings (the append-only triggers are set
-- aside for this one backfill: it adds a column, it changes no decision or version).
ALTER TABLE "photos" ADD COLUMN "event_id" uuid;
--> statement-breakpoint
ALTER TABLE "reviews" ADD COLUMN "event_id" uuid;
--> statement-breakpoint
ALTER TABLE "sighting_versions" ADD COLUMN "event_id" uuid;
--> statement-breakpoint
UPDATE photos p SET event_id = s.event_id FROM sightings s WHERE s.id = p.sighting_id;
--> statement-breakpoint
ALTER TABLE reviews DISABLE TRIGGER reviews_append_only;
--> statement-breakpoint
UPDATE reviews r SET event_id = s.event_id FROM sightings s WHERE s.id = r.sighting_id;
--> statement-breakpoint
ALTER TABLE reviews ENABLE TRIGGER reviews_append_only;
--> statement-breakpoint
ALTER TABLE sighting_versions DISABLE TRIGGER sighting_versions_append_only;
--> statement-breakpoint
UPDATE sighting_versions v SET event_id = s.event_id FROM sightings s WHERE s.id = v.sighting_id;
--> statement-breakpoint
ALTER TABLE sighting_versions ENABLE TRIGGER sighting_versions_append_only;
--> statement-breakpoint
ALTER TABLE "photos" ALTER COLUMN "event_id" SET NOT NULL;
--> statement-breakpoint
ALTER TABLE "reviews" ALTER COLUMN "event_id" SET NOT NULL;
--> statement-breakpoint
ALTER TABLE "sighting_versions" ALTER COLUMN "event_id" SET NOT NULL;
--> statement-breakpoint
-- Sightings: the partitioned table, its partitions, the rows.
ALTER TABLE sightings RENAME TO sightings_unpartitioned;
--> statement-breakpoint
CREATE TABLE sightings (LIKE sightings_unpartitioned INCLUDING DEFAULTS INCLUDING CONSTRAINTS)
  PARTITION BY HASH (event_id);
--> statement-breakpoint
DO $$
BEGIN
  FOR r IN 0..15 LOOP
    EXECUTE format('CREATE TABLE %I PARTITION OF sightings FOR VALUES WITH (MODULUS 16, REMAINDER %s)',
      'sightings_p' || lpad(r::text, 2, '0'), r);
  END LOOP;
END $$;
--> statement-breakpoint
INSERT INTO sightings SELECT * FROM sightings_unpartitioned;
--> statement-breakpoint
DROP TABLE sightings_unpartitioned;
--> statement-breakpoint
ALTER TABLE sightings ADD CONSTRAINT sightings_pkey PRIMARY KEY (id, event_id);
--> statement-breakpoint
CREATE INDEX sightings_queue_idx ON sightings USING btree (event_id, review_state, created_at, id);
--> statement-breakpoint
CREATE INDEX sightings_queue_observed_idx ON sightings USING btree (event_id, review_state, observed_at, id);
--> statement-breakpoint
CREATE INDEX sightings_queue_all_observed_idx ON sightings USING btree (event_id, observed_at, id);
--> statement-breakpoint
CREATE INDEX sightings_duplicate_idx ON sightings USING btree (event_id, user_id, taxon_id, observed_at);
--> statement-breakpoint
CREATE INDEX sightings_results_idx ON sightings USING btree (event_id, review_state, taxon_id);
--> statement-breakpoint
CREATE INDEX sightings_modified_idx ON sightings USING btree (event_id, updated_at, id);
--> statement-breakpoint
CREATE INDEX sightings_session_idx ON sightings USING btree (session_id);
--> statement-breakpoint
CREATE INDEX sightings_user_idx ON sightings USING btree (user_id, observed_at);
--> statement-breakpoint
CREATE INDEX sightings_location_gist ON sightings USING gist (location);
--> statement-breakpoint
ALTER TABLE sightings ADD CONSTRAINT sightings_event_id_events_id_fk FOREIGN KEY (event_id) REFERENCES events(id) ON DELETE CASCADE;
--> statement-breakpoint
ALTER TABLE sightings ADD CONSTRAINT sightings_user_id_users_id_fk FOREIGN KEY (user_id) REFERENCES users(id) ON DELETE RESTRICT;
--> statement-breakpoint
ALTER TABLE sightings ADD CONSTRAINT sightings_session_id_count_sessions_id_fk FOREIGN KEY (session_id) REFERENCES count_sessions(id) ON DELETE SET NULL;
--> statement-breakpoint
ALTER TABLE sightings ADD CONSTRAINT sightings_taxon_id_taxa_id_fk FOREIGN KEY (taxon_id) REFERENCES taxa(id) ON DELETE RESTRICT;
--> statement-breakpoint
ALTER TABLE sightings ADD CONSTRAINT sightings_zone_id_zones_id_fk FOREIGN KEY (zone_id) REFERENCES zones(id) ON DELETE SET NULL;
--> statement-breakpoint
ALTER TABLE sightings ADD CONSTRAINT sightings_transcribed_by_users_id_fk FOREIGN KEY (transcribed_by) REFERENCES users(id) ON DELETE SET NULL;
--> statement-breakpoint
-- The same statement-level triggers as 0007, 0022 and 0023 (on a partitioned table they fire
-- once per statement on the parent, with every partition's rows in the transition tables).
CREATE TRIGGER sightings_results_insert AFTER INSERT ON sightings
  REFERENCING NEW TABLE AS ecotone_new FOR EACH STATEMENT EXECUTE FUNCTION ecotone_results_sync();
--> statement-breakpoint
CREATE TRIGGER sightings_results_update AFTER UPDATE ON sightings
  REFERENCING OLD TABLE AS ecotone_old NEW TABLE AS ecotone_new FOR EACH STATEMENT EXECUTE FUNCTION ecotone_results_sync();
--> statement-breakpoint
CREATE TRIGGER sightings_results_delete AFTER DELETE ON sightings
  REFERENCING OLD TABLE AS ecotone_old FOR EACH STATEMENT EXECUTE FUNCTION ecotone_results_sync();
--> statement-breakpoint
CREATE TRIGGER sightings_check_count_insert AFTER INSERT ON sightings
  REFERENCING NEW TABLE AS ecotone_new FOR EACH STATEMENT EXECUTE FUNCTION ecotone_check_count_stats_sync();
--> statement-breakpoint
CREATE TRIGGER sightings_check_count_update AFTER UPDATE ON sightings
  REFERENCING OLD TABLE AS ecotone_old NEW TABLE AS ecotone_new FOR EACH STATEMENT EXECUTE FUNCTION ecotone_check_count_stats_sync();
--> statement-breakpoint
CREATE TRIGGER sightings_check_count_delete AFTER DELETE ON sightings
  REFERENCING OLD TABLE AS ecotone_old FOR EACH STATEMENT EXECUTE FUNCTION ecotone_check_count_stats_sync();
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
ALTER TABLE "photos" ADD CONSTRAINT "photos_sighting_id_sightings_id_fk" FOREIGN KEY ("sighting_id","event_id") REFERENCES "public"."sightings"("id","event_id") ON DELETE cascade ON UPDATE no action;
--> statement-breakpoint
ALTER TABLE "reviews" ADD CONSTRAINT "reviews_sighting_id_sightings_id_fk" FOREIGN KEY ("sighting_id","event_id") REFERENCES "public"."sightings"("id","event_id") ON DELETE restrict ON UPDATE no action;
--> statement-breakpoint
ALTER TABLE "sighting_versions" ADD CONSTRAINT "sighting_versions_sighting_id_sightings_id_fk" FOREIGN KEY ("sighting_id","event_id") REFERENCES "public"."sightings"("id","event_id") ON DELETE restrict ON UPDATE no action;
--> statement-breakpoint
-- The aggregate tables keyed by event, the same way (their keys lead with event_id already).
DO $$
DECLARE
  t record;
BEGIN
  FOR t IN SELECT * FROM (VALUES
      ('result_taxon_counts', 'result_taxon_counts_event_id_zone_key_taxon_id_pk', 'event_id, zone_key, taxon_id',
       'CREATE INDEX result_taxon_counts_empty_idx ON result_taxon_counts (event_id) WHERE sightings <= 0'),
      ('check_count_stats', 'check_count_stats_event_id_taxon_id_count_shard_pk', 'event_id, taxon_id, count, shard', NULL),
      ('result_session_taxa', 'result_session_taxa_event_id_session_id_taxon_id_pk', 'event_id, session_id, taxon_id',
       'CREATE INDEX result_session_taxa_empty_idx ON result_session_taxa (event_id) WHERE sightings <= 0'),
      ('result_session_zones', 'result_session_zones_event_id_session_id_zone_key_pk', 'event_id, session_id, zone_key',
       'CREATE INDEX result_session_zones_empty_idx ON result_session_zones (event_id) WHERE sightings <= 0'),
      ('result_pending', 'result_pending_event_id_session_key_user_id_pk', 'event_id, session_key, user_id',
       'CREATE INDEX result_pending_empty_idx ON result_pending (event_id) WHERE pending <= 0 AND returned <= 0')
    ) AS v(name, pk, cols, extra)
  LOOP
    EXECUTE format('ALTER TABLE %I RENAME TO %I', t.name, t.name || '_unpartitioned');
    EXECUTE format('CREATE TABLE %I (LIKE %I INCLUDING DEFAULTS INCLUDING CONSTRAINTS) PARTITION BY HASH (event_id)',
      t.name, t.name || '_unpartitioned');
    FOR r IN 0..15 LOOP
      EXECUTE format('CREATE TABLE %I PARTITION OF %I FOR VALUES WITH (MODULUS 16, REMAINDER %s)',
        t.name || '_p' || lpad(r::text, 2, '0'), t.name, r);
    END LOOP;
    EXECUTE format('INSERT INTO %I SELECT * FROM %I', t.name, t.name || '_unpartitioned');
    EXECUTE format('DROP TABLE %I', t.name || '_unpartitioned');
    EXECUTE format('ALTER TABLE %I ADD CONSTRAINT %I PRIMARY KEY (%s)', t.name, t.pk, t.cols);
    IF t.extra IS NOT NULL THEN
      EXECUTE t.extra;
    END IF;
  END LOOP;
END $$;
--> statement-breakpoint
-- result_session_taxa was re-created above, so the triggers that keep each session's list
-- (result_session_lists, migration 0024) are put back on it, as 0024 wrote them.
CREATE TRIGGER result_session_taxa_lists_insert AFTER INSERT ON result_session_taxa
  REFERENCING NEW TABLE AS ecotone_lists_new FOR EACH STATEMENT EXECUTE FUNCTION ecotone_session_lists_sync();
--> statement-breakpoint
CREATE TRIGGER result_session_taxa_lists_update AFTER UPDATE ON result_session_taxa
  REFERENCING OLD TABLE AS ecotone_lists_old NEW TABLE AS ecotone_lists_new FOR EACH STATEMENT EXECUTE FUNCTION ecotone_session_lists_sync();
--> statement-breakpoint
CREATE TRIGGER result_session_taxa_lists_delete AFTER DELETE ON result_session_taxa
  REFERENCING OLD TABLE AS ecotone_lists_old FOR EACH STATEMENT EXECUTE FUNCTION ecotone_session_lists_sync();
--> statement-breakpoint
-- The app role's row access (runMigrations grants it again after every run; here too so that
-- the tables are never without it inside a set-up that migrates by other means).
DO $$
BEGIN
  IF EXISTS (SELECT 1 FROM pg_roles WHERE rolname = 'ecotone_app') THEN
    GRANT SELECT, INSERT, UPDATE, DELETE ON sightings, result_taxon_counts, check_count_stats,
      result_session_taxa, result_session_zones, result_pending TO ecotone_app;
  END IF;
END $$;
--> statement-breakpoint
ANALYZE sightings;
