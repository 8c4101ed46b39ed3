import { eq, sql } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { loadResultsInput, pendingCounts, resultsKey, sessionZonesSql } from "@/db/queries/results";
import { decide, type Decision, type ReviewScope } from "@/db/queries/review";
import { uploadAreaAndZones } from "@/db/queries/setup-zones";
import { ingestBatch } from "@/db/queries/sync";
import * as s from "@/db/schema";
import type { ArealGeometry as Geometry } from "@/lib/geo/areal";
import type { SessionRecord, SightingRecord } from "@/lib/sync/records";
import { db, makeFixture, polygonSql, sightingValues, syncSession, syncSighting } from "./helpers";

// Issue 14: the zone of each count session and the pending figures are read from aggregates
// kept by triggers (migration 0023). Each step below holds them to the direct computation
// over every sighting: the queries the results used before. Likewise each session's list of
// present taxa (migration 0024, result_session_lists) against the approved sightings, and the
// results input's sessions against the per-(session, taxon) query it replaced.

type Fixture = Awaited<ReturnType<typeof makeFixture>>;
let f: Fixture;
let zoneB: typeof s.zones.$inferSelect;
let second: typeof s.taxa.$inferSelect;
let coordinator = "";
let scope: ReviewScope;
const NOW = new Date("2026-06-21T00:00:00Z");

const session = (over: Record<string, unknown> = {}): SessionRecord => syncSession(f.zone.id, over);
// Zone A covers [0, 0.5]², zone B [0.5, 1] × [0, 0.5]; (0.7, 0.7) lies outside both.
const A = { longitude: 0.2, latitude: 0.2 };
const B = { longitude: 0.7, latitude: 0.2 };
const OUT = { longitude: 0.7, latitude: 0.7 };
const sighting = (where: { longitude: number; latitude: number }, over: Record<string, unknown> = {}): SightingRecord =>
  syncSighting(f.taxon.id, { count: 1, accuracyM: 8, ...where, ...over });
const ingest = (sessions: SessionRecord[], sightings: SightingRecord[]) =>
  ingestBatch({
    userId: f.user.id,
    eventId: f.event.id,
    sessions: sessions.map((record, index) => ({ index, record })),
    sightings: sightings.map((record, index) => ({ index, record })),
    now: NOW,
  });
const version = async (id: string) =>
  (await db().select({ v: s.sightings.version }).from(s.sightings).where(eq(s.sightings.id, id)))[0]!.v;

