// Abundance statistics against R vegan 2.6-4 (Debian r-cran-vegan) on vegan's data sets
// BCI (Condit et al. 2002) and dune (Jongman et al. 1987). Reference values come from
// tests/fixtures/vegan/reference.json, written by scripts/vegan-reference.R: "vegan"
// fields are vegan's own output, "formula" fields are published formulas coded in R.

import { describe, expect, it } from "vitest";
import { abundanceStats, abundanceCurve, rarefaction } from "./index";
import { expectClose, pooled, reference, type AbundanceRef } from "../../tests/fixtures/vegan/fixture";

function countsOf(a: AbundanceRef): number[] {
  const matrix = reference.data[a.dataset];
  const rows = a.rows === "all" ? matrix.map((_, i) => i + 1) : [a.rows];
  return pooled(matrix, rows);
}

/** The fallback interval of methods.md §1 written out species by species (not by frequency class). */
function poissonFallbackByHand(counts: number[]): [number, number] {
  const seen = counts.filter((x) => x > 0);
  const S = seen.length;
  const n = seen.reduce((s, x) => s + x, 0);
  const P = seen.reduce((s, x) => s + Math.exp(-x), 0) / S;
  const varObs =
    seen.reduce((s, x) => s + Math.exp(-x) - Math.exp(-2 * x), 0) -
    seen.reduce((s, x) => s + x * Math.exp(-x), 0) ** 2 / n;
  const half = (1.959964 * Math.sqrt(varObs)) / (1 - P);
  return [Math.max(S, S / (1 - P) - half), S / (1 - P) + half];
}

