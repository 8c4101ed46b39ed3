import "server-only";
import { sql, type SQL } from "drizzle-orm";
import { GROUP_THRESHOLDS } from "@/lib/sync/rules";
import type { Db } from "../client";

// Automatic check marks (design.md, "Words"): hints for reviewers, computed here in SQL on
// the server whenever a sighting arrives or changes, and stored in sightings.check_marks
// (in the order of the check_mark enum) so that the review queue can filter on them.
//
// The rules, each in one place:
//   outside_area        the point is not inside the event area (no area drawn: never marked)
//   outside_dates       observed before the event starts or after it ends
//   high_count          the count is far above what is usual for that taxon at this event:
//                       with at least HIGH_COUNT_MIN_RECORDS non-rejected records of the taxon
//                       at the event, above Tukey's "far out" fence Q3 + 3 × IQR (Tukey 1977,
//                       Exploratory Data Analysis; from memory) taken on ln(count), because
//                       counts are right-skewed, and never below HIGH_COUNT_FLOOR; with fewer
//                       records, above a fixed per-group threshold (GROUP_THRESHOLDS). The log
//                       scale and the floor are common practice, not a published standard; the
//                       per-group thresholds are this project's own tunable choice. Quartiles include the record itself: quartiles
//                       barely move for one extreme value, which is why they are used.
//   not_on_list         identified to a taxon that is not on the event's species list
//   sensitive_taxon     the taxon's sensitivity is generalised or restricted
//   photo_missing       no photo stored, where the event requires one: for sensitive taxa
//                       (events.photo_required_sensitive) and for taxa off the species list or
//                       unidentified records (events.photo_required_off_list)
//   possible_duplicate  another non-rejected record by the same volunteer of the same taxon at
//                       the same event within DUPLICATE_MINUTES and DUPLICATE_METRES (common
//                       practice values); both records of a pair carry the mark
//   poor_accuracy       location accuracy (metres) worse than the event's limit

export const HIGH_COUNT_MIN_RECORDS = 10;
export const HIGH_COUNT_FLOOR = 5;
export const DUPLICATE_MINUTES = 10;
export const DUPLICATE_METRES = 50;
// The per-group thresholds (a fixed count per taxon group; every one above HIGH_COUNT_FLOOR, a
// unit test checks) live with the sync rules, which the phone also reads (lib/sync/rules.ts).
export { GROUP_THRESHOLDS };

/**
 * The unusual-count rule's statistics computed straight from the sightings (every non-rejected
 * sighting of the taxon at the event): what keptStatsSql must always equal. The
 * check-mark pass no longer runs this (it sorted every sighting of each taxon on each batch);
 * tests and the bench compare the two.
 */
export async function directCountQuartiles(
  db: Executor,
  eventId: string,
  taxonId: string,
): Promise<{ n: number; q1: number | null; q3: number | null }> {
  const { rows } = await db.execute<{ n: string; q1: number | null; q3: number | null }>(sql`
    SELECT count(*) AS n,
      percentile_cont(0.25) WITHIN GROUP (ORDER BY ln(o.count)) AS q1,
      percentile_cont(0.75) WITHIN GROUP (ORDER BY ln(o.count)) AS q3
    FROM sightings o
    WHERE o.event_id = ${eventId} AND o.taxon_id = ${taxonId} AND o.review_state IN ('pending', 'approved', 'returned')`);
  return { n: Number(rows[0]!.n), q1: rows[0]!.q1, q3: rows[0]!.q3 };
}

/**
 * count(*) and percentile_cont(0.25 and 0.75) WITHIN GROUP (ORDER BY ln(count)) over the
 * non-rejected sightings of each (event_id, taxon_id) of `keys`, read from check_count_stats
 * (a few rows per taxon) instead of every sighting. The quantiles use percentile_cont's own
 * arithmetic (PostgreSQL's orderedsetaggs.c, read in its source): the 0-based rows
 * floor(p·(n−1)) and ceil(p·(n−1)) of the sorted values, lo + f·(hi − lo) with
 * f = p·(n−1) − floor(p·(n−1)), all in float8, so they are the same numbers, not estimates.
 * The k-th value (0-based) is the smallest count whose running total exceeds k.
 * Taxa without any record give no row. With `eventId` (every key of that event), the look-up
 * names the event as a value, so that it reads one partition of check_count_stats (migration 0025).
 */
