import "server-only";
import { sql, type SQL } from "drizzle-orm";
import type { QueueFilters } from "@/lib/review/filters";
import { getDb } from "../client";
import type { events } from "../schema";
import { refreshCheckMarks, type Executor } from "./check-marks";
import type { CheckMark, ReviewState, Sensitivity, SightingSource, TaxonGroup } from "@/lib/domain";
import type { ArealGeometry } from "@/lib/geo/areal";

// The review desk's data: the queue (keyset pagination on observed time and id, so a deep
// page costs what the first one does), the detail of one sighting, and decisions, each
// appended to the reviews table with the sighting's state kept in step in one transaction.

/** Who is reviewing where: the event, and the taxon groups they may see (empty: every group). */
export type ReviewScope = { eventId: string; taxonGroups: TaxonGroup[]; locale: string };

export const QUEUE_PAGE_SIZE = 50;
export const MAX_BULK = 500;

export type QueueItem = {
  id: string;
  reviewState: ReviewState;
  version: number;
  taxonId: string | null;
  scientificName: string | null;
  commonName: string | null;
  taxonGroup: TaxonGroup | null;
  sensitive: boolean;
  description: string;
  count: number;
  countIsEstimate: boolean;
  observedAt: string;
  zoneName: string | null;
  volunteerName: string;
  checkMarks: CheckMark[];
  photoCount: number;
};
export type QueuePage = { items: QueueItem[]; nextCursor: string | null };

function encodeCursor(observedAt: string, id: string): string {
  return Buffer.from(`${observedAt}|${id}`, "utf8").toString("base64url");
}

/** A cursor from a client: null when it is not one of ours. */
export function decodeCursor(cursor: string): { observedAt: string; id: string } | null {
  const text = Buffer.from(cursor, "base64url").toString("utf8");
  const m = text.match(
    /^((\d{4})-(\d{2})-(\d{2}) (\d{2}):(\d{2}):(\d{2})(?:\.\d{1,6})?[+-](\d{2})(?::(\d{2}))?)\|([0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12})$/i,
  );
  if (!m) return null;
  // Every part in range, so PostgreSQL never sees an impossible timestamp.
  // An absent offset minute part reads as 0.
  const [y, mo, d, h, mi, se, oh, om] = m.slice(2, 10).map((x) => Number(x ?? 0)) as [
    number,
    number,
    number,
    number,
    number,
    number,
    number,
    number,
  ];
  const at = new Date(Date.UTC(y, mo - 1, d, h, mi, se));
  if (y < 1900 || at.getUTCMonth() !== mo - 1 || at.getUTCDate() !== d || h > 23 || mi > 59 || se > 59) return null;
  // PostgreSQL takes a UTC offset up to 15:59 (its documented limit, from memory); +99 was a 500.
  if (oh > 15 || om > 59) return null;
  return { observedAt: m[1]!, id: m[10]! };
}

/** The WHERE clause shared by the queue, the counts and bulk approve. */
function filterSql(scope: ReviewScope, f: Omit<QueueFilters, "order">, opts: { withState: boolean }): SQL {
  const parts: SQL[] = [sql`s.event_id = ${scope.eventId}`];
  if (scope.taxonGroups.length)
    parts.push(sql`t.taxon_group = ANY(${`{${scope.taxonGroups.join(",")}}`}::taxon_group[])`);
  if (opts.withState && f.state) parts.push(sql`s.review_state = ${f.state}`);
  if (f.zone === "none") parts.push(sql`s.zone_id IS NULL`);
  else if (f.zone) parts.push(sql`s.zone_id = ${f.zone}`);
  if (f.group) parts.push(sql`t.taxon_group = ${f.group}`);
  if (f.marks?.length) parts.push(sql`s.check_marks @> ${`{${f.marks.join(",")}}`}::check_mark[]`);
  if (f.volunteer) parts.push(sql`s.user_id = ${f.volunteer}`);
  if (f.from) parts.push(sql`s.observed_at >= (${f.from}::date::timestamp AT TIME ZONE e.time_zone)`);
  if (f.to) parts.push(sql`s.observed_at < ((${f.to}::date + 1)::timestamp AT TIME ZONE e.time_zone)`);
  if (f.photo === "yes")
    parts.push(sql`EXISTS (SELECT 1 FROM photos p WHERE p.sighting_id = s.id AND p.event_id = s.event_id)`);
  if (f.photo === "no")
    parts.push(sql`NOT EXISTS (SELECT 1 FROM photos p WHERE p.sighting_id = s.id AND p.event_id = s.event_id)`);
  return sql.join(parts, sql` AND `);
}

