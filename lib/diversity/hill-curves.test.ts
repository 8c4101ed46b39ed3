// Hill-number curves (Chao et al. 2014) and coverage-based standardisation (Chao & Jost
// 2012): hand-computed cases, R vegan where it computes the same quantity, the spider
// data of Chao et al. (2014), and fast-check properties.

import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { expectedYLogY } from "./hill-curves";
import {
  DiversityInputError,
  hillAtCoverage,
  hillAtCoverageIncidence,
  hillCurve,
  hillCurveIncidence,
  type HillCurveRow,
} from "./index";
import { expectClose, pooled, reference } from "../../tests/fixtures/vegan/fixture";

const girdled = [46, 22, 17, 15, 15, 9, 8, 6, 6, 4, 2, 2, 2, 2, ...Array<number>(12).fill(1)];
const at = (rows: HillCurveRow[], q: number, m: number): HillCurveRow => {
  const r = rows.find((x) => x.order === q && x.size === m);
  if (!r) throw new Error(`no row q = ${q}, m = ${m}`);
  return r;
};

describe("hand-computed small cases", () => {
  it("counts [2, 1] (n = 3) rarefied to 2 individuals", () => {
    // By hand: pairs drawn from {a, a, b}: (a, a) with probability 1/3, (a, b) with 2/3.
    // q = 0: 1·1/3 + 2·2/3 = 5/3; q = 1: exp((2/3) ln 2) = 2^(2/3); q = 2: 1/E[Σ(Y/2)²] = 1/(1/3 + (2/3)(1/2)) = 3/2.
    const rows = hillCurve([2, 1], { sizes: [1, 2, 3], replicates: 0 });
    expect(at(rows, 0, 2).estimate).toBeCloseTo(5 / 3, 12);
    expect(at(rows, 1, 2).estimate).toBeCloseTo(2 ** (2 / 3), 12);
    expect(at(rows, 2, 2).estimate).toBeCloseTo(1.5, 12);
    for (const q of [0, 1, 2]) {
      expect(at(rows, q, 1).estimate).toBeCloseTo(1, 12);
      expect(at(rows, q, 1).part).toBe("rarefied");
      expect(at(rows, q, 3).part).toBe("observed");
    }
    // Observed: S = 2, exp(H) with p = (2/3, 1/3), 1/Σp² = 1/(5/9) = 1.8.
    expect(at(rows, 1, 3).estimate).toBeCloseTo(Math.exp(-(2 / 3) * Math.log(2 / 3) - (1 / 3) * Math.log(1 / 3)), 12);
    expect(at(rows, 2, 3).estimate).toBeCloseTo(1.8, 12);
  });

  it("extrapolation of q = 0 and q = 2 for [3, 1, 1, 2] (n = 7, f1 = 2, f2 = 1), by hand", () => {
    // f̂0 = (6/7)·2²/(2·1) = 12/7; Â = 7f̂0/(7f̂0 + f1) = 12/14 = 6/7. S(7 + 7) = 4 + (12/7)(1 − (6/7)^7).
    // q = 2: ΣX(X−1)/(n(n−1)) = (6 + 2)/42 = 4/21; D2(14) = 1/[1/14 + (13/14)(4/21)].
    const rows = hillCurve([3, 1, 1, 2], { sizes: [14], replicates: 0 });
    expect(at(rows, 0, 14).estimate).toBeCloseTo(4 + (12 / 7) * (1 - (6 / 7) ** 7), 12);
    expect(at(rows, 2, 14).estimate).toBeCloseTo(1 / (1 / 14 + (13 / 14) * (4 / 21)), 12);
    // Coverage beyond the sample: 1 − (f1/n)Â^{m*+1} = 1 − (2/7)(6/7)^8 (Chao & Jost 2012).
    expect(at(rows, 0, 14).coverage).toBeCloseTo(1 - (2 / 7) * (6 / 7) ** 8, 12);
  });

  it("incidence: three units, one of them empty (T = 3, U = 3), by hand", () => {
    // Species a in units 1 and 2, b in unit 1. Rarefied to one unit: q = 0 is E[S] = ΣY/T = 3/3 = 1.
    const units = [
      [1, 1],
      [1, 0],
      [0, 0],
    ];
    const rows = hillCurveIncidence(units, { sizes: [1, 3], replicates: 0 });
    expect(at(rows, 0, 1).estimate).toBeCloseTo(1, 12);
    expect(at(rows, 0, 3).estimate).toBe(2);
    // q = 2 closed form at t = 1: 1/[(1/t)(T/U)] = U/T = 1.
    expect(at(rows, 2, 1).estimate).toBeCloseTo(1, 12);
  });
});

