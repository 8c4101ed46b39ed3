// Bootstrap noise: with the default (data-chosen) number of replicates, rerunning with
// another seed must move every band limit by under 2%, relative to the limit.
// Measured at the last change (seeds 20140101 vs 20140102): spider 'Girdled' curves
// 1,800 replicates, largest move 0.68%; its profile 10,000 replicates, 0.94%; pooled BCI
// (Condit et al. 2002, via R vegan 2.6's data(BCI)) curves 200 replicates, 0.23%, its incidence curves 200 replicates, 0.49%. At a fixed 400 replicates the Girdled curves moved 2.6%,
// at a fixed 2,000 its profile moved 3.7% (heavy-tailed q = 0 bootstrap).

import { describe, expect, it } from "vitest";
import { hillCurve, hillCurveIncidence, hillProfile, HILL_CURVE_SEED } from "./index";
import { pooled, reference } from "../../tests/fixtures/vegan/fixture";

const girdled = [46, 22, 17, 15, 15, 9, 8, 6, 6, 4, 2, 2, 2, 2, ...Array<number>(12).fill(1)];

function largestMove(a: { lower: number; upper: number }[], b: { lower: number; upper: number }[]): number {
  let worst = 0;
  a.forEach((r, i) => {
    const s = b[i] as { lower: number; upper: number };
    for (const k of ["lower", "upper"] as const) {
      if (!Number.isFinite(r[k])) continue;
      worst = Math.max(worst, Math.abs(r[k] - s[k]) / Math.max(Math.abs(r[k]), 1e-12));
    }
  });
  return worst;
}

describe("bootstrap noise at the default number of replicates", () => {
  const seeds = [HILL_CURVE_SEED, HILL_CURVE_SEED + 1];

  it("spider 'Girdled' (n = 168) curves: under 2%", () => {
    const [a, b] = seeds.map((seed) => hillCurve(girdled, { seed }));
    expect(largestMove(a!, b!)).toBeLessThan(0.02);
    expect(a![0]!.replicates).toBeGreaterThan(400);
  });

  it("spider 'Girdled' profile over q = 0 … 2: under 2%", () => {
    const orders = [0, 0.25, 0.5, 1, 1.5, 2];
    const [a, b] = seeds.map((seed) => hillProfile(girdled, { orders, seed }));
    expect(largestMove(a!, b!)).toBeLessThan(0.02);
  });

  it("pooled BCI (21,457 individuals; 50 units) curves: under 2% with few replicates", () => {
    const bci = reference.data.BCI;
    const counts = pooled(
      bci,
      bci.map((_, i) => i + 1),
    );
    const [a, b] = seeds.map((seed) => hillCurve(counts, { seed }));
    expect(largestMove(a!, b!)).toBeLessThan(0.02);
    expect(a![0]!.replicates).toBeLessThanOrEqual(400);
    const [c, d] = seeds.map((seed) => hillCurveIncidence(bci, { seed }));
    expect(largestMove(c!, d!)).toBeLessThan(0.02);
  });
});
