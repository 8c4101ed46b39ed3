import "server-only";
import { sql } from "drizzle-orm";
import { getDb, type Db } from "../client";
import { NO_ZONE, type ResultsInput, type ResultsTaxon } from "@/lib/results/compute";
import type { InputRecord } from "@/lib/results/records";
import type { ReviewState } from "@/lib/domain";

type Tx = Pick<Db, "execute">;

export async function eventZones(eventId: string, db: Tx = getDb()): Promise<ResultsInput["zones"]> {
  const r = await db.execute<{ id: string; name: string; habitat: string }>(sql`
    SELECT id, name, habitat::text AS habitat FROM zones WHERE event_id = ${eventId} ORDER BY name, id`);
  return r.rows;
}

/** Taxa with their names in every language, by id. */
export async function taxaMeta(ids: readonly string[], db: Tx = getDb()): Promise<Map<string, ResultsTaxon>> {
  if (!ids.length) return new Map();
  const r = await db.execute<{
    id: string;
    scientificName: string;
    rank: string;
    group: string;
    sensitivity: ResultsTaxon["sensitivity"];
    names: Record<string, string> | null;
  }>(sql`
    SELECT t.id, t.scientific_name AS "scientificName", t.rank::text AS rank, t.taxon_group::text AS "group",
           t.sensitivity::text AS sensitivity, jsonb_object_agg(n.locale, n.name) FILTER (WHERE n.locale IS NOT NULL) AS names
    FROM taxa t LEFT JOIN taxon_names n ON n.taxon_id = t.id
    WHERE t.id = ANY(${sql.raw(`ARRAY[${ids.map((id) => `'${id.replace(/[^0-9a-f-]/gi, "")}'`).join(",")}]::uuid[]`)})
    GROUP BY t.id`);
  return new Map(r.rows.map((t) => [t.id, { ...t, names: t.names ?? {} }]));
}

/**
 * The results input from the aggregate tables (migration 0007): a few thousand rows
 * however many sightings the event holds. Taxa are ordered by id and complete sessions
 * by id (the canonical order of lib/results/records.ts).
 */
export async function loadResultsInput(eventId: string, options: { sessions?: boolean } = {}): Promise<ResultsInput> {
  const db = getDb();
  const [zones, counts, sessions] = await Promise.all([
    eventZones(eventId, db),
    db.execute<{ zoneId: string; taxonId: string; individuals: number }>(sql`
      SELECT zone_key AS "zoneId", taxon_id AS "taxonId", individuals::float8 AS individuals
      FROM result_taxon_counts WHERE event_id = ${eventId} AND sightings > 0`),
    // Taxa travel as their rank among the event's taxa, one short text per session.
    options.sessions === false
      ? { rows: [] as { zoneId: string | null; taxa: string }[] }
      : db.execute<{ zoneId: string | null; taxa: string }>(sql`
      WITH tx AS (
        SELECT taxon_id, (row_number() OVER (ORDER BY taxon_id) - 1)::int AS i
        FROM (SELECT DISTINCT taxon_id FROM result_taxon_counts WHERE event_id = ${eventId} AND sightings > 0) d
      )
      SELECT cs.zone_id AS "zoneId", string_agg(tx.i::text, ',') AS taxa
      FROM result_session_taxa st
      JOIN count_sessions cs ON cs.id = st.session_id AND cs.all_species_noted
      JOIN tx ON tx.taxon_id = st.taxon_id
      WHERE st.event_id = ${eventId} AND st.sightings > 0
      GROUP BY st.session_id, cs.zone_id ORDER BY st.session_id`),
  ]);
  const ids = [...new Set(counts.rows.map((c) => c.taxonId))].sort();
  const index = new Map(ids.map((id, i) => [id, i]));
  const meta = await taxaMeta(ids, db);
  return {
    zones,
    taxa: ids.map((id) => meta.get(id)!),
    counts: counts.rows.map((c) => ({ zoneId: c.zoneId, taxon: index.get(c.taxonId)!, individuals: c.individuals })),
    sessions: sessions.rows.map((s) => ({
      zoneId: s.zoneId ?? NO_ZONE,
      taxa: s.taxa
        .split(",")
        .map(Number)
        .sort((a, b) => a - b),
    })),
  };
}