describe("the hypergeometric E[Y ln Y]", () => {
  it("matches a direct sum over the support, both summed and by its series (μ ≥ 1000)", () => {
    const direct = (N: number, k: number, m: number): number => {
      const lnC = (a: number, b: number): number => {
        let r = 0;
        for (let i = 0; i < b; i++) r += Math.log((a - i) / (b - i));
        return r;
      };
      let s = 0;
      for (let y = Math.max(0, m - (N - k)); y <= Math.min(k, m); y++)
        s += Math.exp(lnC(k, y) + lnC(N - k, m - y) - lnC(N, m)) * (y > 1 ? y * Math.log(y) : 0);
      return s;
    };
    for (const [N, k, m] of [
      [10, 3, 4],
      [50, 1, 20],
      [200, 150, 120],
      [20000, 4000, 5000],
      [10000, 2000, 5000],
      [30000, 15000, 10000],
    ] as const) {
      const d = direct(N, k, m);
      expect(Math.abs(expectedYLogY(N, k, m) - d), `${N}, ${k}, ${m}`).toBeLessThanOrEqual(1e-10 * Math.max(1, d)); // the direct sum itself rounds at about 1e−11
    }
  });
});

describe("R vegan: the same quantities at q = 0", () => {
  it.each(reference.abundance.map((a) => [a.name, a] as const))(
    "%s: rarefied q = 0 equals vegan rarefy",
    (_name, a) => {
      const sizes = a.vegan.rarefy.sizes.filter((m) => m < a.counts.reduce((s, x) => s + x, 0));
      const rows = hillCurve(a.counts, { orders: [0], sizes, replicates: 0 });
      sizes.forEach((m, i) =>
        expectClose(at(rows, 0, m).estimate, a.vegan.rarefy.S[i] as number, `rarefy(${m}) (vegan)`),
      );
    },
  );

  it.each(reference.abundance.map((a) => [a.name, a] as const))(
    "%s: observed point equals vegan renyi(hill = TRUE)",
    (_name, a) => {
      const n = a.counts.reduce((s, x) => s + x, 0);
      const rows = hillCurve(a.counts, { sizes: [n], replicates: 0 });
      [0, 1, 2].forEach((q) =>
        expectClose(at(rows, q, n).estimate, a.vegan.renyi_hill[q] as number, `q = ${q} (vegan renyi)`),
      );
    },
  );

  it.each(reference.incidence.map((r) => [r.name, r] as const))(
    "%s: rarefied q = 0 equals vegan specaccum(method = 'exact')",
    (_name, r) => {
      const units = reference.data[r.dataset];
      const T = units.length;
      const sizes = Array.from({ length: T }, (_, i) => i + 1);
      const rows = hillCurveIncidence(units, { orders: [0], sizes, replicates: 0 });
      sizes.forEach((t, i) =>
        expectClose(at(rows, 0, t).estimate, r.vegan.specaccum.richness[i] as number, `specaccum(${t}) (vegan)`),
      );
    },
  );

  it.each(reference.abundance.map((a) => [a.name, a] as const))(
    "%s: extrapolated q = 0 and coverage equal the formula in R",
    (_name, a) => {
      const n = a.counts.reduce((s, x) => s + x, 0);
      for (const ref of a.formula.extrapolated.filter((p) => p.size <= 2 * n)) {
        const row = at(hillCurve(a.counts, { orders: [0], sizes: [ref.size], replicates: 0 }), 0, ref.size);
        expectClose(row.estimate, ref.richness, `S(${ref.size}) (R formula)`);
        if (ref.coverage !== null) expectClose(row.coverage, ref.coverage, `C(${ref.size}) (R formula)`);
      }
    },
  );
});

