import { readFileSync } from "node:fs";
import { eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { areaAndZones, uploadAreaAndZones } from "@/db/queries/setup-zones";
import * as s from "@/db/schema";
import { parseAreaAndZones } from "@/lib/geo/geojson";
import { checkAndSaveZones } from "@/server/setup/zones-upload";
import { db, makeFixture, sightingValues } from "./helpers";

const file = (name: string) => JSON.parse(readFileSync(`tests/fixtures/setup/${name}`, "utf8"));

/** An event with no area and no zones yet, as a newly created one is. */
async function emptyEvent(tag: string) {
  const f = await makeFixture(tag);
  await db().delete(s.zones).where(eq(s.zones.eventId, f.event.id));
  await db().update(s.events).set({ area: null }).where(eq(s.events.id, f.event.id));
  return f;
}

async function upload(eventId: string, json: unknown, save: boolean) {
  const parsed = parseAreaAndZones(json);
  expect(parsed.problems).toEqual([]);
  return uploadAreaAndZones(eventId, parsed.area!, parsed.zones, save);
}

describe("area and zones upload (PostGIS checks)", () => {
  it("saves the area and zones of a valid file, MultiPolygon included, in one go", async () => {
    const f = await emptyEvent("zones-ok");
    const checked = await upload(f.event.id, file("zones.geojson"), false);
    expect(checked).toMatchObject({ problems: [], saved: false, summary: { zones: 3, added: 3 } });
    expect((await areaAndZones(f.event.id)).zones).toEqual([]); // a check saves nothing

    const saved = await upload(f.event.id, file("zones.geojson"), true);
    expect(saved.saved).toBe(true);
    const stored = await areaAndZones(f.event.id);
    expect(stored.area?.type).toBe("Polygon");
    expect(stored.zones.map((z) => [z.name, z.habitat, z.geometry.type])).toEqual([
      ["Dew Pond", "wetland", "Polygon"],
      ["Gorse Bank", "edge", "Polygon"],
      ["Oak Copse", "woodland", "MultiPolygon"],
    ]);
    // Oak Copse is two squares of 0.005° × 0.004° and 0.005° × 0.003° at 51.4° N: about 24 ha together.
    expect(stored.zones.find((z) => z.name === "Oak Copse")!.areaHa).toBeGreaterThan(20);
    expect(stored.zones.find((z) => z.name === "Oak Copse")!.areaHa).toBeLessThan(28);
  });

  it("refuses zones outside the area and shapes that cross themselves, and keeps what was there", async () => {
    const f = await makeFixture("zones-outside");
    const before = await areaAndZones(f.event.id);
    const result = await upload(f.event.id, file("zones-bad.geojson"), true);
    expect(result.saved).toBe(false);
    // Every problem at once: the bow tie, and the zone that runs past the area's edge.
    expect(result.problems.map((p) => [p.feature, p.code])).toEqual([
      [3, "invalidGeometry"],
      [2, "outsideArea"],
    ]);
    expect(String(result.problems[0]!.values?.reason)).toMatch(/Self-intersection/);

    // With the bow tie fixed, the zone that runs past the area's edge is still named, alone.
    const json = file("zones-bad.geojson");
    json.features[3].geometry.coordinates = [
      [
        [-2.499, 51.405],
        [-2.492, 51.405],
        [-2.492, 51.409],
        [-2.499, 51.409],
        [-2.499, 51.405],
      ],
    ];
    const again = await upload(f.event.id, json, true);
    expect(again.saved).toBe(false);
    expect(again.problems.map((p) => [p.feature, p.name, p.code])).toEqual([[2, "Oak Copse", "outsideArea"]]);
    // 0.010° of longitude × 0.004° of latitude at 51.4° N: about 695 m × 445 m ≈ 31 ha outside.
    expect(Number(again.problems[0]!.values?.squareMetres)).toBeGreaterThan(280_000);
    expect(Number(again.problems[0]!.values?.squareMetres)).toBeLessThan(340_000);
    expect(await areaAndZones(f.event.id)).toEqual(before);
  });

  it("refuses zones that overlap one another", async () => {
    const f = await emptyEvent("zones-overlap");
    const json = file("zones.geojson");
    json.features[3].geometry.coordinates = [
      [
        [-2.495, 51.402],
        [-2.492, 51.402],
        [-2.492, 51.409],
        [-2.495, 51.409],
        [-2.495, 51.402],
      ],
    ];
    const result = await upload(f.event.id, json, true);
    expect(result.problems.map((p) => [p.feature, p.code, p.values?.other])).toEqual([
      [3, "overlapsZone", "Gorse Bank"],
    ]);
    expect((await areaAndZones(f.event.id)).zones).toEqual([]);
  });

  it("updates zones by name on re-upload, drops zones left out, but never one that holds records", async () => {
    const f = await emptyEvent("zones-merge");
    await upload(f.event.id, file("zones.geojson"), true);
    const pond = (await areaAndZones(f.event.id)).zones.find((z) => z.name === "Dew Pond")!;
    const json = file("zones.geojson");
    json.features[1].properties.habitat = "grassland";
    json.features.splice(3, 1); // Dew Pond left out
    const merged = await upload(f.event.id, json, true);
    expect(merged).toMatchObject({ saved: true, summary: { zones: 2, added: 0, updated: 2, removed: 1 } });
    const after = (await areaAndZones(f.event.id)).zones;
    expect(after.map((z) => [z.name, z.habitat])).toEqual([
      ["Gorse Bank", "grassland"],
      ["Oak Copse", "woodland"],
    ]);
    expect(after.some((z) => z.id === pond.id)).toBe(false);

    // A zone with a sighting in it cannot vanish.
    const copse = after.find((z) => z.name === "Oak Copse")!;
    await db()
      .insert(s.sightings)
      .values(sightingValues(f, { zoneId: copse.id, location: { longitude: -2.487, latitude: 51.403 } }));
    json.features.splice(2, 1); // Oak Copse left out
    const refused = await upload(f.event.id, json, true);
    expect(refused.problems.map((p) => [p.name, p.code, p.values?.records])).toEqual([
      ["Oak Copse", "zoneHasRecords", 1],
    ]);
    expect((await areaAndZones(f.event.id)).zones.map((z) => z.name)).toEqual(["Gorse Bank", "Oak Copse"]);
  });

  it("names shape problems and PostGIS problems of one file in one answer, and saves nothing", async () => {
    const f = await emptyEvent("zones-all-at-once");
    const json = file("zones-bad.geojson");
    // Feature 3 keeps its bow tie (PostGIS), feature 2 still runs outside the area (PostGIS),
    // and feature 1 loses its habitat (a shape check).
    delete json.features[1].properties.habitat;
    const result = await checkAndSaveZones(f.event.id, json, true);
    expect(result.saved).toBe(false);
    expect(result.problems.map((p) => [p.feature, p.code])).toEqual([
      [1, "missingHabitat"],
      [2, "outsideArea"],
      [3, "invalidGeometry"],
    ]);
    expect((await areaAndZones(f.event.id)).zones).toEqual([]);
  });
});
