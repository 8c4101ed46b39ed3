import { describe, expect, it } from "vitest";
import { SECOND_ZONES } from "@/db/seed/demo-scenario";
import type { ZoneCollection } from "./types";
import { distanceM, walkDistanceM, zoneAt } from "./zones";

// The demo's Kestrel Moor zones: Heather Crest (north half) and Gorse Margin (south half).
const zones: ZoneCollection = {
  type: "FeatureCollection",
  features: SECOND_ZONES.map((z) => ({
    type: "Feature",
    id: z.key,
    properties: { name: z.name, habitat: z.habitat, description: "" },
    geometry: { type: "Polygon", coordinates: [z.ring as number[][]] },
  })),
};

describe("zone of a point, on the device", () => {
  it("finds the zone a point falls in, with GeoJSON's longitude-first order", () => {
    expect(zoneAt(zones, 53.3045, -2.095)?.properties.name).toBe("Heather Crest");
    expect(zoneAt(zones, 53.301, -2.095)?.properties.name).toBe("Gorse Margin");
  });

  it("finds no zone outside the area, and none without zones", () => {
    expect(zoneAt(zones, 53.31, -2.095)).toBeNull();
    expect(zoneAt(zones, -2.095, 53.3045)).toBeNull(); // latitude and longitude swapped
    expect(zoneAt(null, 53.3045, -2.095)).toBeNull();
  });
});

describe("walk distance", () => {
  it("measures a degree of latitude as about 111 km", () => {
    // 111.2 km per degree of latitude (a 6,371 km mean Earth radius × π/180): common practice for geodesy on a sphere.
    expect(distanceM({ latitude: 53, longitude: -2 }, { latitude: 54, longitude: -2 })).toBeGreaterThan(111_000);
    expect(distanceM({ latitude: 53, longitude: -2 }, { latitude: 54, longitude: -2 })).toBeLessThan(111_400);
  });

  it("adds real steps and ignores jitter and poor fixes", () => {
    // 111,195 m per degree of latitude on the 6,371 km sphere (common practice).
    const north = (m: number, accuracyM = 5) => ({ latitude: 53.3 + m / 111_195, longitude: -2.095, accuracyM });
    // 0 → 100 m → (jitter 2 m) → (a 500 m-accuracy fix far away) → 200 m
    const d = walkDistanceM([north(0), north(100), north(102), { ...north(900), accuracyM: 500 }, north(200)]);
    expect(d).toBeGreaterThan(195);
    expect(d).toBeLessThan(205);
  });
});