/** FROM clause: a coordinator limited to groups never sees unidentified records (their group is unknown). */
function fromSql(scope: ReviewScope): SQL {
  return sql`sightings s JOIN events e ON e.id = s.event_id ${scope.taxonGroups.length ? sql`JOIN` : sql`LEFT JOIN`} taxa t ON t.id = s.taxon_id`;
}

export async function reviewQueue(
  scope: ReviewScope,
  f: QueueFilters,
  cursor: string | null,
  limit = QUEUE_PAGE_SIZE,
  db: Executor = getDb(),
): Promise<QueuePage> {
  const after = cursor ? decodeCursor(cursor) : null;
  const desc = f.order === "newest";
  const keyset = after
    ? desc
      ? sql`AND (s.observed_at, s.id) < (${after.observedAt}::timestamptz, ${after.id}::uuid)`
      : sql`AND (s.observed_at, s.id) > (${after.observedAt}::timestamptz, ${after.id}::uuid)`
    : sql``;
  const order = desc ? sql`s.observed_at DESC, s.id DESC` : sql`s.observed_at ASC, s.id ASC`;
  const { rows } = await db.execute<QueueItem & { cursorAt: string }>(sql`
    SELECT s.id, s.review_state AS "reviewState", s.version, s.taxon_id AS "taxonId",
      t.scientific_name AS "scientificName", t.taxon_group AS "taxonGroup", coalesce(t.sensitivity <> 'open', false) AS sensitive,
      (SELECT coalesce(max(n.name) FILTER (WHERE n.locale = ${scope.locale}), max(n.name) FILTER (WHERE n.locale = 'en'))
         FROM taxon_names n WHERE n.taxon_id = s.taxon_id) AS "commonName",
      s.description, s.count, s.count_is_estimate AS "countIsEstimate",
      to_char(s.observed_at AT TIME ZONE 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"') AS "observedAt", s.observed_at::text AS "cursorAt",
      z.name AS "zoneName", coalesce(u.name, u.email) AS "volunteerName", s.check_marks::text[] AS "checkMarks",
      (SELECT count(*)::int FROM photos p WHERE p.sighting_id = s.id AND p.event_id = s.event_id) AS "photoCount"
    FROM ${fromSql(scope)}
    JOIN users u ON u.id = s.user_id
    LEFT JOIN zones z ON z.id = s.zone_id
    WHERE ${filterSql(scope, f, { withState: true })} ${keyset}
    ORDER BY ${order}
    LIMIT ${limit + 1}`);
  const more = rows.length > limit;
  const items = rows.slice(0, limit);
  const last = items[items.length - 1];
  return {
    items: items.map(({ cursorAt: _c, ...item }) => item),
    nextCursor: more && last ? encodeCursor(last.cursorAt, last.id) : null,
  };
}

/** How many sightings in each review state match the filters (the state filter aside). */
export async function queueCounts(
  scope: ReviewScope,
  f: QueueFilters,
  db: Executor = getDb(),
): Promise<Record<ReviewState, number>> {
  const { rows } = await db.execute<{ state: ReviewState; n: number }>(sql`
    SELECT s.review_state AS state, count(*)::int AS n FROM ${fromSql(scope)}
    WHERE ${filterSql(scope, f, { withState: false })} GROUP BY 1`);
  const counts: Record<ReviewState, number> = { pending: 0, approved: 0, rejected: 0, returned: 0 };
  for (const r of rows) counts[r.state] = r.n;
  return counts;
}

