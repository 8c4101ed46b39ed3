import { describe, expect, it } from "vitest";
import { arealPath, fitProjection, labelPoint, type ArealGeometry } from "./areal";

const square = (w: number, s: number, e: number, n: number) => [
  [w, s],
  [e, s],
  [e, n],
  [w, n],
  [w, s],
];

// A zone in two parts (split by a river): a large square with a pond cut out of it, and a
// small square to its east. Near the equator, so the cosine scaling is about 1.
const split: ArealGeometry = {
  type: "MultiPolygon",
  coordinates: [[square(0, 0, 0.004, 0.004), square(0.001, 0.001, 0.002, 0.002)], [square(0.005, 0, 0.006, 0.001)]],
};

/** The subpaths of an SVG path as lists of [x, y]. */
const subpaths = (d: string) =>
  d
    .split("Z")
    .filter(Boolean)
    .map((sp) =>
      sp
        .split(/[ML]/)
        .filter(Boolean)
        .map((xy) => xy.split(",").map(Number)),
    );

describe("the zone map's path", () => {
  const p = fitProjection([split], [], { width: 600, height: 400, pad: 0 })!;

  it("draws every part and every hole of a MultiPolygon, each as its own closed ring", () => {
    const rings = subpaths(arealPath(split, p));
    expect(rings).toHaveLength(3); // outer, hole, second part
    for (const ring of rings) {
      expect(ring).toHaveLength(5);
      expect(ring[0]).toEqual(ring[4]);
    }
  });

  it("puts the hole inside the first part and the second part to its east, north up", () => {
    const [outer, hole, east] = subpaths(arealPath(split, p)).map((r) => ({
      minX: Math.min(...r.map((c) => c[0]!)),
      maxX: Math.max(...r.map((c) => c[0]!)),
      minY: Math.min(...r.map((c) => c[1]!)),
      maxY: Math.max(...r.map((c) => c[1]!)),
    }));
    expect(hole!.minX).toBeGreaterThan(outer!.minX);
    expect(hole!.maxX).toBeLessThan(outer!.maxX);
    expect(hole!.minY).toBeGreaterThan(outer!.minY);
    expect(hole!.maxY).toBeLessThan(outer!.maxY);
    expect(east!.minX).toBeGreaterThan(outer!.maxX);
    // The second part lies at the south edge: the bottom of the SVG (y grows downwards).
    expect(east!.maxY).toBeCloseTo(outer!.maxY, 0);
  });

  it("fits the whole shape, centred, inside the box", () => {
    const all = subpaths(arealPath(split, p)).flat();
    const xs = all.map((c) => c[0]!);
    const ys = all.map((c) => c[1]!);
    expect(Math.min(...xs)).toBeCloseTo(0, 0);
    expect(Math.max(...xs)).toBeCloseTo(600, 0);
    // 0.006° wide, 0.004° tall: 400 units tall at 100 units per 0.001°, centred vertically.
    expect(Math.min(...ys)).toBeCloseTo(0, 0);
    expect(Math.max(...ys)).toBeCloseTo(400, 0);
  });

  it("draws a plain Polygon's holes too", () => {
    const ring: ArealGeometry = { type: "Polygon", coordinates: split.coordinates[0]! };
    expect(subpaths(arealPath(ring, p))).toHaveLength(2);
  });

  it("labels a split zone in its largest part", () => {
    const [x, y] = labelPoint(split, p)!;
    expect(x).toBeCloseTo(p.x(0.002), 5);
    expect(y).toBeCloseTo(p.y(0.002), 5);
  });

  it("turns a tap back into the position under it", () => {
    const { longitude, latitude } = p.invert(p.x(0.0053), p.y(0.0007));
    expect(longitude).toBeCloseTo(0.0053, 9);
    expect(latitude).toBeCloseTo(0.0007, 9);
    // 600 units for 0.006° of longitude at the equator: about 1.1 m per unit.
    expect(p.metresPerUnit).toBeCloseTo(1.1132, 3);
  });

  it("has nothing to fit without shapes or points", () => {
    expect(fitProjection([], [], { width: 100 })).toBeNull();
  });
});
