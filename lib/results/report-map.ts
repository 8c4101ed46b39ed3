import { GRID_DEGREES, type Located } from "./exports";
import type { PolygonGeometry } from "@/lib/geo/areal";

// What the public report's map shows, from the same published rows as its downloads
// (publicOccurrences in exports.ts): restricted records are already left out; a generalised
// record is shown only as the grid cell it was moved to the centre of, never as a point.

export type ReportMapLayers = {
  points: { id: string; label: string; longitude: number; latitude: number }[];
  cells: { id: string; names: string[]; geometry: PolygonGeometry }[];
};

const round = (v: number) => Math.round(v * 1e6) / 1e6;

export function reportMapLayers(rows: readonly Located[]): ReportMapLayers {
  const points: ReportMapLayers["points"] = [];
  const cells = new Map<string, { names: Set<string>; lon: number; lat: number }>();
  for (const r of rows) {
    const label = r.vernacularName || r.scientificName;
    if (!r.generalised) {
      points.push({ id: r.id, label, longitude: r.lon, latitude: r.lat });
      continue;
    }
    const key = `${r.lon},${r.lat}`;
    const cell = cells.get(key) ?? { names: new Set<string>(), lon: r.lon, lat: r.lat };
    cell.names.add(label);
    cells.set(key, cell);
  }
  const half = GRID_DEGREES / 2;
  return {
    points,
    cells: [...cells.entries()].map(([key, c]) => {
      const [w, s, e, n] = [round(c.lon - half), round(c.lat - half), round(c.lon + half), round(c.lat + half)];
      return {
        id: key,
        names: [...c.names].sort(),
        geometry: {
          type: "Polygon",
          coordinates: [
            [
              [w, s],
              [e, s],
              [e, n],
              [w, n],
              [w, s],
            ],
          ],
        },
      };
    }),
  };
}
