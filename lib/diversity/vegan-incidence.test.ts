// Incidence statistics against R vegan 2.6-4 (Debian r-cran-vegan) on BCI (Condit et al.
// 2002) and dune (Jongman et al. 1987), plus formula references computed in R by
// scripts/vegan-reference.R (tests/fixtures/vegan/reference.json).

import { describe, expect, it } from "vitest";
import { accumulation, compareZones, incidenceCurve, incidenceStats } from "./index";
import { expectClose, pooled, reference } from "../../tests/fixtures/vegan/fixture";

describe.each(reference.incidence.map((r) => [r.name, r] as const))("%s", (_name, ref) => {
  const units = reference.data[ref.dataset];
  const stats = incidenceStats(units);

  it("matches vegan specpool: Species, chao, chao.se, jack1, jack2", () => {
    expect(stats.units).toBe(ref.units);
    expect(stats.observed).toBe(ref.vegan.Species);
    expectClose(stats.chao2.estimate, ref.vegan.chao, "chao (vegan specpool)");
    expectClose(stats.chao2.se, ref.vegan["chao.se"], "chao.se (vegan specpool)");
    expectClose(stats.jack1.estimate, ref.vegan.jack1, "jack1 (vegan specpool)");
    expectClose(stats.jack2.estimate, ref.vegan.jack2, "jack2 (vegan specpool)");
  });

  it("gives the Chao (1987) log-normal interval for chao2 (formula in R)", () => {
    expectClose(stats.chao2.lower, ref.formula.chao2_ci[0], "chao2 lower (R formula)");
    expectClose(stats.chao2.upper, ref.formula.chao2_ci[1], "chao2 upper (R formula)");
  });

  it("gives the Heltshe & Forrester (1983) jack1 se, equal to a direct leave-one-out jackknife in R", () => {
    expectClose(stats.jack1.se, ref.formula.jack1_se_hf, "jack1 se (Heltshe & Forrester 1983, R formula)");
    expectClose(stats.jack1.se, ref.formula.jack1_se_leave_one_out, "jack1 se (leave-one-out jackknife in R)");
    // vegan 2.6 specpool subtracts Q1/T instead of Q1²/T: on BCI it reports 5.6505 where
    // the formula and the leave-one-out jackknife give 4.8679 (vegan specpool jack1.se).
    expect(ref.vegan["jack1.se"]).toBeGreaterThan(stats.jack1.se + 0.05);
  });

  it("gives the jack2 se of the frequency-count delta method (formula in R; vegan has none)", () => {
    expectClose(stats.jack2.se, ref.formula.jack2_se_delta, "jack2 se (R formula)");
  });

  it("gives ICE (Lee & Chao 1994, classic form) with a delta-method se (R deriv())", () => {
    const ice = ref.formula.ice;
    expectClose(stats.ice.estimate, ice.estimate, "ICE (R formula)");
    expectClose(stats.ice.se, ice.se, "ICE se (R deriv delta method)");
    expectClose(stats.ice.lower, ice.lower, "ICE lower (R formula)");
    expectClose(stats.ice.upper, ice.upper, "ICE upper (R formula)");
  });

  it("gives Chao & Jost (2012) incidence coverage (formula in R)", () => {
    expectClose(stats.coverage, ref.formula.coverage, "coverage (R formula)");
  });

  it("matches vegan specaccum(method = 'exact') richness and its default conditional sd", () => {
    const acc = accumulation(units);
    expect(acc).toHaveLength(ref.units);
    acc.forEach((p, i) => {
      expectClose(p.richness, ref.vegan.specaccum.richness[i] ?? NaN, `richness at ${p.units} (vegan specaccum)`);
      expectClose(p.sd, ref.vegan.specaccum.sd[i] ?? NaN, `sd at ${p.units} (vegan specaccum)`, 1e-6, 1e-7);
    });
  });

  it("gives the unconditional Mao Tau band of Colwell, Mao & Chang (2004) with Chao2", () => {
    const acc = accumulation(units);
    acc.forEach((p, i) => {
      const sd = ref.formula.accumulation_unconditional_sd[i] ?? NaN;
      // Same σ from vegan itself: specaccum(conditioned = FALSE, gamma = "chao").
      expectClose(sd, ref.vegan.specaccum_unconditional_chao_sd[i] ?? NaN, `σ at ${p.units}: R formula vs vegan`, 1e-9);
      expectClose(p.lower, ref.formula.accumulation_lower[i] ?? NaN, `lower at ${p.units} (R formula)`);
      expectClose(p.upper, ref.formula.accumulation_upper[i] ?? NaN, `upper at ${p.units} (R formula)`);
    });
  });

  it("gives the incidence curve within and beyond the sample (Colwell et al. 2012; formulas in R)", () => {
    const refs = [...ref.formula.interpolated, ...ref.formula.extrapolated];
    const curve = incidenceCurve(units, { sizes: refs.map((r) => r.size) });
    curve.forEach((p, i) => {
      const r = refs[i];
      if (!r) throw new Error("missing reference point");
      expectClose(p.richness, r.richness, `richness at ${r.size} units (R formula)`);
      expectClose(p.se, r.se, `se at ${r.size} units (R formula)`, 1e-6, 1e-7);
      if (r.coverage !== null) expectClose(p.coverage, r.coverage, `coverage at ${r.size} units (R formula)`);
    });
  });
});

describe("zones at equal effort (BCI plots 1–25 against 26–50; R formulas)", () => {
  const z = reference.zones;
  const a = pooled(reference.data.BCI, z.rows.a);
  const b = pooled(reference.data.BCI, z.rows.b);

  it("defaults to the smaller doubled sample size and matches the R references", () => {
    const cmp = compareZones({ kind: "abundance", zones: { a, b }, coverage: z.coverage });
    expect(cmp.size).toBe(z.size);
    for (const key of ["a", "b"] as const) {
      const got = cmp.zones[key];
      if (!got) throw new Error("zone missing");
      expectClose(got.atSize.richness, z.at_size[key].richness, `zone ${key} richness at size (R formula)`);
      expectClose(got.atSize.se, z.at_size[key].se, `zone ${key} se at size (R formula)`);
      expectClose(got.atCoverage.size, z.at_coverage[key].size, `zone ${key} size at coverage 0.99 (R search)`);
      expectClose(got.atCoverage.richness, z.at_coverage[key].richness, `zone ${key} richness at coverage (R formula)`);
      expectClose(
        got.atCoverage.coverage,
        z.at_coverage[key].coverage ?? NaN,
        `zone ${key} coverage reached (R formula)`,
      );
    }
  });
});
