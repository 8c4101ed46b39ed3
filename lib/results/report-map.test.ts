import { describe, expect, it } from "vitest";
import { generalise, type Located } from "./exports";
import { reportMapLayers } from "./report-map";

const row = (id: string, lon: number, lat: number, generalised: boolean, name: string): Located => {
  const g = generalised ? generalise(lon, lat, 10) : null;
  return {
    id,
    eventDate: "2026-06-20T10:00:00.000Z",
    recordedBy: "recorder-0000abcd",
    scientificName: `${name} sp.`,
    taxonRank: "species",
    vernacularName: name,
    individualCount: 1,
    lon: g ? g.lon : lon,
    lat: g ? g.lat : lat,
    uncertaintyM: g ? g.uncertaintyM : 10,
    generalised,
  };
};

describe("the public report's map layers", () => {
  it("shows ordinary records as points and sensitive ones only as the cell they were generalised to", () => {
    const layers = reportMapLayers([
      row("a", -1.8132, 52.1051, false, "Meadow pipit"),
      row("b", -1.8121, 52.1049, true, "Orchid"),
      row("c", -1.8034, 52.1071, true, "Bat"),
    ]);
    expect(layers.points).toEqual([{ id: "a", label: "Meadow pipit", longitude: -1.8132, latitude: 52.1051 }]);
    // Both sensitive records fall in the 0.1° cell [-1.9, 52.1]–[-1.8, 52.2]: one cell, both names.
    expect(layers.cells).toHaveLength(1);
    expect(layers.cells[0]!.names).toEqual(["Bat", "Orchid"]);
    const ring = layers.cells[0]!.geometry.coordinates[0]!;
    expect(ring[0]).toEqual([-1.9, 52.1]);
    expect(ring[2]).toEqual([-1.8, 52.2]);
    // The exact places are nowhere in the layers.
    expect(JSON.stringify(layers)).not.toContain("-1.8121");
    expect(JSON.stringify(layers)).not.toContain("52.1071");
  });
});