/** Filter choices for the desk: zones, the event's volunteers with records, and the groups in scope. */
export async function queueChoices(scope: ReviewScope) {
  const db = getDb();
  const [zones, volunteers] = await Promise.all([
    db.execute<{ id: string; name: string }>(
      sql`SELECT id, name FROM zones WHERE event_id = ${scope.eventId} ORDER BY name`,
    ),
    db.execute<{ id: string; name: string }>(sql`
      SELECT u.id, coalesce(u.name, u.email) AS name FROM users u
      WHERE EXISTS (SELECT 1 FROM sightings s WHERE s.event_id = ${scope.eventId} AND s.user_id = u.id) ORDER BY 2`),
  ]);
  return { zones: zones.rows, volunteers: volunteers.rows };
}

export type ReviewEvent = Pick<
  typeof events.$inferSelect,
  "id" | "slug" | "name" | "timeZone" | "startsAt" | "endsAt" | "accuracyLimitM"
>;

export async function reviewEventBySlug(slug: string): Promise<ReviewEvent | null> {
  const { rows } = await getDb().execute<ReviewEvent>(sql`
    SELECT id, slug, name, time_zone AS "timeZone", starts_at AS "startsAt", ends_at AS "endsAt", accuracy_limit_m AS "accuracyLimitM"
    FROM events WHERE slug = ${slug}`);
  const row = rows[0];
  return row ? { ...row, startsAt: new Date(row.startsAt), endsAt: new Date(row.endsAt) } : null;
}

/**
 * Where a sighting is and which group it belongs to, to check a reviewer's scope before showing or deciding it.
 * Looked up within the desk's event (one partition of sightings): a sighting of another event is not found.
 */
async function sightingPlace(db: Executor, eventId: string, sightingId: string, lock: boolean) {
  const { rows } = await db.execute<{
    id: string;
    eventId: string;
    userId: string;
    reviewState: ReviewState;
    version: number;
    taxonId: string | null;
    taxonGroup: TaxonGroup | null;
  }>(sql`
    SELECT s.id, s.event_id AS "eventId", s.user_id AS "userId", s.review_state AS "reviewState", s.version,
      s.taxon_id AS "taxonId", t.taxon_group::text AS "taxonGroup"
    FROM sightings s LEFT JOIN taxa t ON t.id = s.taxon_id WHERE s.event_id = ${eventId} AND s.id = ${sightingId}
    ${lock ? sql`FOR UPDATE OF s` : sql``}`);
  return rows[0] ?? null;
}

export type ScopeCheck = "ok" | "not_found" | "forbidden";

function inScope(scope: ReviewScope, place: { eventId: string; taxonGroup: TaxonGroup | null } | null): ScopeCheck {
  if (!place || place.eventId !== scope.eventId) return "not_found";
  if (scope.taxonGroups.length && !(place.taxonGroup && scope.taxonGroups.includes(place.taxonGroup)))
    return "forbidden";
  return "ok";
}

