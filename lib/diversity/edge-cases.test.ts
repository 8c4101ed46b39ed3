// Input validation and degenerate data: bad input throws a typed error naming the value;
// empty data gives zeros, never NaN.

import { describe, expect, it } from "vitest";
import {
  abundanceCurve,
  abundanceStats,
  accumulation,
  compareZones,
  diversityResults,
  DiversityInputError,
  incidenceCurve,
  incidenceStats,
  rarefaction,
} from "./index";

function numbersIn(value: unknown, path = "$"): [string, number][] {
  if (typeof value === "number") return [[path, value]];
  if (value && typeof value === "object")
    return Object.entries(value).flatMap(([k, v]) => numbersIn(v, `${path}.${k}`));
  return [];
}

function expectInputError(fn: () => unknown, code: string, path: string): void {
  try {
    fn();
  } catch (e) {
    expect(e).toBeInstanceOf(DiversityInputError);
    expect((e as DiversityInputError).code).toBe(code);
    expect((e as DiversityInputError).path).toBe(path);
    expect((e as Error).message).toContain(path);
    return;
  }
  throw new Error("expected a DiversityInputError");
}

describe("input validation", () => {
  it("rejects negative, fractional, NaN, infinite and non-numeric counts with the offending index", () => {
    expectInputError(() => abundanceStats([3, -1]), "negative", "counts[1]");
    expectInputError(() => abundanceStats([2.5]), "not-integer", "counts[0]");
    expectInputError(() => abundanceStats([1, NaN]), "not-finite", "counts[1]");
    expectInputError(() => abundanceStats([Infinity]), "not-finite", "counts[0]");
    expectInputError(() => abundanceStats(["3" as unknown as number]), "not-a-number", "counts[0]");
    expectInputError(() => abundanceStats([2 ** 53]), "too-large", "counts[0]");
    expectInputError(() => abundanceStats([2 ** 52, 2 ** 52]), "too-large", "counts");
    expectInputError(() => abundanceStats("12" as unknown as number[]), "not-an-array", "counts");
  });

  it("rejects ragged or malformed sampling units", () => {
    expectInputError(() => incidenceStats([[1, 0], [1]]), "ragged-units", "units[1]");
    expectInputError(() => incidenceStats([[1, 0], []]), "ragged-units", "units[1]");
    expectInputError(
      () =>
        incidenceStats([
          [1, 0],
          [0, -2],
        ]),
      "negative",
      "units[1][1]",
    );
    expectInputError(() => incidenceStats([[0.5]]), "not-integer", "units[0][0]");
    expectInputError(() => incidenceStats([5 as unknown as number[]]), "not-an-array", "units[0]");
    expectInputError(() => accumulation([[1, 1]], [2]), "invalid-option", "at[0]");
  });

  it("rejects bad sizes and options", () => {
    expectInputError(() => rarefaction([1, 2], [1.5]), "not-integer", "sizes[0]");
    expectInputError(() => rarefaction([1, 2], [-1]), "negative", "sizes[0]");
    expectInputError(() => abundanceCurve([1, 2], { points: 1 }), "invalid-option", "options.points");
    expectInputError(() => diversityResults({ counts: [1], curvePoints: 0 }), "invalid-option", "curvePoints");
    expectInputError(
      () => compareZones({ kind: "abundance", zones: { a: [1, 2] }, coverage: 1 }),
      "invalid-option",
      "coverage",
    );
  });
});

describe("empty data gives zeros", () => {
  it("abundance: [] and all-zero counts", () => {
    for (const counts of [[], [0, 0, 0]]) {
      const s = abundanceStats(counts);
      for (const [path, v] of numbersIn(s)) expect(v, path).toBe(0);
      expect(rarefaction(counts, [0, 5])).toEqual([
        { size: 0, richness: 0, se: 0 },
        { size: 5, richness: 0, se: 0 },
      ]);
      for (const [path, v] of numbersIn(abundanceCurve(counts))) expect(v, path).toBe(0);
    }
  });

  it("incidence: no units, units without species, units with no detections", () => {
    for (const units of [
      [],
      [[], []],
      [
        [0, 0],
        [0, 0],
      ],
    ]) {
      const s = incidenceStats(units);
      for (const [path, v] of numbersIn(s)) {
        if (path === "$.units") continue;
        expect(v, path).toBe(0);
      }
      for (const [path, v] of numbersIn(incidenceCurve(units))) {
        if (path.endsWith(".size")) continue;
        expect(Number.isNaN(v), path).toBe(false);
        expect(v, path).toBe(0);
      }
    }
    expect(accumulation([])).toEqual([]);
  });

  it("diversityResults with nothing", () => {
    const r = diversityResults({ counts: [] });
    for (const [path, v] of numbersIn(r)) expect(Number.isNaN(v), path).toBe(false);
    expect(r.incidence).toBeNull();
    expect(r.accumulationCurve).toEqual([]);
  });
});

