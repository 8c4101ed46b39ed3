// Asymptotic diversity profile: published values, R vegan, the Chao & Jost (2015)
// estimator against its defining sums, and properties.

import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { chaoJostTail } from "./hill-profile";
import { abundanceStats, DiversityInputError, hillProfile, hillProfileIncidence, incidenceStats } from "./index";
import { expectClose, reference } from "../../tests/fixtures/vegan/fixture";

const girdled = [46, 22, 17, 15, 15, 9, 8, 6, 6, 4, 2, 2, 2, 2, ...Array<number>(12).fill(1)];

/** ∏_{j<r} (a − j)/(j + 1): the generalised binomial coefficient C(a, r). */
function choose(a: number, r: number): number {
  let c = 1;
  for (let j = 0; j < r; j++) c *= (a - j) / (j + 1);
  return c;
}

/**
 * Chao & Jost (2015) written exactly as published, term by term (O(n²) sums):
 * [Σ_{k=0}^{n−1} C(q−1, k)(−1)^k Δ̂(k) + (f1/n)(1−A)^{1−n}(A^{q−1} − Σ_{r=0}^{n−1} C(q−1, r)(A−1)^r)]^{1/(1−q)},
 * Δ̂(k) = Σ_{X_i ≤ n−k} (X_i/n)·C(n−X_i, k)/C(n−1, k).
 */
function chaoJostDirect(counts: number[], q: number): number {
  const x = counts.filter((v) => v > 0);
  const n = x.reduce((s, v) => s + v, 0);
  const f1 = x.filter((v) => v === 1).length;
  const f2 = x.filter((v) => v === 2).length;
  let first = 0;
  for (let k = 0; k < n; k++) {
    let delta = 0;
    for (const X of x) if (X <= n - k) delta += (X / n) * (choose(n - X, k) / choose(n - 1, k));
    first += choose(q - 1, k) * (-1) ** k * delta;
  }
  const A = f2 > 0 ? (2 * f2) / ((n - 1) * f1 + 2 * f2) : f1 > 0 ? 2 / ((n - 1) * (f1 - 1) + 2) : 1;
  let partial = 0;
  for (let r = 0; r < n; r++) partial += choose(q - 1, r) * (A - 1) ** r;
  const second = f1 > 0 && A < 1 ? (f1 / n) * (1 - A) ** (1 - n) * (A ** (q - 1) - partial) : 0;
  return (first + second) ** (1 / (1 - q));
}

describe("Chao et al. (2014) spider 'Girdled' data: asymptotic 43.893, 13.826, 8.175 (from memory)", () => {
  const rows = hillProfile(girdled, { orders: [0, 1, 2], seed: 3 });
  it("estimates and observed values", () => {
    expect(rows.map((r) => Math.round(r.estimate * 1000) / 1000)).toEqual([43.893, 13.826, 8.175]);
    expect(rows.map((r) => Math.round(r.observed * 1000) / 1000)).toEqual([26, 12.06, 7.84]);
  });
  it("q = 0 is the Chao1 of the results table (Chao-group form); intervals by bootstrap, named", () => {
    expect(rows[0]?.estimate).toBe(abundanceStats(girdled).chao1Classic.estimate);
    for (const r of rows) {
      expect(r.intervalMethod).toBe("bootstrap");
      expect(r.replicates).toBeGreaterThanOrEqual(200);
      expect(r.lower).toBeGreaterThanOrEqual(r.observed);
      expect(r.lower).toBeLessThanOrEqual(r.estimate);
      expect(r.upper).toBeGreaterThan(r.estimate);
      expect(r.se).toBeGreaterThan(0);
    }
  });
  it("reproduces with the same seed", () => {
    expect(hillProfile(girdled, { orders: [0.5, 1.5], seed: 9, replicates: 500 })).toEqual(
      hillProfile(girdled, { orders: [0.5, 1.5], seed: 9, replicates: 500 }),
    );
  });
});

describe("R vegan", () => {
  it.each(reference.abundance.map((a) => [a.name, a] as const))(
    "%s: q = 2 equals simpson.unb(inverse = TRUE); observed values equal renyi(hill = TRUE)",
    (_n, a) => {
      const rows = hillProfile(a.counts, { orders: [0, 1, 2], replicates: 0 });
      expectClose(rows[2]?.estimate ?? NaN, a.vegan.simpson_unb_inverse, "simpson.unb inverse (vegan)");
      rows.forEach((r, q) => expectClose(r.observed, a.vegan.renyi_hill[q] as number, `renyi q = ${q} (vegan)`));
    },
  );
});