export async function sightingDetail(scope: ReviewScope, sightingId: string) {
  const db = getDb();
  const check = inScope(scope, await sightingPlace(db, scope.eventId, sightingId, false));
  if (check !== "ok") return { check } as const;
  const name = (col: SQL) =>
    sql`(SELECT coalesce(max(n.name) FILTER (WHERE n.locale = ${scope.locale}), max(n.name) FILTER (WHERE n.locale = 'en')) FROM taxon_names n WHERE n.taxon_id = ${col})`;
  const [main, photos, history, nearby, map] = await Promise.all([
    db.execute<{
      id: string;
      reviewState: ReviewState;
      version: number;
      taxonId: string | null;
      scientificName: string | null;
      commonName: string | null;
      taxonGroup: TaxonGroup | null;
      sensitivity: Sensitivity | null;
      description: string;
      count: number;
      countIsEstimate: boolean;
      observedAt: string;
      receivedAt: string;
      lon: number;
      lat: number;
      accuracyM: number;
      zoneId: string | null;
      zoneName: string | null;
      notes: string;
      source: SightingSource;
      transcriberName: string | null;
      volunteerId: string;
      volunteerName: string;
      checkMarks: CheckMark[];
      sessionId: string | null;
      sessionKind: string | null;
      sessionStartedAt: string | null;
      sessionEndedAt: string | null;
      sessionAllSpecies: boolean | null;
      sessionZoneName: string | null;
      sessionSightings: number | null;
    }>(sql`
      SELECT s.id, s.review_state AS "reviewState", s.version, s.taxon_id AS "taxonId", t.scientific_name AS "scientificName",
        ${name(sql`s.taxon_id`)} AS "commonName", t.taxon_group AS "taxonGroup", t.sensitivity::text AS sensitivity,
        s.description, s.count, s.count_is_estimate AS "countIsEstimate", s.observed_at AS "observedAt", s.created_at AS "receivedAt",
        ST_X(s.location) AS lon, ST_Y(s.location) AS lat, s.accuracy_m AS "accuracyM", s.zone_id AS "zoneId", z.name AS "zoneName", s.notes,
        s.source, (SELECT coalesce(tu.name, tu.email) FROM users tu WHERE tu.id = s.transcribed_by) AS "transcriberName",
        s.user_id AS "volunteerId", coalesce(u.name, u.email) AS "volunteerName", s.check_marks::text[] AS "checkMarks",
        c.id AS "sessionId", c.kind::text AS "sessionKind", c.started_at AS "sessionStartedAt", c.ended_at AS "sessionEndedAt",
        c.all_species_noted AS "sessionAllSpecies", cz.name AS "sessionZoneName",
        (SELECT count(*)::int FROM sightings x WHERE x.event_id = s.event_id AND x.session_id = c.id) AS "sessionSightings"
      FROM sightings s JOIN users u ON u.id = s.user_id
      LEFT JOIN taxa t ON t.id = s.taxon_id LEFT JOIN zones z ON z.id = s.zone_id
      LEFT JOIN count_sessions c ON c.id = s.session_id LEFT JOIN zones cz ON cz.id = c.zone_id
      WHERE s.event_id = ${scope.eventId} AND s.id = ${sightingId}`),
    db.execute<{ id: string; contentType: string; sizeBytes: number; width: number | null; height: number | null }>(sql`
      SELECT id, content_type AS "contentType", size_bytes AS "sizeBytes", width, height FROM photos WHERE sighting_id = ${sightingId} AND event_id = ${scope.eventId} ORDER BY created_at, id`),
    db.execute<{
      id: number;
      decidedAt: string;
      reviewerName: string;
      fromState: ReviewState;
      toState: ReviewState;
      fromTaxon: string | null;
      toTaxon: string | null;
      reason: string;
      message: string;
      undoesId: number | null;
    }>(sql`
      SELECT r.id::int AS id, r.undoes_id::int AS "undoesId", r.decided_at AS "decidedAt", coalesce(u.name, u.email) AS "reviewerName", r.from_state AS "fromState", r.to_state AS "toState",
        (SELECT coalesce(${name(sql`ft.id`)} || ' (' || ft.scientific_name || ')', ft.scientific_name) FROM taxa ft WHERE ft.id = r.from_taxon_id) AS "fromTaxon",
        (SELECT coalesce(${name(sql`tt.id`)} || ' (' || tt.scientific_name || ')', tt.scientific_name) FROM taxa tt WHERE tt.id = r.to_taxon_id) AS "toTaxon",
        r.reason, r.message
      FROM reviews r JOIN users u ON u.id = r.reviewer_id WHERE r.sighting_id = ${sightingId} AND r.event_id = ${scope.eventId} ORDER BY r.decided_at, r.id`),
    // The volunteer's other records within two hours either side, to judge duplicates and context.
    db.execute<{
      id: string;
      observedAt: string;
      commonName: string | null;
      scientificName: string | null;
      count: number;
      reviewState: ReviewState;
      distanceM: number;
    }>(sql`
      SELECT o.id, o.observed_at AS "observedAt", ${name(sql`o.taxon_id`)} AS "commonName", ot.scientific_name AS "scientificName", o.count,
        o.review_state AS "reviewState", round(ST_Distance(o.location::geography, s.location::geography))::int AS "distanceM"
      FROM sightings s JOIN sightings o ON o.user_id = s.user_id AND o.event_id = s.event_id AND o.id <> s.id
        AND o.observed_at BETWEEN s.observed_at - interval '2 hours' AND s.observed_at + interval '2 hours'
      LEFT JOIN taxa ot ON ot.id = o.taxon_id
      WHERE s.event_id = ${scope.eventId} AND s.id = ${sightingId} ORDER BY o.observed_at LIMIT 30`),
    db.execute<{ area: string | null; zones: { id: string; name: string; geometry: string }[] | null }>(sql`
      SELECT ST_AsGeoJSON(e.area, 6) AS area,
        (SELECT json_agg(json_build_object('id', z.id, 'name', z.name, 'geometry', ST_AsGeoJSON(z.geom, 6)) ORDER BY z.name) FROM zones z WHERE z.event_id = e.id) AS zones
      FROM events e WHERE e.id = ${scope.eventId}`),
  ]);
  const m = map.rows[0];
  return {
    check: "ok" as const,
    sighting: main.rows[0]!,
    photos: photos.rows,
    history: history.rows,
    nearby: nearby.rows,
    map: {
      area: m?.area ? (JSON.parse(m.area) as ArealGeometry) : null,
      zones: (m?.zones ?? []).map((z) => ({
        id: z.id,
        name: z.name,
        geometry: JSON.parse(z.geometry) as ArealGeometry,
      })),
    },
  };
}
export type SightingDetail = Extract<Awaited<ReturnType<typeof sightingDetail>>, { check: "ok" }>;

