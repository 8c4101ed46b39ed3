// Curves for the results page: observed and extrapolated parts, bands, coverage, and
// the one-call diversityResults.

import { describe, expect, it } from "vitest";
import {
  abundanceCurve,
  compareZones,
  diversityResults,
  ENGINE_VERSION,
  incidenceCurve,
  incidenceStats,
} from "./index";
import { pooled, reference } from "../../tests/fixtures/vegan/fixture";

const bci = reference.data.BCI;
const bciCounts = pooled(
  bci,
  bci.map((_, i) => i + 1),
);

describe("diversityResults", () => {
  const r = diversityResults({ units: bci, curvePoints: 30 });

  it("derives counts from the units when they are not given", () => {
    expect(r.engineVersion).toBe(ENGINE_VERSION);
    // BCI: tree counts in 50 one-hectare plots on Barro Colorado Island (Condit et al. 2002, Science 295:666),
    // as shipped in R vegan 2.6's data(BCI) (tests/fixtures/vegan, written by scripts/vegan-reference.R):
    // 21,457 individuals of 225 species in 50 plots.
    expect(r.abundance.individuals).toBe(21457);
    expect(r.abundance.observed).toBe(225);
    expect(r.incidence?.units).toBe(50);
  });

  it("draws one rarefaction curve to twice the sample: rarefied part, one observed point, extrapolated part", () => {
    const c = r.rarefactionCurve;
    expect(c[0]?.size).toBe(1);
    expect(c[c.length - 1]?.size).toBe(2 * 21457);
    const observed = c.filter((p) => p.kind === "observed");
    expect(observed.map((p) => [p.size, p.richness])).toEqual([[21457, 225]]);
    expect(
      c.every((p) => (p.size < 21457 ? p.kind === "rarefied" : p.size > 21457 ? p.kind === "extrapolated" : true)),
    ).toBe(true);
    expect(c.filter((p) => p.kind === "extrapolated").every((p) => p.seConditional === null)).toBe(true);
    expect(c.filter((p) => p.kind === "rarefied").every((p) => typeof p.seConditional === "number")).toBe(true);
  });

  it("has a continuous band and coverage across the observed point", () => {
    const c = r.rarefactionCurve;
    const i = c.findIndex((p) => p.kind === "observed");
    const [before, at, after] = [c[i - 1], c[i], c[i + 1]];
    if (!before || !at || !after) throw new Error("curve too short");
    expect(before.richness).toBeLessThan(at.richness);
    expect(after.richness).toBeGreaterThan(at.richness);
    expect(after.richness - at.richness).toBeLessThan(at.richness - before.richness + 5);
    const near = abundanceCurve(bciCounts, { sizes: [21456, 21457, 21458] });
    expect(Math.abs((near[0]?.se ?? 0) - (near[1]?.se ?? 0))).toBeLessThan(0.01);
    expect(Math.abs((near[2]?.se ?? 0) - (near[1]?.se ?? 0))).toBeLessThan(0.01);
    expect(Math.abs((near[2]?.coverage ?? 0) - (near[1]?.coverage ?? 0))).toBeLessThan(1e-4);
    expect(at.coverage).toBeCloseTo(r.abundance.coverage, 12);
  });

  it("extrapolates towards the Chao1 (Chao-group form) asymptote", () => {
    const far = abundanceCurve(bciCounts, { sizes: [21457 * 200] })[0];
    expect(far?.richness).toBeCloseTo(r.abundance.chao1Classic.estimate, 6);
    expect(far?.se).toBeCloseTo(r.abundance.chao1Classic.se, 3);
  });

  it("draws the accumulation curve likewise, to twice the units", () => {
    const c = r.accumulationCurve;
    expect(c[c.length - 1]?.size).toBe(100);
    expect(c.filter((p) => p.kind === "observed").map((p) => [p.size, p.richness])).toEqual([[50, 225]]);
    const stats = incidenceStats(bci);
    const far = incidenceCurve(bci, { sizes: [50 * 1000] })[0];
    expect(far?.richness).toBeCloseTo(stats.chao2.estimate, 6);
  });

  it("holds only finite numbers, so JSON keeps every value", () => {
    const walk = (v: unknown, path: string): void => {
      if (typeof v === "number") expect(Number.isFinite(v), path).toBe(true);
      else if (v && typeof v === "object") for (const [k, x] of Object.entries(v)) walk(x, `${path}.${k}`);
    };
    walk(r, "$");
    expect(JSON.parse(JSON.stringify(r))).toEqual(r);
  });
});

describe("compareZones", () => {
  it("compares incidence zones at a common number of units and coverage", () => {
    const cmp = compareZones({ kind: "incidence", zones: { edge: bci.slice(0, 20), interior: bci.slice(20) } });
    expect(cmp.size).toBe(40);
    const edge = cmp.zones.edge;
    const interior = cmp.zones.interior;
    if (!edge || !interior) throw new Error("zones missing");
    expect(edge.atSize.kind).toBe("extrapolated");
    expect(interior.atSize.kind).toBe("extrapolated");
    const at25 = compareZones({
      kind: "incidence",
      zones: { edge: bci.slice(0, 20), interior: bci.slice(20) },
      size: 25,
    });
    expect(at25.zones.edge?.atSize.kind).toBe("extrapolated");
    expect(at25.zones.interior?.atSize.kind).toBe("rarefied");
    expect(edge.atCoverage.coverage).toBeCloseTo(cmp.coverage, 2);
    expect(interior.atCoverage.coverage).toBeCloseTo(cmp.coverage, 2);
    for (const z of [edge, interior]) {
      expect(z.atSize.lower).toBeLessThanOrEqual(z.atSize.richness);
      expect(z.atSize.upper).toBeGreaterThanOrEqual(z.atSize.richness);
    }
  });

  it("an empty zone gives zeros", () => {
    const cmp = compareZones({ kind: "abundance", zones: { a: [5, 3, 1, 1], b: [] }, size: 10, coverage: 0.8 });
    expect(cmp.zones.b?.atSize.richness).toBe(0);
    expect(cmp.zones.b?.atCoverage.richness).toBe(0);
    expect(cmp.zones.a?.atSize.kind).toBe("observed");
  });
});
