import "server-only";
import { sql } from "drizzle-orm";
import { getDb, getReadDb, type Db } from "../client";
import { NO_ZONE, type Pending, type ResultsInput, type ResultsTaxon } from "@/lib/results/compute";
import type { EarlierEventRef } from "@/lib/results/compare-events";
import { SESSION_RECORD, type InputRecord } from "@/lib/results/records";
import { COUNT_UNITS, countUnitOf, type CountUnit } from "@/lib/results/settings";
import type { ReviewState } from "@/lib/domain";

type Tx = Pick<Db, "execute">;

export async function eventZones(eventId: string, db: Tx = getDb()): Promise<ResultsInput["zones"]> {
  const r = await db.execute<{ id: string; name: string; habitat: string }>(sql`
    SELECT id, name, habitat::text AS habitat FROM zones WHERE event_id = ${eventId} ORDER BY name, id`);
  return r.rows;
}

const isUuid = (id: string) => /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i.test(id);

/** The event's count units by taxon group: the organiser's choices only (defaults in lib/results/settings.ts). */
export async function eventCountUnits(eventId: string, db: Tx = getDb()): Promise<Record<string, CountUnit>> {
  const r = await db.execute<{ group: string; unit: CountUnit }>(sql`
    SELECT taxon_group::text AS group, unit::text AS unit FROM event_count_units WHERE event_id = ${eventId}`);
  return Object.fromEntries(r.rows.map((x) => [x.group, x.unit]));
}

/** Sets what counts of one taxon group mean in the event. */
export async function setEventCountUnit(
  eventId: string,
  group: string,
  unit: CountUnit,
  db: Tx = getDb(),
): Promise<void> {
  if (!COUNT_UNITS.includes(unit)) throw new Error(`unknown count unit ${unit}`);
  await db.execute(sql`
    INSERT INTO event_count_units (event_id, taxon_group, unit) VALUES (${eventId}, ${group}::taxon_group, ${unit}::count_unit)
    ON CONFLICT (event_id, taxon_group) DO UPDATE SET unit = excluded.unit`);
}

