// Worked examples from the literature and from vegan's documentation, each with its
// source. Values marked "from memory" were not re-read in the original publication.

import { describe, expect, it } from "vitest";
import { abundanceStats, accumulation, abundanceCurve, incidenceStats, rarefaction } from "./index";
import { reference } from "../../tests/fixtures/vegan/fixture";

/** |a − b| ≤ half a unit in the last printed digit. */
function expectPrinted(actual: number, printed: number, decimals: number, label: string): void {
  expect(Math.abs(actual - printed), `${label}: got ${actual}, printed ${printed}`).toBeLessThanOrEqual(
    0.5 * 10 ** -decimals + 1e-12,
  );
}

describe("Chao et al. (2014), spider data, 'Girdled' treatment (Sackett et al. 2011; values from memory)", () => {
  // X = {46, 22, 17, 15, 15, 9, 8, 6, 6, 4, 2, 2, 2, 2, 1×12}: n = 168, S = 26, f1 = 12, f2 = 4.
  const girdled = [46, 22, 17, 15, 15, 9, 8, 6, 6, 4, 2, 2, 2, 2, ...Array<number>(12).fill(1)];
  const s = abundanceStats(girdled);

  it("Chao1 with (n−1)/n: 43.893, s.e. 14.306, log-normal 95% CI (30.511, 96.971) (from memory)", () => {
    expectPrinted(s.chao1Classic.estimate, 43.893, 3, "Chao1 (Chao et al. 2014, from memory)");
    expectPrinted(s.chao1Classic.se, 14.306, 3, "Chao1 s.e. (Chao et al. 2014, from memory)");
    expectPrinted(s.chao1Classic.lower, 30.511, 3, "CI lower (Chao et al. 2014, from memory)");
    expectPrinted(s.chao1Classic.upper, 96.971, 3, "CI upper (Chao et al. 2014, from memory)");
    expect(s.hill.q0.estimate).toBe(s.chao1Classic.estimate);
  });

  it("sample coverage 0.9289 (Chao & Jost 2012 estimator, as in Chao et al. 2014; from memory)", () => {
    expectPrinted(s.coverage, 0.9289, 4, "coverage (from memory)");
  });

  it("observed Hill numbers 26, 12.060, 7.840 and asymptotic 43.893, 13.826, 8.175 (from memory)", () => {
    expectPrinted(s.hill.q0.observed, 26, 0, "q0 observed");
    expectPrinted(s.hill.q1.observed, 12.06, 3, "q1 observed (from memory)");
    expectPrinted(s.hill.q2.observed, 7.84, 3, "q2 observed (from memory)");
    expectPrinted(s.hill.q1.estimate, 13.826, 3, "q1 asymptotic, Chao et al. 2013 entropy (from memory)");
    expectPrinted(s.hill.q2.estimate, 8.175, 3, "q2 asymptotic (from memory)");
  });

  it("vegan-parity chao1 is the bias-corrected form: 26 + 12·11/(2·5) = 39.2 (arithmetic)", () => {
    expect(s.chao1.estimate).toBeCloseTo(39.2, 12);
  });
});

describe("Chao et al. (2014), spider data, 'Logged' treatment (summary values from memory)", () => {
  it("Chao1 61.403, s.e. 18.532 from n = 252, S = 37, f1 = 14, f2 = 4", () => {
    // Chao1 (Chao-group form) depends only on n, S, f1 and f2; the published data are not
    // reproduced here, so 19 further species carry the remaining 230 individuals.
    const logged = [...Array<number>(14).fill(1), ...Array<number>(4).fill(2), ...Array<number>(18).fill(3), 176];
    const s = abundanceStats(logged);
    expect([s.individuals, s.observed, s.singletons, s.doubletons]).toEqual([252, 37, 14, 4]);
    expectPrinted(s.chao1Classic.estimate, 61.403, 3, "Chao1 Logged (from memory)");
    expectPrinted(s.chao1Classic.se, 18.532, 3, "s.e. Logged (from memory)");
  });
});

describe("vegan vignette 'diversity-vegan' (read in the installed vegan 2.6-4 doc/diversity-vegan.pdf)", () => {
  const bci = reference.data.BCI;

  it("specpool(BCI): chao 236.3732, chao.se 6.54361, jack1 245.58, jack2 247.8722", () => {
    const s = incidenceStats(bci);
    expect(s.observed).toBe(225);
    expectPrinted(s.chao2.estimate, 236.3732, 4, "chao (vignette)");
    expectPrinted(s.chao2.se, 6.54361, 5, "chao.se (vignette)");
    expectPrinted(s.jack1.estimate, 245.58, 2, "jack1 (vignette)");
    expectPrinted(s.jack2.estimate, 247.8722, 4, "jack2 (vignette)");
  });

  it("specpool(BCI) jack1.se 5.650522 is vegan's Q1/T variant; Heltshe & Forrester (1983) give 4.8679", () => {
    const T = bci.length;
    const width = bci[0]?.length ?? 0;
    const y = Array.from({ length: width }, (_, s) => bci.filter((row) => (row[s] ?? 0) > 0).length);
    const r = bci.map((row) => row.filter((v, s) => v > 0 && y[s] === 1).length);
    const q1 = y.filter((v) => v === 1).length;
    const sumSq = r.reduce((acc, v) => acc + v * v, 0);
    const veganVariant = Math.sqrt(((T - 1) / T) * (sumSq - q1 / T));
    expectPrinted(veganVariant, 5.650522, 6, "vegan's jack1.se formula (vignette)");
    const s = incidenceStats(bci);
    expectPrinted(s.jack1.se, 4.8679, 4, "Heltshe & Forrester se (methods.md §5 value)");
  });

  it("estimateR on BCI site 33: S.obs 86, S.chao1 126.071429, se.chao1 18.469365, S.ACE 126.656885", () => {
    const s = abundanceStats(bci[32] ?? []);
    expect(s.observed).toBe(86);
    expectPrinted(s.chao1.estimate, 126.071429, 6, "S.chao1 (vignette)");
    expectPrinted(s.chao1.se, 18.469365, 6, "se.chao1 (vignette)");
    expectPrinted(s.ace.estimate, 126.656885, 6, "S.ACE (vignette)");
    // The vignette's se.ACE 6.133431 comes from vegan's gradient of 1 − f1/(1 − N_rare);
    // the delta method on the ACE formula itself gives a different (larger) se.
    expect(s.ace.se).toBeGreaterThan(6.133431 + 0.5);
  });

  it("quantile(rowSums(BCI)): 340, 409, 428, 443.5, 601 — the data are vegan's BCI", () => {
    const sums = bci.map((row) => row.reduce((a, b) => a + b, 0)).sort((a, b) => a - b);
    expect([sums[0], sums[sums.length - 1]]).toEqual([340, 601]);
  });
});

