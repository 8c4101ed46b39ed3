// Log-space combinatorics, series and random numbers, against exact arithmetic.

import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { harmonicDifference, lnChooseRatio, lnGamma, logSeriesTail } from "./combinatorics";
import { abundanceStats, rarefaction } from "./index";
import { binomial, multinomial, Rng } from "./random";

function chooseBig(n: number, k: number): bigint {
  if (k < 0 || k > n) return 0n;
  let r = 1n;
  for (let i = 0; i < k; i++) r = (r * BigInt(n - i)) / BigInt(i + 1);
  return r;
}

/** ln(a/b) for big integers 0 < a ≤ b, through a fixed point of at least 60 digits. */
function lnRatio(a: bigint, b: bigint): number {
  const shift = 60 + b.toString().length - a.toString().length;
  return Math.log(Number((a * 10n ** BigInt(shift)) / b)) - Math.log(10) * shift;
}

/** ln(a) for a big positive integer, from its leading 17 digits. */
function lnBig(a: bigint): number {
  const t = a.toString();
  return Math.log(Number(t.slice(0, 17))) + Math.log(10) * Math.max(t.length - 17, 0);
}

describe("log-space combinatorics", () => {
  it("lnGamma matches ln((k−1)!) computed exactly", () => {
    let f = 1n;
    for (let k = 1; k <= 300; k++) {
      if (k > 1) f *= BigInt(k - 1);
      const exact = lnBig(f);
      expect(Math.abs(lnGamma(k) - exact)).toBeLessThanOrEqual(1e-13 * Math.max(1, Math.abs(exact)));
    }
  });

  it("lnChooseRatio matches exact binomial ratios", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 400 }), fc.nat(), fc.nat(), (N, a, b) => {
        const k = 1 + (a % N);
        const m = 1 + (b % N);
        const got = lnChooseRatio(N, k, m);
        if (N - k < m) {
          expect(got).toBe(-Infinity);
        } else {
          const exact = lnRatio(chooseBig(N - k, m), chooseBig(N, m));
          expect(Math.abs(got - exact)).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(exact)));
        }
      }),
    );
  });

  it("harmonicDifference matches direct sums", () => {
    for (const [a, b] of [
      [1, 2],
      [1, 100],
      [7, 5000],
      [16, 17],
      [40, 1_000_000],
    ] as const) {
      let s = 0;
      for (let j = b - 1; j >= a; j--) s += 1 / j;
      expect(Math.abs(harmonicDifference(a, b) - s)).toBeLessThanOrEqual(1e-13 * s);
    }
  });

  it("logSeriesTail (all three branches) matches the series Σ (1−A)^{j+1}/(n+j)", () => {
    for (const [n, A] of [
      [5000, 1e-3],
      [300, 0.01],
      [1_000_000, 2e-5],
      [250, 0.019],
      [150, 0.005],
      [5000, 0.05],
    ] as const) {
      // Reference: each term from exp((j+1)·log1p(−A)), Kahan-compensated sum.
      const lx = Math.log1p(-A);
      let s = 0;
      let c = 0;
      for (let j = 0; j < 45 / A; j++) {
        const y = Math.exp((j + 1) * lx) / (n + j) - c;
        const t = s + y;
        c = t - s - y;
        s = t;
      }
      expect(Math.abs(logSeriesTail(n, A) - s)).toBeLessThanOrEqual(1e-12 * s);
    }
  });
});

describe("counts into the millions stay exact", () => {
  it("rarefaction of {1, 2, 10⁶, 2·10⁶} at m = 1.5·10⁶ against the closed form", () => {
    const counts = [1, 2, 1_000_000, 2_000_000];
    const n = 3_000_003;
    const m = 1_500_000;
    // α_1 = 1 − m/n and α_2 = (n−m)(n−m−1)/(n(n−1)); the two big species are certain to be seen.
    const expected = 2 + m / n + (1 - ((n - m) * (n - m - 1)) / (n * (n - 1)));
    const [r] = rarefaction(counts, [m]);
    expect(Math.abs((r?.richness ?? NaN) - expected)).toBeLessThanOrEqual(1e-13);
    expect(Number.isFinite(r?.se)).toBe(true);
  });

  it("abundance statistics of a 10⁷-individual sample are finite", () => {
    const counts = [5_000_000, 3_000_000, 1_999_000, ...Array.from({ length: 300 }, (_, i) => 1 + (i % 7))];
    const s = abundanceStats(counts, { replicates: 10 });
    for (const v of [s.chao1.estimate, s.ace.se, s.hill.q1.estimate, s.hill.q1.upper, s.hill.q2.se, s.coverage]) {
      expect(Number.isFinite(v)).toBe(true);
    }
  });
});

describe("seeded random numbers", () => {
  it("binomial draws have the right mean and variance", () => {
    const rng = new Rng(42);
    for (const [N, p] of [
      [1000, 0.3],
      [50, 0.9],
      [1_000_000, 1e-4],
      [20, 0.05],
    ] as const) {
      const draws = Array.from({ length: 20000 }, () => binomial(rng, N, p));
      const mean = draws.reduce((a, b) => a + b, 0) / draws.length;
      const variance = draws.reduce((a, b) => a + (b - mean) ** 2, 0) / (draws.length - 1);
      const mu = N * p;
      const v = N * p * (1 - p);
      expect(Math.abs(mean - mu)).toBeLessThan(5 * Math.sqrt(v / draws.length));
      expect(Math.abs(variance / v - 1)).toBeLessThan(0.06);
      expect(Math.min(...draws)).toBeGreaterThanOrEqual(0);
      expect(Math.max(...draws)).toBeLessThanOrEqual(N);
    }
  });

  it("multinomial draws sum to N; the same seed gives the same bootstrap", () => {
    const rng = new Rng(7);
    const x = multinomial(rng, 1000, new Float64Array([0.5, 0.25, 0.25]));
    expect(x.reduce((a, b) => a + b, 0)).toBe(1000);
    const counts = [30, 12, 8, 5, 3, 2, 2, 1, 1, 1];
    expect(abundanceStats(counts).hill).toEqual(abundanceStats(counts).hill);
    expect(abundanceStats(counts, { seed: 1 }).hill.q1.se).not.toBe(abundanceStats(counts, { seed: 2 }).hill.q1.se);
  });
});
