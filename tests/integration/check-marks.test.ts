import { eq, inArray } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { GROUP_THRESHOLDS, HIGH_COUNT_FLOOR, refreshCheckMarks } from "@/db/queries/check-marks";
import * as s from "@/db/schema";
import { db, makeFixture, lonLat, sightingValues } from "./helpers";

// Each automatic check mark is raised by a sighting crafted for it, and a clean sighting
// (inside the area and dates, on the list, open taxon, good accuracy, alone) carries none.
let f: Awaited<ReturnType<typeof makeFixture>>;
let sensitiveTaxon: string;
let offListTaxon: string;

async function marksOf(id: string) {
  const [row] = await db().select({ marks: s.sightings.checkMarks }).from(s.sightings).where(eq(s.sightings.id, id));
  return row!.marks;
}

async function store(over: Partial<typeof s.sightings.$inferInsert> = {}) {
  const row = sightingValues(f, over);
  await db().insert(s.sightings).values(row);
  await refreshCheckMarks(db(), [row.id]);
  return row.id;
}

beforeAll(async () => {
  f = await makeFixture("marks");
  await db().insert(s.eventSpecies).values({ eventId: f.event.id, taxonId: f.taxon.id });
  const [sens] = await db()
    .insert(s.taxa)
    .values({ scientificName: "Testus sensitivus", taxonGroup: "birds", sensitivity: "generalised" })
    .returning();
  const [off] = await db()
    .insert(s.taxa)
    .values({ scientificName: "Testus absentus", taxonGroup: "birds" })
    .returning();
  sensitiveTaxon = sens!.id;
  offListTaxon = off!.id;
  await db().insert(s.eventSpecies).values({ eventId: f.event.id, taxonId: sensitiveTaxon });
  await db().update(s.events).set({ accuracyLimitM: 50 }).where(eq(s.events.id, f.event.id));
});