export type Decision =
  | { action: "approve"; version: number; message?: string }
  | { action: "reject"; version: number; reason: string; message?: string }
  | { action: "return"; version: number; message: string }
  | { action: "reidentify"; version: number; taxonId: string; approve?: boolean; message?: string };

export type DecisionResult =
  | {
      outcome: "ok";
      sighting: { id: string; reviewState: ReviewState; version: number; taxonId: string | null };
      reviewId: number;
    }
  | { outcome: "not_found" | "forbidden" }
  | { outcome: "conflict"; current: { reviewState: ReviewState; version: number } }
  | { outcome: "unchanged" }
  | { outcome: "bad_taxon"; why: "unknown" | "out_of_scope" | "same" };

const TO_STATE = { approve: "approved", reject: "rejected", return: "returned" } as const;

/**
 * The sighting locked for a decision or an undo, if it is in the reviewer's scope and still
 * at the version they saw; otherwise the outcome to answer (a stale version is a conflict).
 */
async function lockAtVersion(
  tx: Executor,
  scope: ReviewScope,
  sightingId: string,
  version: number,
): Promise<
  | { place: NonNullable<Awaited<ReturnType<typeof sightingPlace>>> }
  | Extract<DecisionResult, { outcome: "not_found" | "forbidden" | "conflict" }>
> {
  const place = await sightingPlace(tx, scope.eventId, sightingId, true);
  const check = inScope(scope, place);
  if (check !== "ok") return { outcome: check };
  if (place!.version !== version)
    return { outcome: "conflict", current: { reviewState: place!.reviewState, version: place!.version } };
  return { place: place! };
}

/**
 * One decision on one sighting, in one transaction: the row is locked, its version
 * compared with the one the reviewer saw (a mismatch is a conflict, never an overwrite),
 * the decision appended to reviews, the sighting's state, taxon and version moved in step,
 * a notice queued for the volunteer's digest, and the check marks recomputed.
 */
