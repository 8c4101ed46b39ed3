// Property tests (fast-check) on random small communities.

import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  abundanceCurve,
  abundanceStats,
  accumulation,
  incidenceCurve,
  incidenceStats,
  rarefaction,
  type Estimate,
} from "./index";
import { coverageAt, curvePoint } from "./curves";
import { buildProfile } from "./profile";

const countsArb = fc.array(fc.oneof(fc.integer({ min: 0, max: 3 }), fc.integer({ min: 0, max: 60 })), {
  minLength: 1,
  maxLength: 30,
});
const unitsArb = fc.tuple(fc.integer({ min: 1, max: 8 }), fc.integer({ min: 1, max: 14 })).chain(([T, S]) =>
  fc.array(
    fc.array(fc.oneof(fc.constant(0), fc.constant(0), fc.integer({ min: 0, max: 4 })), {
      minLength: S,
      maxLength: S,
    }),
    { minLength: T, maxLength: T },
  ),
);

const total = (c: readonly number[]): number => c.reduce((a, b) => a + b, 0);
const slack = 1e-9;

function expectContains(e: Estimate, label: string): void {
  expect(e.lower, `${label} lower`).toBeLessThanOrEqual(e.estimate + slack);
  expect(e.upper, `${label} upper`).toBeGreaterThanOrEqual(e.estimate - slack);
  expect(Number.isFinite(e.se), `${label} se`).toBe(true);
}

describe("properties", () => {
  it("rarefaction equals the observed richness at n and never decreases with size", () => {
    fc.assert(
      fc.property(countsArb, (counts) => {
        const n = total(counts);
        const sizes = Array.from({ length: n + 1 }, (_, i) => i);
        const r = rarefaction(counts, sizes);
        const observed = counts.filter((c) => c > 0).length;
        expect(r[n]?.richness).toBeCloseTo(observed, 9);
        for (let i = 1; i < r.length; i++)
          expect(r[i]?.richness ?? 0).toBeGreaterThanOrEqual((r[i - 1]?.richness ?? 0) - 1e-12);
      }),
    );
  });

  it("accumulation equals the observed richness at T", () => {
    fc.assert(
      fc.property(unitsArb, (units) => {
        const acc = accumulation(units);
        const observed = incidenceStats(units).observed;
        expect(acc[acc.length - 1]?.richness).toBeCloseTo(observed, 9);
        expect(acc[acc.length - 1]?.sd).toBeCloseTo(0, 9);
      }),
    );
  });

  it("richness estimators are at least the observed richness, and every interval contains its estimate", () => {
    fc.assert(
      fc.property(countsArb, (counts) => {
        const s = abundanceStats(counts, { replicates: 20 });
        for (const [k, e] of Object.entries({ chao1: s.chao1, chao1Classic: s.chao1Classic, ace: s.ace })) {
          expect(e.estimate, k).toBeGreaterThanOrEqual(s.observed - slack);
          expectContains(e, k);
        }
        for (const q of ["q0", "q1", "q2"] as const) {
          const h = s.hill[q];
          expect(h.lower, q).toBeLessThanOrEqual(h.estimate + slack);
          expect(h.upper, q).toBeGreaterThanOrEqual(h.estimate - slack);
        }
      }),
    );
    fc.assert(
      fc.property(unitsArb, (units) => {
        const s = incidenceStats(units);
        for (const [k, e] of Object.entries({ chao2: s.chao2, ice: s.ice, jack1: s.jack1 })) {
          expect(e.estimate, k).toBeGreaterThanOrEqual(s.observed - slack);
          expectContains(e, k);
        }
        // jack2 may fall below S_obs (Q1 = 0, Q2 > 0), so only its interval is checked.
        expectContains(s.jack2, "jack2");
      }),
    );
  });

  it("coverage lies in [0, 1], in the sample and along both curves", () => {
    fc.assert(
      fc.property(countsArb, (counts) => {
        const s = abundanceStats(counts, { replicates: 0 });
        expect(s.coverage).toBeGreaterThanOrEqual(0);
        expect(s.coverage).toBeLessThanOrEqual(1);
        let prev = -1;
        for (const p of abundanceCurve(counts, { points: 15 })) {
          expect(p.coverage).toBeGreaterThanOrEqual(0);
          expect(p.coverage).toBeLessThanOrEqual(1 + 1e-12);
          expect(p.coverage).toBeGreaterThanOrEqual(prev - 1e-12);
          prev = p.coverage;
        }
      }),
    );
    fc.assert(
      fc.property(unitsArb, (units) => {
        const s = incidenceStats(units);
        expect(s.coverage).toBeGreaterThanOrEqual(0);
        expect(s.coverage).toBeLessThanOrEqual(1);
        for (const p of incidenceCurve(units)) {
          expect(p.coverage).toBeGreaterThanOrEqual(0);
          expect(p.coverage).toBeLessThanOrEqual(1 + 1e-12);
        }
      }),
    );
  });

  it("observed Hill numbers decrease with q", () => {
    // Only the observed profile is monotone: the asymptotic estimators are separate
    // estimators and need not be (counts [1, 1] give q0 2.5 but q1 3.375).
    fc.assert(
      fc.property(countsArb, (counts) => {
        const h = abundanceStats(counts, { replicates: 0 }).hill;
        expect(h.q1.observed).toBeLessThanOrEqual(h.q0.observed + 1e-9);
        expect(h.q2.observed).toBeLessThanOrEqual(h.q1.observed + 1e-9);
      }),
    );
  });

  it("adding a sampling unit never lowers the observed richness", () => {
    fc.assert(
      fc.property(
        unitsArb,
        fc.array(fc.integer({ min: 0, max: 3 }), { minLength: 14, maxLength: 14 }),
        (units, extra) => {
          const width = units[0]?.length ?? 0;
          const before = incidenceStats(units).observed;
          const after = incidenceStats([...units, extra.slice(0, width)]).observed;
          expect(after).toBeGreaterThanOrEqual(before);
        },
      ),
    );
  });

  it("the curve is non-decreasing, its band contains it, and it meets S_obs at the sample size", () => {
    fc.assert(
      fc.property(countsArb, (counts) => {
        const curve = abundanceCurve(counts, { points: 12 });
        const observed = curve.filter((p) => p.kind === "observed");
        expect(observed).toHaveLength(1);
        expect(observed[0]?.richness).toBeCloseTo(counts.filter((c) => c > 0).length, 9);
        for (let i = 0; i < curve.length; i++) {
          const p = curve[i];
          if (!p) continue;
          expect(p.lower).toBeLessThanOrEqual(p.richness + slack);
          expect(p.upper).toBeGreaterThanOrEqual(p.richness - slack);
          if (i > 0) expect(p.richness).toBeGreaterThanOrEqual((curve[i - 1]?.richness ?? 0) - 1e-9);
        }
        const s = abundanceStats(counts, { replicates: 0 });
        expect(curve[curve.length - 1]?.richness ?? 0).toBeLessThanOrEqual(s.chao1Classic.estimate + 1e-9);
      }),
    );
  });

  it("coverageAt is curvePoint's coverage to the last bit, at every size up to twice the sample", () => {
    fc.assert(
      fc.property(countsArb, (counts) => {
        const n = total(counts);
        const p = buildProfile("abundance", counts, n);
        for (let m = 0; m <= 2 * n; m++) expect(coverageAt(p, m)).toBe(curvePoint(p, m).coverage);
        // Twice on one profile: the kept half of each log ratio gives the same numbers.
        for (let m = 0; m <= n; m++) expect(coverageAt(p, m)).toBe(curvePoint(p, m).coverage);
      }),
    );
  });
});