describe.each(reference.abundance.map((a) => [a.name, a] as const))("%s", (_name, a) => {
  const counts = countsOf(a);
  const stats = abundanceStats(counts);

  it("rebuilds the counts the fixture used", () => {
    expect(counts).toEqual(a.counts);
  });

  it("matches vegan estimateR: S.obs, S.chao1, se.chao1, S.ACE", () => {
    expect(stats.observed).toBe(a.vegan["S.obs"]);
    expectClose(stats.chao1.estimate, a.vegan["S.chao1"], "S.chao1 (vegan estimateR)");
    expectClose(stats.chao1.se, a.vegan["se.chao1"], "se.chao1 (vegan estimateR)");
    expectClose(stats.ace.estimate, a.vegan["S.ACE"], "S.ACE (vegan estimateR)");
  });

  it("gives the Chao (1987) log-normal interval for chao1 (formula in R), or the fallback where it degenerates", () => {
    const [lo, hi] = a.formula.chao1_ci;
    if (lo === hi) {
      // No undetected species estimated: the log-normal interval is a point, so the
      // Poisson-type fallback (methods.md §1) applies; recomputed here from the counts.
      expect(stats.chao1.intervalMethod).toBe("poisson-fallback");
      const fallback = poissonFallbackByHand(counts);
      expectClose(stats.chao1.lower, fallback[0], "chao1 lower (fallback by hand)");
      expectClose(stats.chao1.upper, fallback[1], "chao1 upper (fallback by hand)");
      expect(stats.chao1.upper).toBeGreaterThan(stats.chao1.estimate);
      return;
    }
    expect(stats.chao1.intervalMethod).toBe("log-normal");
    expectClose(stats.chao1.lower, lo, "chao1 lower (Chao 1987, R formula)");
    expectClose(stats.chao1.upper, hi, "chao1 upper (Chao 1987, R formula)");
  });

  it("gives the ACE se of the Chao & Lee (1992) delta method (R deriv() of the ACE formula)", () => {
    const ace = a.formula.ace;
    if (!ace) throw new Error("fixture lacks ACE");
    expectClose(stats.ace.estimate, ace.estimate, "ACE (R formula)");
    expectClose(stats.ace.se, ace.se, "ACE se (R deriv delta method)");
    expectClose(stats.ace.lower, ace.lower, "ACE lower (Chao 1987 log-normal, R formula)");
    expectClose(stats.ace.upper, ace.upper, "ACE upper (Chao 1987 log-normal, R formula)");
    // vegan 2.6's se.ACE differentiates 1 − f1/(1 − N_rare) instead of 1 − f1/N_rare, so it
    // differs from the delta-method se: on BCI pooled 7.119 (vegan) against 9.617 (formula).
    expect(Math.abs(stats.ace.se - (a.vegan["se.ACE"] ?? 0))).toBeGreaterThan(1e-3);
  });

  it("matches vegan diversity(): shannon, simpson, invsimpson, and H/log(S)", () => {
    expectClose(stats.shannon, a.vegan.shannon, "shannon (vegan diversity)");
    expectClose(stats.simpson, a.vegan.simpson, "simpson (vegan diversity)");
    expectClose(stats.inverseSimpson, a.vegan.invsimpson, "invsimpson (vegan diversity)");
    expectClose(stats.evenness, a.vegan.pielou, "Pielou J (vegan diversity / log specnumber)");
  });

  it("matches vegan renyi(hill = TRUE) for observed Hill numbers", () => {
    expectClose(stats.hill.q0.observed, a.vegan.renyi_hill[0], "q0 observed (vegan renyi)");
    expectClose(stats.hill.q1.observed, a.vegan.renyi_hill[1], "q1 observed (vegan renyi)");
    expectClose(stats.hill.q2.observed, a.vegan.renyi_hill[2], "q2 observed (vegan renyi)");
  });

  it("gives the asymptotic Hill numbers of Chao et al. (2014) (formulas in R)", () => {
    expectClose(stats.hill.q0.estimate, a.formula.hill_asymptotic[0], "q0: Chao1 Chao-group form (R formula)");
    expectClose(
      stats.hill.q1.estimate,
      a.formula.hill_asymptotic[1],
      "q1: exp(Chao, Wang & Jost 2013) (R direct sums)",
    );
    expectClose(stats.hill.q2.estimate, a.formula.hill_asymptotic[2], "q2: n(n−1)/ΣX(X−1) (R formula)");
    expectClose(stats.hill.q2.estimate, a.vegan.simpson_unb_inverse, "q2 vs vegan simpson.unb(inverse = TRUE)", 1e-9);
  });

  it("gives Chao1 in the Chao-group form with its Chao (1987) se and interval (formula in R)", () => {
    const c = a.formula.chao1_classic;
    expectClose(stats.chao1Classic.estimate, c.estimate, "Chao1 classic (R formula)");
    expectClose(stats.chao1Classic.se, c.se, "Chao1 classic se (Chao 1987, R formula)");
    expectClose(stats.chao1Classic.lower, c.lower, "Chao1 classic lower (R formula)");
    expectClose(stats.chao1Classic.upper, c.upper, "Chao1 classic upper (R formula)");
  });

  it("gives Chao & Jost (2012) sample coverage (formula in R)", () => {
    expectClose(stats.coverage, a.formula.coverage, "coverage (R formula)");
  });

  it("matches vegan rarefy(x, sample, se = TRUE)", () => {
    const r = rarefaction(counts, a.vegan.rarefy.sizes);
    const n = counts.reduce((x, y) => x + y, 0);
    r.forEach((p, i) => {
      const veganSe = a.vegan.rarefy.se[i] ?? NaN;
      expectClose(p.richness, a.vegan.rarefy.S[i] ?? NaN, `rarefy S at ${p.size} (vegan rarefy)`);
      if (p.size <= 1 || p.size >= n) {
        // The exact se is 0 here (one individual always holds one species); vegan's own
        // rounding leaves up to 4.9e-6 on BCI pooled (vegan rarefy), ours stays below 1e-6.
        expect(p.se).toBeLessThan(1e-6);
        expect(veganSe).toBeLessThan(1e-5);
      } else {
        expectClose(p.se, veganSe, `rarefy se at ${p.size} (vegan rarefy, Heck et al. 1975)`);
      }
    });
  });

  it("gives the interpolated and extrapolated curve (Colwell et al. 2012; Chao & Jost 2012; formulas in R)", () => {
    const refs = [...a.formula.interpolated, ...a.formula.extrapolated];
    const curve = abundanceCurve(counts, { sizes: refs.map((r) => r.size) });
    curve.forEach((p, i) => {
      const r = refs[i];
      if (!r) throw new Error("missing reference point");
      expectClose(p.richness, r.richness, `richness at ${r.size} (R formula)`);
      expectClose(p.se, r.se, `unconditional se at ${r.size} (R formula)`, 1e-6, 1e-6);
      if (r.coverage !== null) expectClose(p.coverage, r.coverage, `coverage at ${r.size} (R formula)`);
    });
  });
});
