// Abundance-based statistics: Chao1 (as vegan `estimateR` reports it, and in the
// Chao-group form), ACE with a delta-method standard error, sample coverage and the
// classical indices of vegan `diversity`.

import { Dual, deltaVariance } from "./dual";
import { checkCounts } from "./errors";
import { hillNumbers, shannonEntropy, simpsonConcentration, type BootstrapOptions, type HillSummary } from "./hill";
import { buildProfile, rareFrequencies, type FrequencyProfile } from "./profile";
import { chaoRichness, deficitRatio, logNormalInterval, ZERO_ESTIMATE, type Estimate } from "./richness";

export type AbundanceStats = {
  individuals: number;
  observed: number;
  singletons: number;
  doubletons: number;
  /** vegan `estimateR` S.chao1 / se.chao1 (bias-corrected form); log-normal interval of Chao (1987). */
  chao1: Estimate;
  /** Chao1 in the Chao-group form (classic with (n−1)/n if f2 > 0; Chiu et al. 2014), as Chao et al. (2014) report it. */
  chao1Classic: Estimate;
  /** vegan `estimateR` S.ACE; se by the delta method of Chao & Lee (1992); log-normal interval. */
  ace: Estimate;
  coverage: number;
  shannon: number;
  simpson: number;
  inverseSimpson: number;
  evenness: number;
  hill: HillSummary;
};

/** Validates counts and groups them by value. */
export function abundanceProfile(counts: readonly number[]): FrequencyProfile {
  const n = checkCounts(counts, "counts");
  return buildProfile("abundance", counts, n);
}

/**
 * Chao1 exactly as vegan 2.6 `estimateR` reports it: S_obs + f1(f1−1)/(2(f2+1)) for every
 * f2 (bias-corrected form, Chao 2005, no (n−1)/n factor); variance = exact delta-method
 * variance of that form, var_approx − f1²(f1+f2)²/(4(f2+1)⁴Ŝ) (closed form checked in
 * methods.md §1). Interval: log-normal, Chao (1987).
 */
export function chao1BiasCorrected(p: FrequencyProfile): Estimate {
  const S = p.observed;
  if (S === 0) return { ...ZERO_ESTIMATE };
  const { f1, f2 } = p;
  const g = f2 + 1;
  const estimate = S + (f1 * (f1 - 1)) / (2 * g);
  const variance =
    (f1 * (f1 - 1)) / (2 * g) +
    (f1 * (2 * f1 - 1) ** 2) / (4 * g * g) +
    (f1 * f1 * f2 * (f1 - 1) ** 2) / (4 * g ** 4) -
    (f1 * f1 * (f1 + f2) ** 2) / (4 * g ** 4 * estimate);
  return logNormalInterval(S, estimate, variance, p);
}

/**
 * ACE (Chao & Lee 1992) with rare = detected ≤ 10 times, written over dual numbers so its
 * exact gradient feeds the delta-method variance. The same code serves ICE (Lee & Chao
 * 1994) through `unitsFactor` = m_infr/(m_infr − 1) and `squaredDenominator`.
 */
export function coverageEstimator(
  rare: Float64Array,
  commonSpecies: number,
  form: { unitsFactor: number; squaredDenominator: boolean },
): { value: number; grad: Float64Array; coverage: number } {
  const k = rare.length;
  const f = Array.from(rare, (v, i) => Dual.variable(v, i, k));
  let sRare = Dual.constant(0, k);
  let nRare = Dual.constant(0, k);
  let pairs = Dual.constant(0, k);
  f.forEach((fi, i) => {
    const j = i + 1;
    sRare = sRare.add(fi);
    nRare = nRare.add(fi.mul(j));
    pairs = pairs.add(fi.mul(j * (j - 1)));
  });
  const f1 = f[0] ?? Dual.constant(0, k);
  const cov = Dual.constant(1, k).sub(f1.div(nRare)); // C = 1 − f1/N_rare
  const denom = form.squaredDenominator ? nRare.mul(nRare) : nRare.mul(nRare.sub(1));
  const gamma2 = sRare.div(cov).mul(pairs).mul(form.unitsFactor).div(denom).sub(1); // γ² before truncation at 0
  let s = sRare.div(cov).add(commonSpecies);
  if (gamma2.v > 0) s = s.add(f1.div(cov).mul(gamma2));
  return { value: s.v, grad: s.g, coverage: cov.v };
}

/**
 * ACE: the estimate as vegan `estimateR` S.ACE (rare threshold 10). Standard error by the
 * delta method of Chao & Lee (1992) over f1..f10 with cov(f_i, f_j) = f_i(δ_ij − f_j/Ŝ),
 * differentiating the ACE formula itself (vegan 2.6's se.ACE differentiates a different
 * coverage term, 1 − f1/(1 − N_rare)). No rare species: observed, se 0 (vegan: NaN).
 * All rare species singletons (C_ace = 0, vegan: NaN/Inf): falls back to `chao1BiasCorrected`.
 */
export function aceEstimate(p: FrequencyProfile): Estimate {
  const S = p.observed;
  const rare = rareFrequencies(p, 10);
  let sRare = 0;
  let nRare = 0;
  rare.forEach((v, i) => {
    sRare += v;
    nRare += (i + 1) * v;
  });
  if (nRare === 0) return logNormalInterval(S, S, 0, p); // no rare species: observed, with the fallback interval
  if (p.f1 >= nRare) return chao1BiasCorrected(p);
  const r = coverageEstimator(rare, S - sRare, { unitsFactor: 1, squaredDenominator: false });
  return logNormalInterval(S, r.value, deltaVariance(r.grad, rare, r.value), p);
}

/**
 * Sample coverage Ĉ = 1 − (f1/N)·Â (Chao & Jost 2012), N = individuals (abundance) or
 * total incidences U (incidence); with f2 = 0, Â = (n−1)(f1−1)/((n−1)(f1−1)+2).
 */
export function sampleCoverage(p: FrequencyProfile): number {
  if (p.total <= 0) return 0;
  return 1 - (p.f1 / p.total) * deficitRatio(p);
}

/** Shannon (natural log), Gini–Simpson, inverse Simpson and Pielou's J, as vegan `diversity`. */
export function classicIndices(p: FrequencyProfile): {
  shannon: number;
  simpson: number;
  inverseSimpson: number;
  evenness: number;
} {
  if (p.total <= 0) return { shannon: 0, simpson: 0, inverseSimpson: 0, evenness: 0 };
  const shannon = shannonEntropy(p);
  const d = simpsonConcentration(p);
  return {
    shannon,
    simpson: 1 - d, // Gini–Simpson (Simpson 1949)
    inverseSimpson: 1 / d, // Hill number of order 2 (Hill 1973)
    evenness: p.observed > 1 ? shannon / Math.log(p.observed) : 0, // Pielou (1966); undefined for one species, reported as 0
  };
}

export function abundanceStatsFromProfile(p: FrequencyProfile, options: BootstrapOptions = {}): AbundanceStats {
  const coverage = sampleCoverage(p);
  return {
    individuals: p.size,
    observed: p.observed,
    singletons: p.f1,
    doubletons: p.f2,
    chao1: chao1BiasCorrected(p),
    chao1Classic: chaoRichness(p),
    ace: aceEstimate(p),
    coverage,
    ...classicIndices(p),
    hill: hillNumbers(p, coverage, options),
  };
}

/** All abundance statistics for one sample of counts per species. */
export function abundanceStats(counts: readonly number[], options: BootstrapOptions = {}): AbundanceStats {
  return abundanceStatsFromProfile(abundanceProfile(counts), options);
}