describe("automatic check marks", () => {
  it("keeps every per-group threshold above the floor, so small counts need no statistics", () => {
    for (const n of Object.values(GROUP_THRESHOLDS)) expect(n).toBeGreaterThan(HIGH_COUNT_FLOOR);
  });

  it("leaves a clean sighting unmarked", async () => {
    expect(await marksOf(await store({ observedAt: new Date("2026-06-20T06:00:00Z") }))).toEqual([]);
  });

  it("marks a point outside the event area, and not one inside", async () => {
    expect(
      await marksOf(
        await store({ location: lonLat(1.5, 0.5), zoneId: null, observedAt: new Date("2026-06-21T06:00:00Z") }),
      ),
    ).toEqual(["outside_area"]);
    expect(
      await marksOf(await store({ location: lonLat(0.9, 0.9), observedAt: new Date("2026-06-21T06:30:00Z") })),
    ).toEqual([]);
  });

  it("marks a time outside the event dates", async () => {
    expect(await marksOf(await store({ observedAt: new Date("2026-06-22T05:00:01Z") }))).toEqual(["outside_dates"]);
    expect(
      await marksOf(await store({ observedAt: new Date("2026-06-22T04:59:59Z"), location: lonLat(0.6, 0.6) })),
    ).toEqual([]);
  });

  it("marks an unusually high count: a per-group threshold with few records, the far-out fence with many", async () => {
    const [few] = await db()
      .insert(s.taxa)
      .values({ scientificName: "Testus paucus", taxonGroup: "mammals" })
      .returning();
    await db().insert(s.eventSpecies).values({ eventId: f.event.id, taxonId: few!.id });
    const t = new Date("2026-06-20T12:00:00Z").getTime();
    const at = (i: number) => ({ observedAt: new Date(t + i * 3_600_000), location: lonLat(0.1 + i * 0.01, 0.3) });
    expect(await marksOf(await store({ taxonId: few!.id, count: GROUP_THRESHOLDS.mammals, ...at(0) }))).toEqual([]);
    expect(await marksOf(await store({ taxonId: few!.id, count: GROUP_THRESHOLDS.mammals + 1, ...at(1) }))).toEqual([
      "high_count",
    ]);

    const [many] = await db()
      .insert(s.taxa)
      .values({ scientificName: "Testus frequens", taxonGroup: "birds" })
      .returning();
    await db().insert(s.eventSpecies).values({ eventId: f.event.id, taxonId: many!.id });
    // Twelve ordinary records of 2 to 6 birds.
    const usual = [2, 3, 4, 5, 6, 2, 3, 4, 5, 6, 3, 4];
    for (const [i, count] of usual.entries()) await store({ taxonId: many!.id, count, ...at(i) });
    // 40 is still under the birds' fixed threshold (50: the project's own tunable choice, GROUP_THRESHOLDS) but far above this taxon's usual counts.
    expect(await marksOf(await store({ taxonId: many!.id, count: 40, ...at(20) }))).toEqual(["high_count"]);
    expect(await marksOf(await store({ taxonId: many!.id, count: 7, ...at(21) }))).toEqual([]);
  });

  it("marks a taxon that is not on the species list, and asks for its photo", async () => {
    const id = await store({ taxonId: offListTaxon, observedAt: new Date("2026-06-20T13:00:00Z") });
    expect(await marksOf(id)).toEqual(["not_on_list", "photo_missing"]);
    // Once the photo is stored, only the list mark stays.
    await db()
      .insert(s.photos)
      .values({
        id: crypto.randomUUID(),
        sightingId: id,
        eventId: f.event.id,
        storageKey: `test/${id}.jpg`,
        contentType: "image/jpeg",
        sizeBytes: 1000,
        sha256: "a".repeat(64),
      });
    await refreshCheckMarks(db(), [id]);
    expect(await marksOf(id)).toEqual(["not_on_list"]);
  });

  it("marks a sensitive taxon, and the missing photo only where the event requires one", async () => {
    expect(
      await marksOf(await store({ taxonId: sensitiveTaxon, observedAt: new Date("2026-06-20T14:00:00Z") })),
    ).toEqual(["sensitive_taxon", "photo_missing"]);
    await db().update(s.events).set({ photoRequiredSensitive: false }).where(eq(s.events.id, f.event.id));
    expect(
      await marksOf(
        await store({
          taxonId: sensitiveTaxon,
          observedAt: new Date("2026-06-20T15:00:00Z"),
          location: lonLat(0.4, 0.4),
        }),
      ),
    ).toEqual(["sensitive_taxon"]);
    await db().update(s.events).set({ photoRequiredSensitive: true }).where(eq(s.events.id, f.event.id));
  });

  it("marks an unidentified record without a photo as missing its photo", async () => {
    expect(
      await marksOf(
        await store({ taxonId: null, description: "small brown moth", observedAt: new Date("2026-06-20T16:00:00Z") }),
      ),
    ).toEqual(["photo_missing"]);
  });

  it("marks both records of a possible duplicate, and not records farther apart in time or space", async () => {
    const t = new Date("2026-06-21T10:00:00Z").getTime();
    const first = await store({ observedAt: new Date(t), location: lonLat(0.3, 0.3) });
    expect(await marksOf(first)).toEqual([]);
    const second = await store({ observedAt: new Date(t + 8 * 60_000), location: lonLat(0.3002, 0.3) }); // ~22 m east, 8 min later
    expect(await marksOf(second)).toEqual(["possible_duplicate"]);
    expect(await marksOf(first)).toEqual(["possible_duplicate"]);
    expect(await marksOf(await store({ observedAt: new Date(t + 25 * 60_000), location: lonLat(0.3, 0.3) }))).toEqual(
      [],
    );
    expect(await marksOf(await store({ observedAt: new Date(t + 2 * 60_000), location: lonLat(0.31, 0.3) }))).toEqual(
      [],
    ); // ~1.1 km away
  });

  it("marks location accuracy worse than the event's limit", async () => {
    expect(await marksOf(await store({ accuracyM: 51, observedAt: new Date("2026-06-21T17:00:00Z") }))).toEqual([
      "poor_accuracy",
    ]);
    expect(await marksOf(await store({ accuracyM: 50, observedAt: new Date("2026-06-21T18:00:00Z") }))).toEqual([]);
  });

  it("refreshes many records in one call and ignores unknown ids", async () => {
    const a = sightingValues(f, { accuracyM: 500, observedAt: new Date("2026-06-21T19:00:00Z") });
    const b = sightingValues(f, { observedAt: new Date("2026-06-19T19:00:00Z") });
    await db().insert(s.sightings).values([a, b]);
    await refreshCheckMarks(db(), [a.id, b.id, crypto.randomUUID()]);
    const rows = await db()
      .select({ id: s.sightings.id, marks: s.sightings.checkMarks })
      .from(s.sightings)
      .where(inArray(s.sightings.id, [a.id, b.id]));
    expect(Object.fromEntries(rows.map((r) => [r.id, r.marks]))).toEqual({
      [a.id]: ["poor_accuracy"],
      [b.id]: ["outside_dates"],
    });
    await refreshCheckMarks(db(), []);
  });
});
