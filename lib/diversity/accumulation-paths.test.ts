// vegan's conditional sd of the exact accumulator, summed over species-class pairs (fast
// path) or over the detections of every unit (the earlier path): the same numbers.

import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { accumulateData } from "./curves";
import { incidenceData } from "./incidence";
import { accumulation } from "./index";
import { reference } from "../../tests/fixtures/vegan/fixture";

const unitsArb = fc.tuple(fc.integer({ min: 1, max: 12 }), fc.integer({ min: 1, max: 16 })).chain(([T, S]) =>
  fc.array(
    fc.array(fc.oneof(fc.constant(0), fc.constant(0), fc.integer({ min: 0, max: 3 })), {
      minLength: S,
      maxLength: S,
    }),
    { minLength: T, maxLength: T },
  ),
);

function expectSame(a: { sd: number; richness: number }[], b: { sd: number; richness: number }[]): void {
  expect(a.length).toBe(b.length);
  a.forEach((p, i) => {
    const q = b[i] as { sd: number; richness: number };
    expect(p.richness).toBe(q.richness);
    // Compared as variances: near 0 both are rounding noise, and the sd is its square root.
    expect(Math.abs(p.sd ** 2 - q.sd ** 2), `sd at ${i + 1}: ${p.sd} vs ${q.sd}`).toBeLessThanOrEqual(
      1e-10 * Math.max(1, q.sd ** 2),
    );
  });
}

describe("accumulation sd: class-pair sum equals the per-detection sum", () => {
  it("on random small communities, including empty units (property)", () => {
    fc.assert(
      fc.property(unitsArb, (units) => {
        const d = incidenceData(units);
        const at = Array.from({ length: d.units }, (_, i) => i + 1);
        const slow = accumulateData(d, at, "detections");
        expectSame(accumulateData(d, at, "pairs"), slow);
        expectSame(accumulateData(d, at, "auto"), slow);
      }),
      { numRuns: 300 },
    );
  });

  it("on BCI (50 units × 225 species) at every unit", () => {
    const d = incidenceData(reference.data.BCI);
    const at = Array.from({ length: 50 }, (_, i) => i + 1);
    expectSame(accumulateData(d, at, "pairs"), accumulateData(d, at, "detections"));
    expectSame(accumulation(reference.data.BCI), accumulateData(d, at, "detections"));
  });
});