describe("Chao et al. (2014), spider 'Girdled' data (values from memory)", () => {
  const rows = hillCurve(girdled, { seed: 7 });
  it("the observed point: 26, 12.060, 7.840 with coverage 0.9289", () => {
    expect(at(rows, 0, 168).estimate).toBe(26);
    expect(Math.abs(at(rows, 1, 168).estimate - 12.06)).toBeLessThan(5e-4);
    expect(Math.abs(at(rows, 2, 168).estimate - 7.84)).toBeLessThan(5e-4);
    expect(Math.abs(at(rows, 0, 168).coverage - 0.9289)).toBeLessThan(5e-5);
  });
  it("default sizes run from 1 to 2n with about 40 points, the observed one included", () => {
    const sizes = [...new Set(rows.map((r) => r.size))];
    expect(sizes[0]).toBe(1);
    expect(sizes[sizes.length - 1]).toBe(336);
    expect(sizes).toContain(168);
    expect(sizes.length).toBeGreaterThanOrEqual(40);
    expect(rows.every((r) => r.replicates >= 200)).toBe(true);
  });
  it("bands: 1 at size 1, never below the observed value when extrapolated, always around the estimate", () => {
    for (const q of [0, 1, 2]) expect([at(rows, q, 1).lower, at(rows, q, 1).upper]).toEqual([1, 1]);
    for (const r of rows) {
      expect(r.lower).toBeLessThanOrEqual(r.estimate);
      expect(r.upper).toBeGreaterThanOrEqual(r.estimate);
      if (r.part === "extrapolated") expect(r.lower).toBeGreaterThanOrEqual(at(rows, r.order, 168).estimate);
    }
  });
  it("is reproducible with a seed and changes with another", () => {
    expect(hillCurve(girdled, { seed: 7, replicates: 300 })).toEqual(hillCurve(girdled, { seed: 7, replicates: 300 }));
    expect(hillCurve(girdled, { seed: 8, replicates: 300 })).not.toEqual(
      hillCurve(girdled, { seed: 7, replicates: 300 }),
    );
  });
});

describe("coverage-based standardisation", () => {
  it("at the observed coverage: the sample itself", () => {
    const c = at(hillCurve(girdled, { sizes: [168], replicates: 0 }), 0, 168).coverage;
    const rows = hillAtCoverage(girdled, { levels: [c] });
    expect(rows.map((r) => r.order)).toEqual([0, 1, 2]);
    for (const r of rows) expect(r.size).toBeCloseTo(168, 6);
    expect(rows[0]?.estimate).toBeCloseTo(26, 6);
  });

  it("at a level the curve reaches at an integer size, that size and the curve's values (rarefied and extrapolated)", () => {
    for (const m of [40, 250]) {
      const curve = hillCurve(girdled, { sizes: [m], replicates: 0 });
      const rows = hillAtCoverage(girdled, { levels: [at(curve, 0, m).coverage] });
      for (const r of rows) {
        expect(r.size).toBeCloseTo(m, 6);
        expect(r.estimate).toBeCloseTo(at(curve, r.order, m).estimate, 6);
      }
    }
  });

  it("interpolates between integer sizes (fractional size) and refuses levels past twice the sample", () => {
    const curve = hillCurve(girdled, { sizes: [40, 41], replicates: 0 });
    const c = (at(curve, 0, 40).coverage + at(curve, 0, 41).coverage) / 2;
    const [r0] = hillAtCoverage(girdled, { orders: [0], levels: [c] });
    expect(r0?.size).toBeGreaterThan(40);
    expect(r0?.size).toBeLessThan(41);
    expect(r0?.estimate).toBeGreaterThan(at(curve, 0, 40).estimate);
    expect(r0?.estimate).toBeLessThan(at(curve, 0, 41).estimate);
    expect(() => hillAtCoverage(girdled, { levels: [0.99] })).toThrow(DiversityInputError);
  });

  it("incidence: the same rules, size in units", () => {
    const bci = reference.data.BCI;
    const curve = hillCurveIncidence(bci, { sizes: [20, 50, 80], replicates: 0 });
    const rows = hillAtCoverageIncidence(bci, {
      orders: [0],
      levels: [at(curve, 0, 20).coverage, at(curve, 0, 50).coverage, at(curve, 0, 80).coverage],
    });
    expect(rows.map((r) => Math.round(r.size * 1e6) / 1e6)).toEqual([20, 50, 80]);
    rows.forEach((r, i) => expect(r.estimate).toBeCloseTo(at(curve, 0, [20, 50, 80][i] as number).estimate, 6));
  });
});

describe("input checks", () => {
  it("refuses sizes past 2n, orders other than 0, 1, 2, bad replicates and levels", () => {
    const code = (fn: () => unknown): string => {
      try {
        fn();
      } catch (e) {
        expect(e).toBeInstanceOf(DiversityInputError);
        return `${(e as DiversityInputError).code} ${(e as DiversityInputError).path}`;
      }
      return "no error";
    };
    expect(code(() => hillCurve([3, 1], { sizes: [9] }))).toBe("invalid-option options.sizes[0]");
    expect(code(() => hillCurve([3, 1], { orders: [3] }))).toBe("invalid-option options.orders[0]");
    expect(code(() => hillCurve([3, 1], { replicates: -1 }))).toBe("invalid-option options.replicates");
    expect(code(() => hillCurve([3, -1]))).toBe("negative counts[1]");
    expect(code(() => hillAtCoverage([3, 1], { levels: [0] }))).toBe("invalid-option options.levels[0]");
    expect(code(() => hillCurveIncidence([[1, 0], [1]]))).toBe("ragged-units units[1]");
  });

  it("empty data gives zeros", () => {
    expect(hillCurve([], {})).toEqual(
      [0, 1, 2].map((q) => ({
        size: 0,
        order: q,
        estimate: 0,
        lower: 0,
        upper: 0,
        coverage: 0,
        part: "observed",
        replicates: 0,
      })),
    );
    expect(hillAtCoverage([0, 0], { levels: [0.5] }).every((r) => r.estimate === 0 && r.size === 0)).toBe(true);
  });
});