/** Every approved, identified sighting of the event as a report's input record, by id. */
export async function loadInputRecords(eventId: string, db: Tx = getDb()): Promise<InputRecord[]> {
  const r = await db.execute<{ r: InputRecord }>(sql`
    SELECT json_build_array(s.id, s.review_state, s.taxon_id, s.count, coalesce(s.zone_id, ${NO_ZONE}::uuid),
             CASE WHEN cs.all_species_noted THEN s.session_id END,
             CASE WHEN cs.all_species_noted THEN coalesce(cs.zone_id, ${NO_ZONE}::uuid) END) AS r
    FROM sightings s LEFT JOIN count_sessions cs ON cs.id = s.session_id
    WHERE s.event_id = ${eventId} AND s.review_state = 'approved' AND s.taxon_id IS NOT NULL
    ORDER BY s.id`);
  return r.rows.map((x) => x.r);
}

export type LiveFigures = {
  perHour: { hour: string; sightings: number }[];
  activeVolunteers: { lastHour: number; today: number; total: number };
  backlog: Record<ReviewState, number>;
};

/** The live board's counts: sightings per hour (last 48 hours of records), people, review backlog. */
export async function liveFigures(eventId: string): Promise<LiveFigures> {
  const db = getDb();
  const [hours, people, states] = await Promise.all([
    db.execute<{ hour: string; sightings: number }>(sql`
      WITH last AS (SELECT max(observed_at) AS t FROM sightings WHERE event_id = ${eventId})
      SELECT to_char(date_trunc('hour', observed_at) AT TIME ZONE 'UTC', 'YYYY-MM-DD"T"HH24:00:00"Z"') AS hour, count(*)::int AS sightings
      FROM sightings, last WHERE event_id = ${eventId} AND observed_at > last.t - interval '48 hours'
      GROUP BY 1 ORDER BY 1`),
    db.execute<{ lastHour: number; today: number; total: number }>(sql`
      WITH last AS (SELECT max(observed_at) AS t FROM sightings WHERE event_id = ${eventId})
      SELECT count(DISTINCT user_id) FILTER (WHERE observed_at > last.t - interval '1 hour')::int AS "lastHour",
             count(DISTINCT user_id) FILTER (WHERE observed_at > last.t - interval '24 hours')::int AS today,
             count(DISTINCT user_id)::int AS total
      FROM sightings, last WHERE event_id = ${eventId}`),
    db.execute<{ state: string; n: number }>(sql`
      SELECT review_state::text AS state, count(*)::int AS n FROM sightings WHERE event_id = ${eventId} GROUP BY 1`),
  ]);
  const backlog = { pending: 0, approved: 0, rejected: 0, returned: 0 };
  for (const s of states.rows) backlog[s.state as keyof typeof backlog] = s.n;
  return { perHour: hours.rows, activeVolunteers: people.rows[0] ?? { lastHour: 0, today: 0, total: 0 }, backlog };
}

/**
 * What the event's results depend on, in one cheap row: the aggregate counter raised by
 * the triggers, a hash of the count sessions (complete flag and zone), and hashes of the
 * zones and of the taxa in the results. Equal keys mean equal results.
 */
export async function resultsKey(eventId: string): Promise<string> {
  const r = await getDb().execute<{ k: string }>(sql`
    SELECT concat_ws('|',
      (SELECT seq FROM result_stamps WHERE event_id = ${eventId}),
      (SELECT count(*) || ':' || coalesce(sum(hashtext(id::text || all_species_noted::text || coalesce(zone_id::text, ''))), 0)
         FROM count_sessions WHERE event_id = ${eventId}),
      (SELECT md5(string_agg(id::text || name || habitat::text, ',' ORDER BY id)) FROM zones WHERE event_id = ${eventId}),
      (SELECT md5(string_agg(t.id::text || t.scientific_name || t.rank::text || t.taxon_group::text || t.sensitivity::text
                   || coalesce((SELECT string_agg(locale || name, ',' ORDER BY locale) FROM taxon_names n WHERE n.taxon_id = t.id), ''), ',' ORDER BY t.id))
         FROM taxa t WHERE t.id IN (SELECT taxon_id FROM result_taxon_counts WHERE event_id = ${eventId}))
    ) AS k`);
  return r.rows[0]!.k;
}