const keptStatsSql = (keys: SQL, eventId?: string) => sql`
  SELECT b.event_id, b.taxon_id, b.n,
    ln(b.lo1::float8) + (b.p1 - floor(b.p1)) * (ln(b.hi1::float8) - ln(b.lo1::float8)) AS q1,
    ln(b.lo3::float8) + (b.p3 - floor(b.p3)) * (ln(b.hi3::float8) - ln(b.lo3::float8)) AS q3
  FROM (
    SELECT r.event_id, r.taxon_id, r.n, r.p1, r.p3,
      min(r.count) FILTER (WHERE r.upto > floor(r.p1)) AS lo1, min(r.count) FILTER (WHERE r.upto > ceil(r.p1)) AS hi1,
      min(r.count) FILTER (WHERE r.upto > floor(r.p3)) AS lo3, min(r.count) FILTER (WHERE r.upto > ceil(r.p3)) AS hi3
    FROM (
      SELECT h.event_id, h.taxon_id, h.count, h.upto, h.n,
        0.25::float8 * (h.n - 1)::float8 AS p1, 0.75::float8 * (h.n - 1)::float8 AS p3
      FROM (
        SELECT g.event_id, g.taxon_id, g.count,
          (sum(g.k) OVER (PARTITION BY g.event_id, g.taxon_id ORDER BY g.count))::float8 AS upto,
          (sum(g.k) OVER (PARTITION BY g.event_id, g.taxon_id))::bigint AS n
        FROM (
          -- LATERAL: one primary-key range per taxon, never a scan of every event's statistics.
          SELECT keys.event_id, keys.taxon_id, x.count, x.k
          FROM ${keys} keys
          CROSS JOIN LATERAL (
            SELECT c.count, sum(c.n) AS k FROM check_count_stats c
            WHERE c.event_id = ${eventId ? sql`${eventId}::uuid` : sql`keys.event_id`} AND c.taxon_id = keys.taxon_id
            GROUP BY c.count HAVING sum(c.n) > 0
          ) x
        ) g
      ) h
    ) r
    GROUP BY 1, 2, 3, 4, 5
  ) b`;

/** The same statistics read from check_count_stats, as the check-mark pass reads them. */
export async function keptCountQuartiles(
  db: Executor,
  eventId: string,
  taxonId: string,
): Promise<{ n: number; q1: number | null; q3: number | null }> {
  const { rows } = await db.execute<{ n: string; q1: number | null; q3: number | null }>(
    sql`SELECT n, q1, q3 FROM (${keptStatsSql(sql`(SELECT ${eventId}::uuid AS event_id, ${taxonId}::uuid AS taxon_id)`, eventId)}) s`,
  );
  // No record of the taxon: what count(*) and percentile_cont give over no rows.
  return rows[0] ? { n: Number(rows[0].n), q1: rows[0].q1, q3: rows[0].q3 } : { n: 0, q1: null, q3: null };
}

/** The database, or a transaction on it (anything that can run a statement). */
export type Executor = Pick<Db, "execute">;

const groupThresholdSql = sql.raw(
  `CASE t.taxon_group ${Object.entries(GROUP_THRESHOLDS)
    .map(([g, n]) => `WHEN '${g}' THEN ${n}`)
    .join(" ")} ELSE 50 END`,
);

/**
 * Recomputes the check marks of these sightings (and of records they form a possible
 * duplicate with, so both of a pair stay in step) and stores them. Call it in the same
 * transaction that stored or changed the sightings. Rows whose marks do not change are
 * not written.
 */
export async function refreshCheckMarks(tx: Executor, sightingIds: string[], eventId?: string): Promise<void> {
  const ids = [...new Set(sightingIds)];
  if (!ids.length) return;
  for (let i = 0; i < ids.length; i += 2000) await refreshChunk(tx, ids.slice(i, i + 2000), eventId);
}