describe("vegan vignette values quoted in methods.md §13(c, d) (vegan 2.7-5 build; not re-read here)", () => {
  const bci = reference.data.BCI;

  it("estimateR on BCI plot 34: 92, 127.0625, 16.001935, 124.46004", () => {
    const s = abundanceStats(bci[33] ?? []);
    expect(s.observed).toBe(92);
    expectPrinted(s.chao1.estimate, 127.0625, 4, "S.chao1 (methods.md §13c)");
    expectPrinted(s.chao1.se, 16.001935, 6, "se.chao1 (methods.md §13c)");
    expectPrinted(s.ace.estimate, 124.46004, 5, "S.ACE (methods.md §13c)");
  });

  it("renyi on BCI plot 37: H0 4.477, H1 3.792, H2 3.135", () => {
    const s = abundanceStats(bci[36] ?? []);
    expectPrinted(Math.log(s.hill.q0.observed), 4.477, 3, "H0 (methods.md §13d)");
    expectPrinted(s.shannon, 3.792, 3, "H1 (methods.md §13d)");
    expectPrinted(Math.log(s.inverseSimpson), 3.135, 3, "H2 (methods.md §13d)");
  });
});

describe("small hand-checkable vectors (methods.md §13e; computed by its author, not published)", () => {
  it("abundance X = {10, 5, 3, 2, 2, 1, 1, 1}", () => {
    const x = [10, 5, 3, 2, 2, 1, 1, 1];
    const s = abundanceStats(x);
    expectPrinted(s.chao1.estimate, 9, 6, "vegan S.chao1");
    expectPrinted(s.chao1.se, 1.796774, 6, "vegan se.chao1");
    expectPrinted(s.ace.estimate, 11.880165, 6, "S.ACE");
    expectPrinted(s.chao1Classic.estimate, 10.16, 6, "Chao1 (n−1)/n");
    expectPrinted(s.chao1Classic.se, 3.273164, 6, "its se");
    expectPrinted(s.chao1Classic.lower, 8.253987, 6, "CI lower");
    expectPrinted(s.chao1Classic.upper, 26.369468, 6, "CI upper");
    const [r10] = rarefaction(x, [10]);
    expectPrinted(r10?.richness ?? NaN, 5.244733, 6, "rarefy m = 10");
    expectPrinted(r10?.se ?? NaN, 0.981964, 6, "rarefy se m = 10");
    const [c10, c25, c50] = abundanceCurve(x, { sizes: [10, 25, 50] });
    expectPrinted(c10?.coverage ?? NaN, 0.727648, 6, "Ĉ_10");
    expectPrinted(c25?.coverage ?? NaN, 0.886316, 6, "Ĉ_n");
    expectPrinted(c50?.coverage ?? NaN, 0.970578, 6, "Ĉ_50");
    expectPrinted(c50?.richness ?? NaN, 9.600981, 6, "S(50)");
    expectPrinted(s.shannon, 1.733217, 6, "H'");
    expectPrinted(s.evenness, 0.833501, 6, "J'");
    expectPrinted(s.hill.q1.estimate, 6.993375, 6, "asymptotic ¹D");
    expect(s.hill.q2.estimate).toBeCloseTo(5, 12);
  });

  it("incidence, T = 5 units, Y = {5, 3, 2, 1, 1, 1, 1}", () => {
    const units = ["1100100", "1010000", "1100010", "1011000", "1100001"].map((r) => [...r].map(Number));
    const s = incidenceStats(units);
    expectPrinted(s.chao2.estimate, 13.4, 6, "chao");
    expectPrinted(s.chao2.se, 9.397872, 6, "chao.se");
    expectPrinted(s.jack1.estimate, 10.2, 6, "jack1");
    expectPrinted(s.jack1.se, 0.8, 6, "standard jackknife se (vegan's variant: 1.6)");
    expectPrinted(s.jack2.estimate, 12.15, 6, "jack2");
    expectPrinted(s.coverage, 0.746032, 6, "Ĉ_T");
    expectPrinted(s.ice.estimate, 14, 6, "ICE classic form");
    const acc = accumulation(units);
    [2.8, 4.2, 5.3, 6.2, 7].forEach((v, i) => expectPrinted(acc[i]?.richness ?? NaN, v, 6, `Mao Tau h = ${i + 1}`));
    [0.4, 0.412421, 0.387298, 0.4, 0].forEach((v, i) =>
      expectPrinted(acc[i]?.sd ?? NaN, v, 6, `vegan sd h = ${i + 1}`),
    );
  });
});