const countsArb = fc
  .array(fc.oneof(fc.integer({ min: 0, max: 3 }), fc.integer({ min: 0, max: 40 })), { minLength: 1, maxLength: 20 })
  .filter((c) => c.some((x) => x > 0));
const unitsArb = fc.tuple(fc.integer({ min: 1, max: 8 }), fc.integer({ min: 1, max: 10 })).chain(([T, S]) =>
  fc.array(
    fc.array(fc.oneof(fc.constant(0), fc.constant(0), fc.integer({ min: 0, max: 1 })), {
      minLength: S,
      maxLength: S,
    }),
    { minLength: T, maxLength: T },
  ),
);

function checkCurve(rows: HillCurveRow[]): void {
  const orders = [...new Set(rows.map((r) => r.order))];
  for (const q of orders) {
    const line = rows.filter((r) => r.order === q);
    for (let i = 1; i < line.length; i++) {
      const [a, b] = [line[i - 1] as HillCurveRow, line[i] as HillCurveRow];
      expect(b.estimate, `q = ${q}: non-decreasing in size`).toBeGreaterThanOrEqual(a.estimate - 1e-9);
      expect(b.coverage, "coverage non-decreasing").toBeGreaterThanOrEqual(a.coverage - 1e-12);
    }
  }
  for (const r of rows) {
    expect(r.coverage).toBeGreaterThanOrEqual(0);
    expect(r.coverage).toBeLessThanOrEqual(1);
    expect(r.lower).toBeLessThanOrEqual(r.estimate + 1e-12);
    expect(r.upper).toBeGreaterThanOrEqual(r.estimate - 1e-12);
    if (r.part === "rarefied") {
      // Rarefied Hill numbers do not increase with q (Jensen's inequality on f̂_k(m)).
      const higher = rows.find((x) => x.size === r.size && x.order === r.order + 1);
      if (higher) expect(higher.estimate).toBeLessThanOrEqual(r.estimate + 1e-9);
    }
  }
}

describe("properties", () => {
  it("abundance curves: non-decreasing in size, coverage in [0, 1] and non-decreasing, rarefied values non-increasing in q", () => {
    fc.assert(
      fc.property(countsArb, (counts) => {
        const n = counts.reduce((s, x) => s + x, 0);
        checkCurve(hillCurve(counts, { sizes: Array.from({ length: 2 * n }, (_, i) => i + 1), replicates: 20 }));
      }),
      { numRuns: 60 },
    );
  });

  it("incidence curves likewise", () => {
    fc.assert(
      fc.property(unitsArb, (units) => {
        checkCurve(
          hillCurveIncidence(units, {
            sizes: Array.from({ length: 2 * units.length }, (_, i) => i + 1),
            replicates: 20,
          }),
        );
      }),
      { numRuns: 60 },
    );
  });

  it("empty complete sessions change T but not S_obs", () => {
    fc.assert(
      fc.property(unitsArb, fc.integer({ min: 1, max: 4 }), (units, extra) => {
        const width = units[0]?.length ?? 0;
        const more = [...units, ...Array.from({ length: extra }, () => new Array<number>(width).fill(0))];
        const T = units.length;
        const before = at(hillCurveIncidence(units, { sizes: [T], replicates: 0 }), 0, T);
        const after = at(hillCurveIncidence(more, { sizes: [T + extra], replicates: 0 }), 0, T + extra);
        expect(after.estimate).toBe(before.estimate);
        expect(after.part).toBe("observed");
        // Rarefied back to the old T, the diluted curve can only have fewer species.
        expect(at(hillCurveIncidence(more, { sizes: [T], replicates: 0 }), 0, T).estimate).toBeLessThanOrEqual(
          before.estimate + 1e-9,
        );
      }),
      { numRuns: 60 },
    );
  });
});

describe("pooled BCI (21,457 individuals)", () => {
  it("curve and band in one call, floors respected", () => {
    const bci = reference.data.BCI;
    const counts = pooled(
      bci,
      bci.map((_, i) => i + 1),
    );
    const rows = hillCurve(counts, { replicates: 100 });
    checkCurve(rows);
    expect(at(rows, 0, 21457).estimate).toBe(225);
  });
});