describe("degenerate samples", () => {
  it("one species", () => {
    const s = abundanceStats([7]);
    expect([s.observed, s.shannon, s.simpson, s.inverseSimpson, s.evenness]).toEqual([1, 0, 0, 1, 0]);
    // Log-normal interval degenerates (no undetected species): Poisson-type fallback of
    // methods.md §1, hand-computed: P = e^−7, var_obs = e^−7 − e^−14 − (7e^−7)²/7.
    expect(s.chao1).toMatchObject({ estimate: 1, se: 0, lower: 1, intervalMethod: "poisson-fallback" });
    expect(s.chao1.upper).toBeCloseTo(1.0599360435, 9);
    expect(s.hill.q1.observed).toBe(1);
    expect(s.hill.q2.estimate).toBe(1);
  });

  it("one individual: every estimator returns the observed richness", () => {
    const s = abundanceStats([1]);
    expect(s.chao1.estimate).toBe(1);
    expect(s.chao1Classic.estimate).toBe(1);
    expect(s.hill.q1.estimate).toBe(1);
    expect(s.coverage).toBe(1);
  });

  it("all singletons: ACE falls back to the vegan-parity Chao1, q2 is unbounded", () => {
    const s = abundanceStats([1, 1, 1, 1]);
    expect(s.ace).toEqual(s.chao1);
    expect(s.chao1.estimate).toBe(4 + (4 * 3) / 2);
    expect(s.hill.q2.estimate).toBe(Infinity);
    expect(s.hill.q2.upper).toBe(Infinity);
  });

  it("no rare species: ACE is the observed richness with se 0 (vegan gives NaN)", () => {
    const s = abundanceStats([11, 20, 35]);
    expect(s.ace).toMatchObject({ estimate: 3, se: 0, lower: 3, intervalMethod: "poisson-fallback" });
    expect(s.ace.upper).toBeCloseTo(3.008026978, 9); // fallback interval, hand-computed as in methods.md §1
    expect(s.coverage).toBe(1);
  });

  it("f1 = 1, f2 = 0: estimate equals observed; the degenerate log-normal interval is replaced by the fallback", () => {
    const s = abundanceStats([1, 5, 9]);
    expect(s.chao1.estimate).toBe(3);
    // Hand-computed (methods.md §1): P = (e^−1 + e^−5 + e^−9)/3, var_obs over k = 1, 5, 9, n = 15.
    for (const e of [s.chao1, s.chao1Classic]) {
      expect(e.intervalMethod).toBe("poisson-fallback");
      expect(e.lower).toBe(3);
      expect(e.upper).toBeCloseTo(4.498982204, 9);
    }
    const curve = abundanceCurve([1, 5, 9], { sizes: [15, 30] });
    expect(curve.map((p) => p.richness)).toEqual([3, 3]);
  });

  it("a single sampling unit carries no information on unseen species", () => {
    const s = incidenceStats([[1, 3, 0, 2]]);
    // (T−1)/T = 0: no undetected species, se 0; the interval is the fallback convention.
    expect(s.chao2).toMatchObject({ estimate: 3, se: 0, lower: 3, intervalMethod: "poisson-fallback" });
    expect(s.chao2.upper).toBeGreaterThan(3);
    expect(s.jack1.estimate).toBe(3);
    expect(s.jack2.estimate).toBe(3);
    expect(s.ice.estimate).toBe(3);
    expect(accumulation([[1, 3, 0, 2]])).toEqual([{ units: 1, richness: 3, sd: 0, lower: 3, upper: 3 }]);
  });

  it("vegan's rarefy convention beyond the sample: observed richness, se 0", () => {
    expect(rarefaction([3, 1, 1], [10])).toEqual([{ size: 10, richness: 3, se: 0 }]);
  });
});