describe("Chao & Jost (2015) for non-integer q", () => {
  it("equals the published sums term by term on small samples", () => {
    const samples = [girdled, [5, 3, 1, 1, 1, 2], [10, 5, 3, 2, 2, 1, 1, 1], [4, 1, 1, 1, 1], [7, 3, 2]];
    for (const counts of samples) {
      const qs = [0.1, 0.5, 0.9, 1.3, 1.7];
      const rows = hillProfile(counts, { orders: qs, replicates: 0 });
      rows.forEach((r, i) => {
        const d = chaoJostDirect(counts, qs[i] as number);
        expect(Math.abs(r.estimate - d), `${counts.join(",")} q = ${qs[i]}: ${r.estimate} vs ${d}`).toBeLessThanOrEqual(
          1e-9 * d,
        );
      });
    }
  });

  it("its tail term agrees in both summation branches (nA ≤ 8 and > 8) with the defining form and with the plain series", () => {
    for (const [n, A] of [
      [30, 0.1],
      [30, 0.4],
      [200, 0.02],
      [200, 0.06],
      [12, 0.9],
    ] as const) {
      for (const q of [0.3, 0.8, 1.2, 1.8]) {
        // Defining form: (1−A)^{1−n}[A^{q−1} − Σ_{r<n} C(q−1, r)(A−1)^r]; it cancels, so only to 1e−6.
        let partial = 0;
        for (let r = 0; r < n; r++) partial += choose(q - 1, r) * (A - 1) ** r;
        const direct = (1 - A) ** (1 - n) * (A ** (q - 1) - partial);
        const got = chaoJostTail(n, q, A);
        const rounding = 1e-14 * (1 - A) ** (1 - n) * Math.max(1, A ** (q - 1)); // what the cancellation can cost the defining form
        expect(Math.abs(got - direct), `n ${n}, A ${A}, q ${q}`).toBeLessThanOrEqual(
          1e-6 * Math.abs(direct) + rounding,
        );
        // Plain series Σ_{r≥n} C(r−q, r)(1−A)^{r−n+1}, terms of one sign: to 1e−10.
        let series = 0;
        let c = choose(n - q, n);
        for (let r = n; r < n + 20000; r++) {
          series += c * (1 - A) ** (r - n + 1);
          c *= (r + 1 - q) / (r + 1); // C(r+1−q, r+1) = C(r−q, r)(r+1−q)/(r+1)
        }
        expect(Math.abs(got - series), `series n ${n}, A ${A}, q ${q}`).toBeLessThanOrEqual(1e-10 * Math.abs(series));
      }
    }
  });

  it("joins q = 0, 1 and 2 continuously", () => {
    for (const counts of [girdled, [10, 5, 3, 2, 2, 1, 1, 1], [9, 1, 1, 4]]) {
      const rows = hillProfile(counts, { orders: [0, 1e-7, 1 - 1e-7, 1, 1 + 1e-7, 2 - 1e-7, 2], replicates: 0 });
      const e = rows.map((r) => r.estimate);
      expect(e[1]).toBeCloseTo(e[0] as number, 4);
      expect(e[2]).toBeCloseTo(e[3] as number, 4);
      expect(e[4]).toBeCloseTo(e[3] as number, 4);
      expect(e[5]).toBeCloseTo(e[6] as number, 4);
    }
  });
});

describe("incidence profile", () => {
  it("q = 0 is Chao2, q = 2 is (1 − 1/T)U²/ΣY(Y−1); only q = 0, 1, 2", () => {
    const bci = reference.data.BCI;
    const rows = hillProfileIncidence(bci, { orders: [0, 1, 2], replicates: 0 });
    expect(rows[0]?.estimate).toBe(incidenceStats(bci).chao2.estimate);
    // Hand-computed: units [[1,1],[1,0],[0,1],[0,0]]: Y = (2, 2), U = 4, T = 4: (3/4)·16/(2 + 2) = 3.
    expect(
      hillProfileIncidence(
        [
          [1, 1],
          [1, 0],
          [0, 1],
          [0, 0],
        ],
        { orders: [2], replicates: 0 },
      )[0]?.estimate,
    ).toBeCloseTo(3, 12);
    expect(() => hillProfileIncidence(bci, { orders: [0.5] })).toThrow(DiversityInputError);
    expect(() => hillProfile(girdled, { orders: [2.5] })).toThrow(DiversityInputError);
  });
});

describe("properties", () => {
  const countsArb = fc
    .array(fc.oneof(fc.integer({ min: 0, max: 3 }), fc.integer({ min: 0, max: 50 })), { minLength: 1, maxLength: 25 })
    .filter((c) => c.some((x) => x > 0));
  it("observed Hill numbers do not increase with q; intervals hold their estimate; se finite", () => {
    fc.assert(
      fc.property(countsArb, (counts) => {
        const orders = [0, 0.25, 0.5, 0.75, 1, 1.25, 1.5, 1.75, 2];
        const rows = hillProfile(counts, { orders, replicates: 30 });
        for (let i = 1; i < rows.length; i++)
          expect(rows[i]?.observed ?? 0).toBeLessThanOrEqual((rows[i - 1]?.observed ?? 0) + 1e-9);
        for (const r of rows) {
          expect(Number.isFinite(r.se)).toBe(true);
          expect(r.lower).toBeLessThanOrEqual(r.estimate + 1e-9);
          expect(r.upper).toBeGreaterThanOrEqual(r.estimate - 1e-9);
          expect(r.estimate).toBeGreaterThan(0);
        }
      }),
      { numRuns: 80 },
    );
  });
});