/** The zone of each session as computed before 0023: a vote over every sighting. */
async function directSessionZones(eventId: string, completeOnly: boolean) {
  const r = await db().execute<{ id: string; zone_id: string | null }>(sql`
    WITH cs AS (SELECT id, zone_id FROM count_sessions WHERE event_id = ${eventId} AND (${!completeOnly} OR all_species_noted)),
    votes AS (
      SELECT s.session_id, s.zone_id, count(*) AS n FROM sightings s JOIN cs ON cs.id = s.session_id
      WHERE s.event_id = ${eventId} GROUP BY 1, 2
    ),
    best AS (
      SELECT DISTINCT ON (v.session_id) v.session_id, v.zone_id FROM votes v JOIN cs ON cs.id = v.session_id
      ORDER BY v.session_id, v.n DESC, (v.zone_id IS NOT DISTINCT FROM cs.zone_id) DESC, v.zone_id NULLS LAST
    )
    SELECT cs.id, CASE WHEN b.session_id IS NULL THEN cs.zone_id ELSE b.zone_id END AS zone_id
    FROM cs LEFT JOIN best b ON b.session_id = cs.id ORDER BY cs.id`);
  return r.rows;
}
async function keptSessionZones(eventId: string, completeOnly: boolean) {
  const r = await db().execute<{ id: string; zone_id: string | null }>(
    sql`SELECT id, zone_id FROM (${sessionZonesSql(eventId, { completeOnly })}) sz ORDER BY id`,
  );
  return r.rows;
}
/** The pending figures as computed before 0023: a count over every pending or returned sighting. */
async function directPending(eventId: string) {
  const r = await db().execute(sql`
    SELECT count(*) FILTER (WHERE s.review_state = 'pending')::int AS pending,
           count(*) FILTER (WHERE s.review_state = 'returned')::int AS returned,
           count(*) FILTER (WHERE s.review_state = 'pending' AND cs.all_species_noted)::int AS "pendingInCompleteSessions",
           count(*) FILTER (WHERE s.review_state = 'returned' AND cs.all_species_noted)::int AS "returnedInCompleteSessions"
    FROM sightings s LEFT JOIN count_sessions cs ON cs.id = s.session_id
    WHERE s.event_id = ${eventId} AND s.review_state IN ('pending', 'returned')`);
  return r.rows[0];
}
/** The aggregate rows themselves against a GROUP BY over the sightings, and no row left at zero. */
async function rowsMatch(eventId: string) {
  const kept = await db().execute<{ k: string }>(sql`
    SELECT session_id || '|' || zone_key || '|' || sightings AS k FROM result_session_zones WHERE event_id = ${eventId}
    UNION ALL
    SELECT 'p|' || session_key || '|' || user_id || '|' || pending || '|' || returned FROM result_pending WHERE event_id = ${eventId}
    ORDER BY 1`);
  const direct = await db().execute<{ k: string }>(sql`
    SELECT session_id || '|' || coalesce(zone_id, '00000000-0000-0000-0000-000000000000'::uuid) || '|' || count(*) AS k
    FROM sightings WHERE event_id = ${eventId} AND session_id IS NOT NULL GROUP BY session_id, zone_id
    UNION ALL
    SELECT 'p|' || coalesce(session_id, '00000000-0000-0000-0000-000000000000'::uuid) || '|' || user_id || '|'
           || count(*) FILTER (WHERE review_state = 'pending') || '|' || count(*) FILTER (WHERE review_state = 'returned')
    FROM sightings WHERE event_id = ${eventId} AND review_state IN ('pending', 'returned') GROUP BY session_id, user_id
    ORDER BY 1`);
  expect(kept.rows.map((r) => r.k)).toEqual(direct.rows.map((r) => r.k));
  const zero = await db().execute<{ n: number }>(sql`
    SELECT ((SELECT count(*) FROM result_session_zones WHERE sightings <= 0)
          + (SELECT count(*) FROM result_pending WHERE pending <= 0 AND returned <= 0))::int AS n`);
  expect(zero.rows[0]!.n).toBe(0);
}
/** Each session's kept taxon codes against its approved sightings; every taxon has a code. */
async function listsMatch(eventId: string) {
  const kept = await db().execute<{ k: string }>(sql`
    SELECT session_id || '|' || taxa AS k FROM result_session_lists WHERE event_id = ${eventId} ORDER BY 1`);
  const direct = await db().execute<{ k: string }>(sql`
    SELECT s.session_id || '|' || array_to_string(array_agg(DISTINCT c.code ORDER BY c.code), ',') AS k
    FROM sightings s JOIN result_taxon_codes c ON c.taxon_id = s.taxon_id
    WHERE s.event_id = ${eventId} AND s.review_state = 'approved' AND s.session_id IS NOT NULL
    GROUP BY s.session_id ORDER BY 1`);
  expect(kept.rows.map((r) => r.k)).toEqual(direct.rows.map((r) => r.k));
  const uncoded = await db().execute<{ n: number }>(sql`
    SELECT count(*)::int AS n FROM taxa t WHERE NOT EXISTS (SELECT 1 FROM result_taxon_codes c WHERE c.taxon_id = t.id)`);
  expect(uncoded.rows[0]!.n).toBe(0);
}
/** The complete sessions' taxa (indices into the event's taxa by id) as read before 0024: per (session, taxon). */
async function directSessionTaxa(eventId: string) {
  const r = await db().execute<{ zoneId: string | null; taxa: string | null }>(sql`
    WITH tx AS (
      SELECT taxon_id, (row_number() OVER (ORDER BY taxon_id) - 1)::int AS i
      FROM (SELECT DISTINCT taxon_id FROM result_taxon_counts WHERE event_id = ${eventId} AND sightings > 0) d
    ),
    sz AS (${sessionZonesSql(eventId)}),
    present AS (
      SELECT st.session_id, string_agg(tx.i::text, ',') AS taxa
      FROM result_session_taxa st JOIN tx ON tx.taxon_id = st.taxon_id
      WHERE st.event_id = ${eventId} AND st.sightings > 0
      GROUP BY st.session_id
    )
    SELECT sz.zone_id AS "zoneId", p.taxa FROM sz LEFT JOIN present p ON p.session_id = sz.id ORDER BY sz.id`);
  return r.rows.map((x) => ({
    zoneId: x.zoneId ?? "00000000-0000-0000-0000-000000000000",
    taxa: x.taxa
      ? x.taxa
          .split(",")
          .map(Number)
          .sort((a, b) => a - b)
      : [],
  }));
}
async function expectEqualToDirect() {
  const id = f.event.id;
  await listsMatch(id);
  expect((await loadResultsInput(id, { db: db() })).sessions).toEqual(await directSessionTaxa(id));
  expect(await keptSessionZones(id, true)).toEqual(await directSessionZones(id, true));
  expect(await keptSessionZones(id, false)).toEqual(await directSessionZones(id, false));
  expect(await pendingCounts(id)).toEqual(await directPending(id));
  await rowsMatch(id);
}

