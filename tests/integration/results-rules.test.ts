// Records → units → numbers over the real aggregation (issue 14): taxon ranks, empty
// complete sessions, a zone with one individual, pending records, count units, and zones
// re-assigned when they are uploaded again.
import { eq, sql } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { getReport } from "@/db/queries/reports";
import { PendingRecordsError, publishReport } from "@/server/results/publish";
import { loadInputRecords, loadResultsInput, pendingCounts, setEventCountUnit, taxaMeta } from "@/db/queries/results";
import { uploadAreaAndZones } from "@/db/queries/setup-zones";
import * as s from "@/db/schema";
import { canonicalJson, computeResults } from "@/lib/results/compute";
import { inputFromRecords } from "@/lib/results/records";
import { db, lonLat, makeFixture, sightingValues } from "./helpers";

type Fixture = Awaited<ReturnType<typeof makeFixture>>;

async function completeSession(f: Fixture, zoneId: string | null) {
  const [row] = await db()
    .insert(s.countSessions)
    .values({
      id: crypto.randomUUID(),
      eventId: f.event.id,
      userId: f.user.id,
      zoneId,
      kind: "timed_count",
      startedAt: new Date("2026-06-20T09:00:00Z"),
      endedAt: new Date("2026-06-20T09:20:00Z"),
      allSpeciesNoted: true,
    })
    .returning();
  return row!;
}

/** Both paths (aggregates, and a report's input records) must give the same numbers. */
async function bothPaths(eventId: string) {
  const input = await loadResultsInput(eventId);
  const fromAggregates = computeResults(input);
  const records = await loadInputRecords(eventId);
  const meta = await taxaMeta([...new Set(records.map((r) => r[2]))], db(), eventId);
  const fromRecords = computeResults({ ...inputFromRecords(records, input.zones, meta), pending: input.pending });
  expect(canonicalJson(fromRecords)).toBe(canonicalJson(fromAggregates));
  return fromAggregates;
}