export async function decide(
  scope: ReviewScope,
  reviewerId: string,
  sightingId: string,
  d: Decision,
): Promise<DecisionResult> {
  return getDb().transaction(async (tx) => {
    const locked = await lockAtVersion(tx, scope, sightingId, d.version);
    if ("outcome" in locked) return locked;
    const p = locked.place;
    let toState: ReviewState = p.reviewState;
    let toTaxon = p.taxonId;
    if (d.action === "reidentify") {
      if (d.taxonId === p.taxonId) return { outcome: "bad_taxon", why: "same" };
      const { rows } = await tx.execute<{ group: TaxonGroup }>(
        sql`SELECT taxon_group::text AS group FROM taxa WHERE id = ${d.taxonId}`,
      );
      if (!rows[0]) return { outcome: "bad_taxon", why: "unknown" };
      if (scope.taxonGroups.length && !scope.taxonGroups.includes(rows[0].group))
        return { outcome: "bad_taxon", why: "out_of_scope" };
      toTaxon = d.taxonId;
      if (d.approve) toState = "approved"; // re-identify and approve: one decision, one row
    } else {
      toState = TO_STATE[d.action];
      if (toState === p.reviewState) return { outcome: "unchanged" };
    }
    const reason = d.action === "reject" ? d.reason : "";
    const message = d.message?.trim() ?? "";
    const { rows: updated } = await tx.execute<{ version: number }>(sql`
      UPDATE sightings SET review_state = ${toState}, taxon_id = ${toTaxon}, version = version + 1, updated_at = now()
      WHERE event_id = ${scope.eventId} AND id = ${sightingId} RETURNING version`);
    const { rows: review } = await tx.execute<{ id: number }>(sql`
      INSERT INTO reviews (sighting_id, event_id, reviewer_id, from_state, to_state, from_taxon_id, to_taxon_id, reason, message)
      VALUES (${sightingId}, ${scope.eventId}, ${reviewerId}, ${p.reviewState}, ${toState}, ${p.taxonId}, ${toTaxon}, ${reason}, ${message})
      RETURNING id::int AS id`);
    await tx.execute(sql`INSERT INTO review_notices (review_id, volunteer_id) VALUES (${review[0]!.id}, ${p.userId})`);
    await refreshCheckMarks(tx, [sightingId], scope.eventId);
    return {
      outcome: "ok",
      reviewId: review[0]!.id,
      sighting: { id: sightingId, reviewState: toState, version: updated[0]!.version, taxonId: toTaxon },
    };
  });
}

export type BulkResult =
  | { outcome: "ok"; approved: number }
  | { outcome: "count_changed"; count: number }
  | { outcome: "too_many"; count: number };

/**
 * Bulk approval never sweeps in flagged records silently: it takes the pending sightings that
 * match the filters and carry no check mark, plus those whose every mark the reviewer chose to
 * include (`include`). The same rule on the server and in the confirmation's numbers.
 */
function bulkRule(include: readonly CheckMark[]): SQL {
  return sql`s.check_marks <@ ${`{${include.join(",")}}`}::check_mark[]`;
}

export type BulkPreview = {
  /** Pending sightings that match the filters. */
  matching: number;
  /** Those bulk approval would take, with the marks included. */
  count: number;
  /** Those left out for a check mark not included. */
  leftOut: number;
  /** Each mark carried by matching pending sightings, with how many carry it. */
  marks: { mark: CheckMark; n: number }[];
};