/** Taxa with their names in every language, by id; with `eventId`, each with its count unit in that event. */
export async function taxaMeta(
  ids: readonly string[],
  db: Tx = getDb(),
  eventId?: string,
): Promise<Map<string, ResultsTaxon>> {
  const valid = ids.filter(isUuid);
  if (!valid.length) return new Map();
  const units = eventId ? await eventCountUnits(eventId, db) : {};
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
    WHERE t.id = ANY(${sql.raw(`ARRAY[${valid.map((id) => `'${id}'`).join(",")}]::uuid[]`)})
    GROUP BY t.id`);
  return new Map(r.rows.map((t) => [t.id, { ...t, names: t.names ?? {}, countUnit: countUnitOf(t.group, units) }]));
}

/**
 * The zone each complete count session of the event counts in (method note "sessionZone"):
 * the zone holding most of its sightings, whatever their review state (outside every zone
 * is one more place); ties go to the zone it was started in, then the lowest zone id; a
 * session without sightings stays in the zone it was started in. Columns: id, zone_id.
 * The votes are read from result_session_zones (migration 0023), a few rows per session,
 * not from the sightings.
 */
export function sessionZonesSql(eventId: string, options: { completeOnly?: boolean } = {}) {
  const complete = options.completeOnly === false ? sql`TRUE` : sql`all_species_noted`;
  return sql`
    WITH cs AS (SELECT id, zone_id FROM count_sessions WHERE event_id = ${eventId} AND ${complete}),
    votes AS (
      SELECT v.session_id, NULLIF(v.zone_key, ${NO_ZONE}::uuid) AS zone_id, v.sightings AS n, cs.zone_id AS started
      FROM result_session_zones v JOIN cs ON cs.id = v.session_id
      WHERE v.event_id = ${eventId} AND v.sightings > 0
    ),
    -- cs is joined once: joined twice, the planner expected millions of rows and spent
    -- longer compiling the query (JIT) than running it.
    best AS (
      SELECT DISTINCT ON (session_id) session_id, zone_id FROM votes
      ORDER BY session_id, n DESC, (zone_id IS NOT DISTINCT FROM started) DESC, zone_id NULLS LAST
    )
    SELECT cs.id, CASE WHEN b.session_id IS NULL THEN cs.zone_id ELSE b.zone_id END AS zone_id
    FROM cs LEFT JOIN best b ON b.session_id = cs.id`;
}

/**
 * Sightings not in the results yet: pending review or returned, in all and in complete
 * sessions; read from result_pending (migration 0023), one row per session or volunteer.
 */
export async function pendingCounts(eventId: string, db: Tx = getDb()): Promise<Pending> {
  const r = await db.execute<Pending>(sql`
    SELECT coalesce(sum(p.pending), 0)::int AS pending,
           coalesce(sum(p.returned), 0)::int AS returned,
           coalesce(sum(p.pending) FILTER (WHERE cs.all_species_noted), 0)::int AS "pendingInCompleteSessions",
           coalesce(sum(p.returned) FILTER (WHERE cs.all_species_noted), 0)::int AS "returnedInCompleteSessions"
    FROM result_pending p LEFT JOIN count_sessions cs ON cs.id = p.session_key
    WHERE p.event_id = ${eventId}`);
  return r.rows[0] ?? { pending: 0, returned: 0, pendingInCompleteSessions: 0, returnedInCompleteSessions: 0 };
}

/** Each taxon's code (migration 0024, result_taxon_codes), by taxon id. */
async function taxonCodes(ids: readonly string[], db: Tx): Promise<Map<string, number>> {
  const valid = ids.filter(isUuid);
  if (!valid.length) return new Map();
  const r = await db.execute<{ id: string; code: number }>(sql`
    SELECT taxon_id AS id, code FROM result_taxon_codes
    WHERE taxon_id = ANY(${sql.raw(`ARRAY[${valid.map((id) => `'${id}'`).join(",")}]::uuid[]`)})`);
  return new Map(r.rows.map((x) => [x.id, Number(x.code)]));
}

/** Reads at once on the pool, or one after another on one client (see loadResultsInputParts). */
async function together<T extends readonly unknown[]>(
  oneClient: boolean,
  reads: { [K in keyof T]: () => Promise<T[K]> },
): Promise<T> {
  if (!oneClient) return (await Promise.all(reads.map((r) => r()))) as unknown as T;
  const out: unknown[] = [];
  for (const r of reads) out.push(await r());
  return out as unknown as T;
}

/**
 * The results input from the aggregate tables (migrations 0007, 0023, 0024): a few thousand rows
 * however many sightings the event holds. Taxa are ordered by id and complete sessions
 * by id (the canonical order of lib/results/records.ts).
 */
export async function loadResultsInput(
  eventId: string,
  options: { sessions?: boolean; pending?: boolean; db?: Tx } = {},
): Promise<ResultsInput> {
  return loadResultsInputParts(eventId, options).full;
}

/**
 * The same input in two steps: `counted` (sessions still empty) as soon as the counts, zones,
 * taxa and pending figures are read, and `full` once the complete sessions are read too (the
 * longest query), so a caller can work on the counts meanwhile (server/results/current.ts).
 */
export function loadResultsInputParts(
  eventId: string,
  options: { sessions?: boolean; pending?: boolean; db?: Tx } = {},
): { counted: Promise<ResultsInput>; full: Promise<ResultsInput> } {
  // Results may lag a moment behind the primary: read from the replica when there is one,
  // unless the caller reads in a snapshot of its own (publishing).
  const db = options.db ?? getReadDb();
  // Each complete session's taxa as one kept text of taxon codes (migration 0024); every
  // complete session is a row, also when nothing in it is approved (an empty unit).
  // A caller's own client (a transaction) runs one query at a time: its reads go in turn
  // (pg queues a client's queries and will refuse them at once from pg 9); on the pool they
  // go at once, each on a connection of its own.
  const oneClient = options.db !== undefined;
  const readSessions = () =>
    options.sessions === false
      ? Promise.resolve({ rows: [] as { zoneId: string | null; taxa: string | null }[] })
      : db.execute<{ zoneId: string | null; taxa: string | null }>(sql`
      WITH sz AS (${sessionZonesSql(eventId)})
      SELECT sz.zone_id AS "zoneId", l.taxa
      FROM sz LEFT JOIN result_session_lists l ON l.event_id = ${eventId} AND l.session_id = sz.id
      ORDER BY sz.id`);
  const sessionsAtOnce = oneClient ? null : readSessions();
  const counted = (async () => {
    const [zones, counts, pending] = await together(oneClient, [
      () => eventZones(eventId, db),
      () =>
        db.execute<{ zoneId: string; taxonId: string; individuals: number }>(sql`
        SELECT zone_key AS "zoneId", taxon_id AS "taxonId", individuals::float8 AS individuals
        FROM result_taxon_counts WHERE event_id = ${eventId} AND sightings > 0`),
      () => (options.pending === false ? Promise.resolve(null) : pendingCounts(eventId, db)),
    ]);
    const ids = [...new Set(counts.rows.map((c) => c.taxonId))].sort();
    const index = new Map(ids.map((id, i) => [id, i]));
    const [meta, codes] = await together(oneClient, [() => taxaMeta(ids, db, eventId), () => taxonCodes(ids, db)]);
    // Taxon code → index into `taxa`.
    const byCode = new Map<number, number>();
    for (const [id, code] of codes) byCode.set(code, index.get(id)!);
    const input: ResultsInput = {
      ...(pending ? { pending } : {}),
      zones,
      taxa: ids.map((id) => meta.get(id)!),
      counts: counts.rows.map((c) => ({ zoneId: c.zoneId, taxon: index.get(c.taxonId)!, individuals: c.individuals })),
      sessions: [],
    };
    return { input, byCode };
  })();
  // A session's taxa as indices into `taxa`, ascending; a code of a taxon outside the counts
  // (read a moment apart on another connection) is left out, as the join left it out before.
  const indices = (byCode: Map<number, number>, text: string | null): number[] => {
    if (!text) return [];
    const out: number[] = [];
    for (const c of text.split(",")) {
      const i = byCode.get(Number(c));
      if (i !== undefined) out.push(i);
    }
    return out.sort((a, b) => a - b);
  };
  const sessions = sessionsAtOnce ?? counted.then(readSessions);
  const full = Promise.all([counted, sessions]).then(([{ input, byCode }, s]) => ({
    ...input,
    sessions: s.rows.map((r) => ({ zoneId: r.zoneId ?? NO_ZONE, taxa: indices(byCode, r.taxa) })),
  }));
  const countedInput = counted.then((c) => c.input);
  // A caller may await only one of the two: a failure of the other is not an unhandled rejection.
  full.catch(() => undefined);
  countedInput.catch(() => undefined);
  return { counted: countedInput, full };
}

/**
 * Every approved, identified sighting of the event as a report's input record, and one
 * record per complete count session (lib/results/records.ts), by id.
 */
export async function loadInputRecords(eventId: string, db: Tx = getDb()): Promise<InputRecord[]> {
  const r = await db.execute<{ r: InputRecord }>(sql`
    WITH sz AS (${sessionZonesSql(eventId)})
    SELECT r FROM (
      SELECT s.id, json_build_array(s.id, s.review_state, s.taxon_id, s.count, coalesce(s.zone_id, ${NO_ZONE}::uuid),
               sz.id, CASE WHEN sz.id IS NOT NULL THEN coalesce(sz.zone_id, ${NO_ZONE}::uuid) END) AS r
      FROM sightings s LEFT JOIN sz ON sz.id = s.session_id
      WHERE s.event_id = ${eventId} AND s.review_state = 'approved' AND s.taxon_id IS NOT NULL
      UNION ALL
      SELECT sz.id, json_build_array(sz.id, ${SESSION_RECORD}::text, '', 0, coalesce(sz.zone_id, ${NO_ZONE}::uuid), sz.id, coalesce(sz.zone_id, ${NO_ZONE}::uuid)) AS r
      FROM sz
    ) x ORDER BY x.id`);
  return r.rows.map((x) => x.r);
}

export type LiveFigures = {
  perHour: { hour: string; sightings: number }[];
  activeVolunteers: { lastHour: number; today: number; total: number };
  backlog: Record<ReviewState, number>;
};

/** The live board's counts: sightings per hour (last 48 hours of records), people, review backlog. */
export async function liveFigures(eventId: string): Promise<LiveFigures> {
  const db = getReadDb();
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
 * the triggers, a hash of the count sessions (complete flag and zone), the pending figures
 * and a hash of the sessions' sightings by zone (their votes, migration 0023), and hashes
 * of the zones and of the taxa in the results. Equal keys mean equal results.
 */
export async function resultsKey(eventId: string): Promise<string> {
  // The same database the results are read from (db/client.ts getReadDb), so the key matches them.
  const r = await getReadDb().execute<{ k: string }>(sql`
    SELECT concat_ws('|',
      (SELECT seq FROM result_stamps WHERE event_id = ${eventId}),
      (SELECT count(*) || ':' || coalesce(sum(hashtext(id::text || all_species_noted::text || coalesce(zone_id::text, ''))), 0)
         FROM count_sessions WHERE event_id = ${eventId}),
      (SELECT md5(string_agg(id::text || name || habitat::text, ',' ORDER BY id)) FROM zones WHERE event_id = ${eventId}),
      (SELECT coalesce(sum(pending), 0) || ':' || coalesce(sum(returned), 0) FROM result_pending WHERE event_id = ${eventId}),
      (SELECT count(*) || ':' || coalesce(sum(hashtext(session_id::text || zone_key::text || sightings::text)), 0)
         FROM result_session_zones WHERE event_id = ${eventId}),
      (SELECT string_agg(taxon_group::text || unit::text, ',' ORDER BY taxon_group) FROM event_count_units WHERE event_id = ${eventId}),
      (SELECT md5(string_agg(t.id::text || t.scientific_name || t.rank::text || t.taxon_group::text || t.sensitivity::text
                   || coalesce((SELECT string_agg(locale || name, ',' ORDER BY locale) FROM taxon_names n WHERE n.taxon_id = t.id), ''), ',' ORDER BY t.id))
         FROM taxa t WHERE t.id IN (SELECT taxon_id FROM result_taxon_counts WHERE event_id = ${eventId}))
    ) AS k`);
  return r.rows[0]!.k;
}

export type EarlierEvent = EarlierEventRef;

/**
 * Earlier events of the same site: the same organisation, not a draft, ended before this
 * one started, with an area that overlaps this event's area (PostGIS). Newest first.
 */
export async function earlierEventsOfSite(eventId: string, db: Tx = getReadDb()): Promise<EarlierEvent[]> {
  const r = await db.execute<EarlierEvent>(sql`
    SELECT o.id, o.name, o.slug, o.starts_at::text AS "startsAt", o.ends_at::text AS "endsAt"
    FROM events e
    JOIN events o ON o.organisation_id = e.organisation_id AND o.id <> e.id
    WHERE e.id = ${eventId} AND o.status <> 'draft' AND o.ends_at <= e.starts_at
      AND e.area IS NOT NULL AND o.area IS NOT NULL AND ST_Intersects(e.area, o.area)
    ORDER BY o.starts_at DESC
    LIMIT 20`);
  return r.rows;
}

/** An event's name and start, read where the caller reads (a publishing transaction). */
export async function eventNameAndStart(
  eventId: string,
  db: Tx = getDb(),
): Promise<{ id: string; name: string; startsAt: string } | null> {
  const r = await db.execute<{ id: string; name: string; startsAt: string }>(
    sql`SELECT id, name, starts_at::text AS "startsAt" FROM events WHERE id = ${eventId}`,
  );
  return r.rows[0] ?? null;
}