beforeAll(async () => {
  f = await makeFixture("session-aggregates");
  [zoneB] = (await db()
    .insert(s.zones)
    .values({
      eventId: f.event.id,
      name: "Zone B",
      habitat: "wetland",
      geom: polygonSql([
        [0.5, 0],
        [1, 0],
        [1, 0.5],
        [0.5, 0.5],
        [0.5, 0],
      ]),
    })
    .returning()) as [typeof s.zones.$inferSelect];
  [second] = (await db()
    .insert(s.taxa)
    .values({ scientificName: "Testus session-aggregates other", taxonGroup: "birds" })
    .returning()) as [typeof s.taxa.$inferSelect];
  const [c] = await db().insert(s.users).values({ email: "session-aggregates-coord@example.org" }).returning();
  coordinator = c!.id;
  await db()
    .insert(s.eventMembers)
    .values([
      { eventId: f.event.id, userId: f.user.id, role: "volunteer" },
      { eventId: f.event.id, userId: coordinator, role: "coordinator" },
    ]);
  scope = { eventId: f.event.id, taxonGroups: [], locale: "en" };
});

describe("session zone and pending aggregates (migration 0023 triggers)", () => {
  it("equal the direct computation after sync, review decisions, corrections, deletions and a zones re-upload", async () => {
    const mostlyA = session(); // 3 in A, 2 in B: zone A
    const tie = session({ zoneId: zoneB.id }); // 2 in A, 2 in B: the zone it was started in
    const open = session({ allSpeciesNoted: false, endedAt: null }); // not complete
    const empty = session({ zoneId: zoneB.id }); // no sightings: the zone it was started in
    // Two taxa, so each session's list holds one or two codes.
    const inMostlyA = [A, A, A, B, B].map((p, i) =>
      sighting(p, { sessionId: mostlyA.id, ...(i % 2 ? { taxonId: second.id } : {}) }),
    );
    const inTie = [A, A, B, B].map((p, i) =>
      sighting(p, { sessionId: tie.id, ...(i === 1 ? { taxonId: second.id } : {}) }),
    );
    const inOpen = [A, OUT, OUT].map((p) => sighting(p, { sessionId: open.id }));
    const casual = [A, B, OUT].map((p) => sighting(p));
    const outcomes = await ingest([mostlyA, tie, open, empty], [...inMostlyA, ...inTie, ...inOpen, ...casual]);
    expect(outcomes.every((o) => o.outcome === "created")).toBe(true);
    await expectEqualToDirect();
    const zones = new Map((await keptSessionZones(f.event.id, true)).map((r) => [r.id, r.zone_id]));
    expect([zones.get(mostlyA.id), zones.get(tie.id), zones.get(empty.id)]).toEqual([f.zone.id, zoneB.id, zoneB.id]);
    expect(await pendingCounts(f.event.id)).toEqual({
      pending: 15,
      returned: 0,
      pendingInCompleteSessions: 9,
      returnedInCompleteSessions: 0,
    });

    // Review decisions: approvals, a return, a rejection.
    const decisions: [SightingRecord, (version: number) => Decision][] = [
      [inMostlyA[0]!, (version) => ({ action: "approve", version })],
      [inMostlyA[3]!, (version) => ({ action: "return", version, message: "Which zone were you in?" })],
      [inTie[0]!, (version) => ({ action: "reject", version, reason: "misidentified" })],
      [casual[0]!, (version) => ({ action: "return", version, message: "How many?" })],
      [inOpen[1]!, (version) => ({ action: "approve", version })],
      [inMostlyA[1]!, (version) => ({ action: "approve", version })],
      [inMostlyA[2]!, (version) => ({ action: "approve", version })],
      [inTie[1]!, (version) => ({ action: "approve", version })],
    ];
    for (const [rec, decision] of decisions)
      expect((await decide(scope, coordinator, rec.id, decision(await version(rec.id)))).outcome).toBe("ok");
    await expectEqualToDirect();

    // Corrections: a returned sighting moved to zone A (back to pending), one moved into another session.
    const moved = { ...inMostlyA[3]!, ...A, correction: { toVersion: await version(inMostlyA[3]!.id) } };
    const other = { ...inTie[2]!, sessionId: open.id, correction: { toVersion: await version(inTie[2]!.id) } };
    expect((await ingest([], [moved, other])).map((o) => o.outcome)).toEqual(["updated", "updated"]);
    await expectEqualToDirect();
    // An approved sighting's taxon corrected: its session's list changes with it.
    const retaxon = {
      ...inMostlyA[2]!,
      taxonId: second.id,
      correction: { toVersion: await version(inMostlyA[2]!.id) },
    };
    expect((await ingest([], [retaxon]))[0]!.outcome).toBe("updated");
    await expectEqualToDirect();
    // The open session ends, all species noted: its pending sightings now count as in a complete session.
    expect((await ingest([{ ...open, endedAt: "2026-06-20T08:40:00Z", allSpeciesNoted: true }], []))[0]!.outcome).toBe(
      "updated",
    );
    await expectEqualToDirect();

    // A rejected sighting written straight in, then deleted: the tie session holds A, A, B (one A
    // rejected), so one more in B makes a tie (back to B, where it started) and its deletion
    // undoes it; the results' key sees both, though no pending figure changes.
    const zoneOfTie = async () => (await keptSessionZones(f.event.id, true)).find((r) => r.id === tie.id)!.zone_id;
    expect(await zoneOfTie()).toBe(f.zone.id);
    const key = await resultsKey(f.event.id);
    const rejected = sightingValues(f, {
      sessionId: tie.id,
      zoneId: zoneB.id,
      location: { longitude: B.longitude, latitude: B.latitude },
      reviewState: "rejected",
    });
    await db().insert(s.sightings).values(rejected);
    await expectEqualToDirect();
    expect(await zoneOfTie()).toBe(zoneB.id);
    const keyWithIt = await resultsKey(f.event.id);
    expect(keyWithIt).not.toBe(key);
    await db().delete(s.sightings).where(eq(s.sightings.id, rejected.id));
    await expectEqualToDirect();
    expect(await zoneOfTie()).toBe(f.zone.id);
    expect(await resultsKey(f.event.id)).not.toBe(keyWithIt);

    // An approved sighting written straight into the empty session, then deleted: the session's
    // list appears with it and goes with it.
    const approved = sightingValues(f, { sessionId: empty.id, taxonId: second.id, reviewState: "approved" });
    await db().insert(s.sightings).values(approved);
    await expectEqualToDirect();
    const listOf = async (id: string) =>
      (await db().execute(sql`SELECT taxa FROM result_session_lists WHERE session_id = ${id}`)).rows.length;
    expect(await listOf(empty.id)).toBe(1);
    await db().delete(s.sightings).where(eq(s.sightings.id, approved.id));
    await expectEqualToDirect();
    expect(await listOf(empty.id)).toBe(0);

    // Deletions: a sighting, then a whole session (its sightings lose their session).
    await db().delete(s.sightings).where(eq(s.sightings.id, inTie[3]!.id));
    await expectEqualToDirect();
    await db().delete(s.countSessions).where(eq(s.countSessions.id, tie.id));
    await expectEqualToDirect();

    // Zones uploaded again: zone A shrinks to its western half and zone B takes the rest of the
    // south, so sightings at (0.2, 0.2) stay in A and the sessions' zones are voted again.
    const square = (x0: number, y0: number, x1: number, y1: number): Geometry => ({
      type: "Polygon",
      coordinates: [
        [
          [x0, y0],
          [x1, y0],
          [x1, y1],
          [x0, y1],
          [x0, y0],
        ],
      ],
    });
    const upload = await uploadAreaAndZones(
      f.event.id,
      { feature: 0, geometry: square(0, 0, 1, 1) },
      [
        { feature: 1, name: "Zone A", habitat: "edge", description: "", geometry: square(0, 0, 0.25, 0.5) },
        { feature: 2, name: "Zone B", habitat: "wetland", description: "", geometry: square(0.25, 0, 1, 0.5) },
        { feature: 3, name: "Zone C", habitat: "woodland", description: "", geometry: square(0.5, 0.5, 1, 1) },
      ],
      true,
    );
    expect(upload.problems).toEqual([]);
    expect(upload.moved!.sightings).toBeGreaterThan(0); // the ones outside every zone are now in C
    await expectEqualToDirect();
    expect(await pendingCounts(f.event.id)).toMatchObject({ returned: 1 });
  });
});
