import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { parseAreaAndZones } from "./geojson";

const sq = (w: number, s: number, e: number, n: number) => [
  [
    [w, s],
    [e, s],
    [e, n],
    [w, n],
    [w, s],
  ],
];
const area = {
  type: "Feature",
  properties: { kind: "area" },
  geometry: { type: "Polygon", coordinates: sq(0, 0, 1, 1) },
};
const zone = (name: unknown, habitat: unknown, coordinates: unknown = sq(0.1, 0.1, 0.2, 0.2), type = "Polygon") => ({
  type: "Feature",
  properties: { name, habitat },
  geometry: { type, coordinates },
});
const fc = (...features: unknown[]) => ({ type: "FeatureCollection", features });

describe("area and zones GeoJSON (RFC 7946 shape)", () => {
  it("reads the example file: the area and three zones, one of them a MultiPolygon", () => {
    const parsed = parseAreaAndZones(JSON.parse(readFileSync("tests/fixtures/setup/zones.geojson", "utf8")));
    expect(parsed.problems).toEqual([]);
    expect(parsed.area?.feature).toBe(0);
    expect(parsed.zones.map((z) => [z.name, z.habitat, z.geometry.type])).toEqual([
      ["Gorse Bank", "edge", "Polygon"],
      ["Oak Copse", "woodland", "MultiPolygon"],
      ["Dew Pond", "wetland", "Polygon"],
    ]);
  });

  it("names each feature's problem: missing name, unknown habitat, duplicate name", () => {
    const { problems } = parseAreaAndZones(
      fc(area, zone("", "edge"), zone("Fen", "swamp"), zone("Fen", "wetland"), zone("fen", "wetland")),
    );
    expect(problems.map((p) => [p.feature, p.code])).toEqual([
      [1, "missingName"],
      [2, "unknownHabitat"],
      [3, "duplicateName"],
      [4, "duplicateName"],
    ]);
  });

  it("refuses positions outside WGS 84 ranges, unclosed and short rings, and other geometry types", () => {
    const { problems } = parseAreaAndZones(
      fc(
        area,
        zone("Metres", "edge", [
          [
            [450000, 200000],
            [450100, 200000],
            [450100, 200100],
            [450000, 200000],
          ],
        ]),
        zone("Open", "edge", [
          [
            [0.1, 0.1],
            [0.2, 0.1],
            [0.2, 0.2],
            [0.1, 0.2],
          ],
        ]),
        zone("Short", "edge", [
          [
            [0.1, 0.1],
            [0.2, 0.1],
            [0.1, 0.1],
          ],
        ]),
        {
          type: "Feature",
          properties: { name: "Line", habitat: "edge" },
          geometry: {
            type: "LineString",
            coordinates: [
              [0, 0],
              [1, 1],
            ],
          },
        },
        zone("Lat", "edge", [
          [
            [0.1, 95],
            [0.2, 0.1],
            [0.2, 0.2],
            [0.1, 95],
          ],
        ]),
      ),
    );
    expect(problems.map((p) => [p.feature, p.code])).toEqual([
      [1, "longitudeRange"],
      [2, "ringNotClosed"],
      [3, "ringTooShort"],
      [4, "wrongGeometryType"],
      [5, "latitudeRange"],
    ]);
  });

  it("needs exactly one area and at least one zone, and refuses other coordinate systems", () => {
    expect(parseAreaAndZones(fc(zone("A", "edge"))).problems.map((p) => p.code)).toEqual(["noArea"]);
    expect(parseAreaAndZones(fc(area, area, zone("A", "edge"))).problems.map((p) => p.code)).toEqual(["twoAreas"]);
    expect(parseAreaAndZones(fc(area)).problems.map((p) => p.code)).toEqual(["noZones"]);
    const projected = {
      ...fc(area, zone("A", "edge")),
      crs: { type: "name", properties: { name: "urn:ogc:def:crs:EPSG::27700" } },
    };
    expect(parseAreaAndZones(projected).problems.map((p) => p.code)).toEqual(["crsNotWgs84"]);
    const wgs84 = {
      ...fc(area, zone("A", "edge")),
      crs: { type: "name", properties: { name: "urn:ogc:def:crs:OGC:1.3:CRS84" } },
    };
    expect(parseAreaAndZones(wgs84).problems).toEqual([]);
  });

  it("says plainly when the file is not a FeatureCollection at all", () => {
    for (const bad of [null, 42, "x", [], { type: "Feature" }, { type: "FeatureCollection" }]) {
      expect(parseAreaAndZones(bad).problems.map((p) => p.code)).toEqual(["notFeatureCollection"]);
    }
  });
});
