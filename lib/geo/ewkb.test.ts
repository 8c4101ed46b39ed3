import { describe, expect, it } from "vitest";
import { pointFromWkbHex } from "./ewkb";

describe("a PostGIS point in hex WKB", () => {
  it("reads EWKB with an SRID, as PostGIS returns geometry(Point,4326)", () => {
    // SELECT ST_SetSRID(ST_MakePoint(-2.487, 51.403), 4326)::text, PostGIS 3.3.2.
    expect(pointFromWkbHex("0101000020E61000004C37894160E503C0DD24068195B34940")).toEqual({
      longitude: -2.487,
      latitude: 51.403,
    });
  });

  it("reads big-endian plain WKB too", () => {
    // 00 | 00000001 | 1.5 | -0.25, big-endian doubles.
    expect(pointFromWkbHex("0000000001" + "3FF8000000000000" + "BFD0000000000000")).toEqual({
      longitude: 1.5,
      latitude: -0.25,
    });
  });

  it("refuses what is not a point", () => {
    expect(() => pointFromWkbHex("0103000020E6100000")).toThrow(/not a point/);
    expect(() => pointFromWkbHex("zz")).toThrow();
  });
});