async function refreshChunk(tx: Executor, ids: string[], eventId: string | undefined): Promise<void> {
  // One array parameter, not one parameter per id.
  const idArray = sql`${sql.param(ids)}::uuid[]`;
  // With the event, one partition of sightings (migration 0025); without, a probe of each partition's key.
  // The event is written as a value in every correlated look-up too (`ev`): the planner prunes
  // partitions on a value at plan time, but did not prune on the outer row's column at run time.
  const inEvent = eventId ? sql`s.event_id = ${eventId} AND ` : sql``;
  const ev = (outer: string) => (eventId ? sql`${eventId}::uuid` : sql.raw(`${outer}.event_id`));
  await tx.execute(sql`
    WITH given AS (
      SELECT s.* FROM sightings s WHERE ${inEvent}s.id = ANY(${idArray})
    ),
    -- LATERAL: one index lookup (sightings_duplicate_idx) per given record, never a join over the event.
    partners AS (
      SELECT p.id, g.event_id FROM given g
      CROSS JOIN LATERAL (
        SELECT o.id FROM sightings o
        WHERE o.event_id = ${ev("g")} AND o.user_id = g.user_id AND o.taxon_id = g.taxon_id AND o.id <> g.id
          AND o.observed_at BETWEEN g.observed_at - make_interval(mins => ${DUPLICATE_MINUTES}) AND g.observed_at + make_interval(mins => ${DUPLICATE_MINUTES})
          AND ST_DWithin(o.location::geography, g.location::geography, ${DUPLICATE_METRES})
      ) p
    ),
    target AS (
      SELECT s.* FROM (SELECT id, event_id FROM given UNION SELECT id, event_id FROM partners) ids
      JOIN sightings s ON s.event_id = ${ev("ids")} AND s.id = ids.id
    ),
    -- Per taxon in this batch, from the per-count statistics the triggers keep
    -- (check_count_stats: the same numbers as count and percentile_cont over every non-rejected
    -- sighting of the taxon, see keptStatsSql); only for taxa with a record above the floor,
    -- since no count at or below it is ever marked (every group threshold is above the floor too).
    taxon_stats AS (${keptStatsSql(
      sql`(SELECT DISTINCT event_id, taxon_id FROM target WHERE taxon_id IS NOT NULL AND count > ${HIGH_COUNT_FLOOR})`,
      eventId,
    )}),
    computed AS (
      SELECT s.id, s.event_id, array_remove(ARRAY[
        CASE WHEN e.area IS NOT NULL AND NOT ST_Covers(e.area, s.location) THEN 'outside_area'::check_mark END,
        CASE WHEN s.observed_at < e.starts_at OR s.observed_at > e.ends_at THEN 'outside_dates'::check_mark END,
        CASE WHEN s.taxon_id IS NOT NULL AND (
          CASE WHEN coalesce(st.n, 0) >= ${HIGH_COUNT_MIN_RECORDS}
            THEN s.count > greatest(${HIGH_COUNT_FLOOR}::float8, exp(st.q3 + 3 * (st.q3 - st.q1)))
            ELSE s.count > ${groupThresholdSql} END
        ) THEN 'high_count'::check_mark END,
        CASE WHEN s.taxon_id IS NOT NULL AND NOT on_list.yes THEN 'not_on_list'::check_mark END,
        CASE WHEN t.sensitivity <> 'open' THEN 'sensitive_taxon'::check_mark END,
        CASE WHEN NOT has_photo.yes AND (
          (e.photo_required_sensitive AND t.sensitivity <> 'open')
          OR (e.photo_required_off_list AND (s.taxon_id IS NULL OR NOT on_list.yes))
        ) THEN 'photo_missing'::check_mark END,
        CASE WHEN s.taxon_id IS NOT NULL AND EXISTS (
          SELECT 1 FROM sightings o
          WHERE o.user_id = s.user_id AND o.event_id = ${ev("s")} AND o.taxon_id = s.taxon_id AND o.id <> s.id
            AND o.review_state <> 'rejected'
            AND o.observed_at BETWEEN s.observed_at - make_interval(mins => ${DUPLICATE_MINUTES}) AND s.observed_at + make_interval(mins => ${DUPLICATE_MINUTES})
            AND ST_DWithin(o.location::geography, s.location::geography, ${DUPLICATE_METRES})
        ) THEN 'possible_duplicate'::check_mark END,
        CASE WHEN s.accuracy_m > e.accuracy_limit_m THEN 'poor_accuracy'::check_mark END
      ], NULL) AS marks
      FROM target s
      JOIN events e ON e.id = s.event_id
      LEFT JOIN taxa t ON t.id = s.taxon_id
      LEFT JOIN taxon_stats st ON st.event_id = s.event_id AND st.taxon_id = s.taxon_id
      CROSS JOIN LATERAL (SELECT EXISTS (SELECT 1 FROM event_species es WHERE es.event_id = s.event_id AND es.taxon_id = s.taxon_id) AS yes) on_list
      CROSS JOIN LATERAL (SELECT EXISTS (SELECT 1 FROM photos p WHERE p.sighting_id = s.id AND p.event_id = s.event_id) AS yes) has_photo
    )
    UPDATE sightings x SET check_marks = c.marks
    FROM computed c
    WHERE x.event_id = ${ev("c")} AND x.id = c.id AND x.check_marks IS DISTINCT FROM c.marks`);
}