/** What a bulk approval with these filters and included marks would take, and what it leaves out. */
export async function bulkPreview(
  scope: ReviewScope,
  f: QueueFilters,
  include: readonly CheckMark[],
  db: Executor = getDb(),
): Promise<BulkPreview> {
  const where = filterSql(scope, { ...f, state: "pending" }, { withState: true });
  const [totals, marks] = await Promise.all([
    db.execute<{ matching: number; count: number }>(sql`
      SELECT count(*)::int AS matching, (count(*) FILTER (WHERE ${bulkRule(include)}))::int AS count
      FROM ${fromSql(scope)} WHERE ${where}`),
    db.execute<{ mark: CheckMark; n: number }>(sql`
      SELECT m::text AS mark, count(*)::int AS n FROM ${fromSql(scope)} CROSS JOIN LATERAL unnest(s.check_marks) AS m
      WHERE ${where} GROUP BY 1 ORDER BY 1`),
  ]);
  const t = totals.rows[0] ?? { matching: 0, count: 0 };
  return { matching: t.matching, count: t.count, leftOut: t.matching - t.count, marks: marks.rows };
}

/**
 * Approves the pending sightings that match the filters under the bulk rule (no check mark, or
 * only marks in `include`), provided their number is the one the reviewer confirmed
 * (`expected`): if the set changed meanwhile, nothing is done.
 */
export async function bulkApprove(
  scope: ReviewScope,
  reviewerId: string,
  f: QueueFilters,
  expected: number,
  include: readonly CheckMark[] = [],
): Promise<BulkResult> {
  return getDb().transaction(async (tx) => {
    const { rows } = await tx.execute<{ id: string; userId: string; taxonId: string | null }>(sql`
      SELECT s.id, s.user_id AS "userId", s.taxon_id AS "taxonId" FROM ${fromSql(scope)}
      WHERE ${filterSql(scope, { ...f, state: "pending" }, { withState: true })} AND ${bulkRule(include)}
      ORDER BY s.id LIMIT ${MAX_BULK + 1} FOR UPDATE OF s`);
    if (rows.length > MAX_BULK) return { outcome: "too_many", count: rows.length };
    if (rows.length !== expected) return { outcome: "count_changed", count: rows.length };
    if (!rows.length) return { outcome: "ok", approved: 0 };
    const ids = rows.map((r) => r.id);
    const idArray = sql`${`{${ids.join(",")}}`}::uuid[]`;
    await tx.execute(
      sql`UPDATE sightings SET review_state = 'approved', version = version + 1, updated_at = now() WHERE event_id = ${scope.eventId} AND id = ANY(${idArray})`,
    );
    await tx.execute(sql`
      WITH added AS (
        INSERT INTO reviews (sighting_id, event_id, reviewer_id, from_state, to_state, from_taxon_id, to_taxon_id, reason, message)
        SELECT s.id, s.event_id, ${reviewerId}, 'pending', 'approved', s.taxon_id, s.taxon_id, '', '' FROM sightings s
        WHERE s.event_id = ${scope.eventId} AND s.id = ANY(${idArray})
        RETURNING id, sighting_id
      )
      INSERT INTO review_notices (review_id, volunteer_id)
      SELECT a.id, s.user_id FROM added a JOIN sightings s ON s.event_id = ${scope.eventId} AND s.id = a.sighting_id`);
    await refreshCheckMarks(tx, ids, scope.eventId);
    return { outcome: "ok", approved: ids.length };
  });
}

export type UndoResult = DecisionResult | { outcome: "unknown_review" } | { outcome: "not_last" };

/**
 * Undoes a decision by appending a new one (reviews is append-only: never an edit of history):
 * the sighting goes back to the state and taxon it had before, its version moves on (so an
 * older view of it is still a conflict), and the new row names the one it undoes. Only the
 * latest decision on a sighting can be undone, and only while the sighting still shows it.
 * A notice the volunteer has not been mailed yet is withdrawn with the decision; otherwise
 * the undo is itself a notice.
 */