describe("results rules over the real aggregation", () => {
  it("a genus record is left out where a species of it is recorded, its individuals kept in the totals; a subspecies folds in", async () => {
    const f = await makeFixture("rules-ranks");
    const [genus, species, subspecies] = await db()
      .insert(s.taxa)
      .values([
        { scientificName: "Rulesia", rank: "genus", taxonGroup: "birds" },
        { scientificName: "Rulesia alba", rank: "species", taxonGroup: "birds" },
        { scientificName: "Rulesia alba minor", rank: "subspecies", taxonGroup: "birds" },
      ])
      .returning();
    await db()
      .insert(s.sightings)
      .values([
        sightingValues(f, { taxonId: genus!.id, count: 4, reviewState: "approved" }),
        sightingValues(f, { taxonId: species!.id, count: 2, reviewState: "approved" }),
        sightingValues(f, { taxonId: subspecies!.id, count: 1, reviewState: "approved" }),
        sightingValues(f, { taxonId: null, description: "unknown warbler", count: 3, reviewState: "approved" }),
      ]);
    const r = await bothPaths(f.event.id);
    expect(r.event.observed).toBe(1); // Rulesia alba (with minor); the genus left out; unidentified never
    expect(r.event.individuals).toBe(7);
    expect(r.event.leftOut).toEqual({ taxa: 1, individuals: 4 });
    expect(r.event.folded).toBe(1);
    expect(r.species.find((x) => x.id === genus!.id)!.rankStatus).toBe("leftOut");
    expect(r.species.find((x) => x.id === subspecies!.id)!.rankStatus).toBe("folded");
  });

  it("complete sessions count as units when empty or all rejected; a zone with one individual is too few records", async () => {
    const f = await makeFixture("rules-empty");
    const kept = await completeSession(f, f.zone.id);
    const empty = await completeSession(f, f.zone.id);
    const rejected = await completeSession(f, f.zone.id);
    await db()
      .insert(s.sightings)
      .values([
        sightingValues(f, { sessionId: kept.id, count: 1, reviewState: "approved" }),
        sightingValues(f, { sessionId: rejected.id, count: 5, reviewState: "rejected" }),
      ]);
    const r = await bothPaths(f.event.id);
    expect(empty.id).toBeTruthy();
    expect(r.totals.completeSessions).toBe(3);
    expect(r.event.completeSessions).toBe(3);
    expect(r.event.incidence).not.toBeNull(); // T = 3 reaches the threshold
    expect(r.event.incidence!.units).toBe(3);
    expect(r.event.observed).toBe(1);
    const zone = r.zones.find((z) => z.id === f.zone.id)!;
    expect(zone.individuals).toBe(1);
    expect(zone.reasons).toContain("individuals");
    expect(zone.abundance).toBeNull(); // no "100% coverage" from one individual
  });

  it("states pending and returned sightings (also in complete sessions); publishing needs confirmPending and the report states them", async () => {
    const f = await makeFixture("rules-pending");
    const session = await completeSession(f, f.zone.id);
    await db()
      .insert(s.sightings)
      .values([
        sightingValues(f, { count: 2, reviewState: "approved" }),
        sightingValues(f, { sessionId: session.id, reviewState: "pending" }),
        sightingValues(f, { reviewState: "pending" }),
        sightingValues(f, { sessionId: session.id, reviewState: "returned" }),
      ]);
    const expected = { pending: 2, returned: 1, pendingInCompleteSessions: 1, returnedInCompleteSessions: 1 };
    expect(await pendingCounts(f.event.id)).toEqual(expected);
    expect(computeResults(await loadResultsInput(f.event.id)).pending).toEqual(expected);
    const refused = await publishReport(f.event.id, f.user.id).catch((e: unknown) => e);
    expect(refused).toBeInstanceOf(PendingRecordsError);
    expect((refused as PendingRecordsError).pending).toEqual(expected);
    const { version } = await publishReport(f.event.id, f.user.id, { confirmPending: true });
    const report = await getReport(f.event.id, version);
    expect(report!.results.pending).toEqual(expected);
  });

  it("an event's count unit for a group reaches the results: counts of stems give session-based estimates only", async () => {
    const f = await makeFixture("rules-units");
    await setEventCountUnit(f.event.id, "birds", "stems");
    await db()
      .insert(s.sightings)
      .values(Array.from({ length: 5 }, () => sightingValues(f, { count: 10, reviewState: "approved" })));
    const r = await bothPaths(f.event.id);
    expect(r.species[0]!.countUnit).toBe("stems");
    expect(r.event.countUnits).toEqual(["stems"]);
    expect(r.event.reasons).toContain("countUnits");
    expect(r.event.abundance).toBeNull();
  });

  it("uploading zones again re-assigns existing sightings by their own point and sessions by the majority of their sightings, and says how many moved", async () => {
    const f = await makeFixture("rules-rezone");
    const session = await completeSession(f, f.zone.id);
    // Zone A is [0, 0.5]²; three of the session's sightings lie at x = 0.7, outside it, one inside.
    const at = (lon: number) => lonLat(lon, 0.2);
    await db()
      .insert(s.sightings)
      .values([
        sightingValues(f, { sessionId: session.id, location: at(0.2), reviewState: "approved" }),
        sightingValues(f, { sessionId: session.id, location: at(0.7), zoneId: null, reviewState: "approved" }),
        sightingValues(f, { sessionId: session.id, location: at(0.7), zoneId: null, reviewState: "pending" }),
        sightingValues(f, { sessionId: session.id, location: at(0.75), zoneId: null, reviewState: "approved" }),
      ]);
    // Before: three sightings outside every zone, so the session counts outside every zone.
    const before = await bothPaths(f.event.id);
    expect(before.zones.find((z) => z.id === f.zone.id)!.completeSessions).toBe(0);

    const square = (x0: number, x1: number) => ({
      type: "Polygon" as const,
      coordinates: [
        [
          [x0, 0],
          [x1, 0],
          [x1, 1],
          [x0, 1],
          [x0, 0],
        ],
      ],
    });
    const result = await uploadAreaAndZones(
      f.event.id,
      { feature: 0, geometry: square(0, 1) },
      [
        { feature: 1, name: "Zone A", habitat: "edge", description: "", geometry: square(0, 0.5) },
        { feature: 2, name: "Zone B", habitat: "interior", description: "", geometry: square(0.5, 1) },
      ],
      true,
    );
    expect(result.problems).toEqual([]);
    expect(result.moved).toEqual({ sightings: 3, sessions: 1 });
    const [zoneB] = await db()
      .select()
      .from(s.zones)
      .where(sql`event_id = ${f.event.id} AND name = 'Zone B'`);
    const [stored] = await db().select().from(s.countSessions).where(eq(s.countSessions.id, session.id));
    expect(stored!.zoneId).toBe(zoneB!.id);
    const after = await bothPaths(f.event.id);
    expect(after.zones.find((z) => z.id === zoneB!.id)!.completeSessions).toBe(1);
    expect(after.zones.find((z) => z.id === zoneB!.id)!.individuals).toBe(2);
    // Nothing moves when the same zones come again.
    const again = await uploadAreaAndZones(
      f.event.id,
      { feature: 0, geometry: square(0, 1) },
      [
        { feature: 1, name: "Zone A", habitat: "edge", description: "", geometry: square(0, 0.5) },
        { feature: 2, name: "Zone B", habitat: "interior", description: "", geometry: square(0.5, 1) },
      ],
      true,
    );
    expect(again.moved).toEqual({ sightings: 0, sessions: 0 });
  });
});