export async function undoDecision(
  scope: ReviewScope,
  reviewerId: string,
  sightingId: string,
  reviewId: number,
  version: number,
): Promise<UndoResult> {
  return getDb().transaction(async (tx) => {
    const locked = await lockAtVersion(tx, scope, sightingId, version);
    if ("outcome" in locked) return locked;
    const p = locked.place;
    const { rows: latest } = await tx.execute<{
      id: number;
      fromState: ReviewState;
      toState: ReviewState;
      fromTaxonId: string | null;
      toTaxonId: string | null;
    }>(sql`
      SELECT id::int AS id, from_state AS "fromState", to_state AS "toState", from_taxon_id AS "fromTaxonId", to_taxon_id AS "toTaxonId"
      FROM reviews WHERE sighting_id = ${sightingId} AND event_id = ${scope.eventId} ORDER BY id DESC LIMIT 1`);
    const last = latest[0];
    if (!last || last.id !== reviewId) {
      const { rows: named } = await tx.execute(
        sql`SELECT 1 FROM reviews WHERE id = ${reviewId} AND sighting_id = ${sightingId} AND event_id = ${scope.eventId}`,
      );
      return { outcome: named.length ? "not_last" : "unknown_review" };
    }
    if (last.toState !== p.reviewState || last.toTaxonId !== p.taxonId) return { outcome: "not_last" };
    const { rows: updated } = await tx.execute<{ version: number }>(sql`
      UPDATE sightings SET review_state = ${last.fromState}, taxon_id = ${last.fromTaxonId}, version = version + 1, updated_at = now()
      WHERE event_id = ${scope.eventId} AND id = ${sightingId} RETURNING version`);
    const { rows: review } = await tx.execute<{ id: number }>(sql`
      INSERT INTO reviews (sighting_id, event_id, reviewer_id, from_state, to_state, from_taxon_id, to_taxon_id, reason, message, undoes_id)
      VALUES (${sightingId}, ${scope.eventId}, ${reviewerId}, ${last.toState}, ${last.fromState}, ${last.toTaxonId}, ${last.fromTaxonId}, '', '', ${reviewId})
      RETURNING id::int AS id`);
    const { rows: withdrawn } = await tx.execute(
      sql`DELETE FROM review_notices WHERE review_id = ${reviewId} AND digest_id IS NULL RETURNING review_id`,
    );
    if (!withdrawn.length)
      await tx.execute(
        sql`INSERT INTO review_notices (review_id, volunteer_id) VALUES (${review[0]!.id}, ${p.userId})`,
      );
    await refreshCheckMarks(tx, [sightingId], scope.eventId);
    return {
      outcome: "ok",
      reviewId: review[0]!.id,
      sighting: {
        id: sightingId,
        reviewState: last.fromState,
        version: updated[0]!.version,
        taxonId: last.fromTaxonId,
      },
    };
  });
}

/** Taxa a reviewer may choose when re-identifying: by common or scientific name, within their groups. */
export async function searchTaxa(scope: ReviewScope, q: string, limit = 12) {
  const like = `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
  const { rows } = await getDb().execute<{
    id: string;
    scientificName: string;
    commonName: string | null;
    taxonGroup: TaxonGroup;
    onList: boolean;
  }>(sql`
    SELECT t.id, t.scientific_name AS "scientificName", t.taxon_group::text AS "taxonGroup",
      (SELECT coalesce(max(n.name) FILTER (WHERE n.locale = ${scope.locale}), max(n.name) FILTER (WHERE n.locale = 'en')) FROM taxon_names n WHERE n.taxon_id = t.id) AS "commonName",
      EXISTS (SELECT 1 FROM event_species es WHERE es.event_id = ${scope.eventId} AND es.taxon_id = t.id) AS "onList"
    FROM taxa t
    WHERE (t.scientific_name ILIKE ${like} OR EXISTS (SELECT 1 FROM taxon_names n WHERE n.taxon_id = t.id AND n.name ILIKE ${like}))
      ${scope.taxonGroups.length ? sql`AND t.taxon_group = ANY(${`{${scope.taxonGroups.join(",")}}`}::taxon_group[])` : sql``}
    ORDER BY "onList" DESC, t.scientific_name LIMIT ${limit}`);
  return rows;
}
