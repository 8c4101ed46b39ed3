// Shared pieces of the "observed + undetected" richness estimators: the 95% intervals
// and the Chao-type undetected-richness term used by Chao1 (Chao-group form), Chao2,
// the asymptote of the extrapolated curves and the coverage formulas.

import type { FrequencyProfile } from "./profile";

/** 97.5% quantile of the standard normal distribution. */
export const Z95 = 1.959963984540054;

/**
 * How a 95% interval was formed, so every screen can name it:
 * - "log-normal": Chao (1987), for S_obs + undetected estimators;
 * - "poisson-fallback": the log-normal interval degenerates (no undetected species
 *   estimated, or se = 0), so the Poisson-type interval of the Chao group's published R
 *   code is used instead (a convention; its primary paper was not verified, methods.md §1);
 * - "normal": estimate ± z·se (jackknives);
 * - "bootstrap": estimate ± z·(bootstrap se) (Chao et al. 2014);
 * - "none": no data, so no interval (all zeros).
 */
export type IntervalMethod = "log-normal" | "poisson-fallback" | "normal" | "bootstrap" | "none";

export type Estimate = { estimate: number; se: number; lower: number; upper: number; intervalMethod: IntervalMethod };

export const ZERO_ESTIMATE: Estimate = Object.freeze({
  estimate: 0,
  se: 0,
  lower: 0,
  upper: 0,
  intervalMethod: "none" as const,
});

/**
 * Log-normal 95% interval for S_obs + T̂ (Chao 1987): K = exp(z·sqrt(ln(1 + var/T̂²))),
 * [S_obs + T̂/K, S_obs + T̂·K]. Where it degenerates (T̂ = 0 or se = 0) the Poisson-type
 * fallback below is used, given the frequency profile; without one the interval is the point.
 */
export function logNormalInterval(
  observed: number,
  estimate: number,
  variance: number,
  p?: FrequencyProfile,
): Estimate {
  const se = Math.sqrt(Math.max(variance, 0));
  const unseen = estimate - observed;
  if (!(unseen > 0) || se === 0) {
    if (p && p.observed > 0) {
      const f = poissonFallbackInterval(p);
      // Kept around the estimate: with var_obs ≤ 0 (very few units) the fallback would exclude it.
      return {
        estimate,
        se,
        lower: Math.min(estimate, f.lower),
        upper: Math.max(estimate, f.upper),
        intervalMethod: "poisson-fallback",
      };
    }
    return { estimate, se, lower: estimate, upper: estimate, intervalMethod: observed > 0 ? "log-normal" : "none" };
  }
  const k = Math.exp(Z95 * Math.sqrt(Math.log1p((se * se) / (unseen * unseen))));
  return { estimate, se, lower: observed + unseen / k, upper: observed + unseen * k, intervalMethod: "log-normal" };
}

/**
 * Interval used where the log-normal one degenerates (f1 = 0, or f1 = 1 with f2 = 0; Chao
 * group's R code, methods.md §1 and §3; a convention): with P = Σ_k f_k e^{−k}/S_obs and
 * var_obs = Σ_k f_k (e^{−k} − e^{−2k}) − (Σ_k k e^{−k} f_k)²/N (N = n, or T for incidence),
 * [max(S_obs, S_obs/(1−P) − z·sqrt(var_obs)/(1−P)), S_obs/(1−P) + z·sqrt(var_obs)/(1−P)].
 * The estimator keeps its own se; only the interval comes from here.
 */
export function poissonFallbackInterval(p: FrequencyProfile): { lower: number; upper: number } {
  const S = p.observed;
  const N = Math.max(p.size, 1);
  let missed = 0;
  let spread = 0;
  let weighted = 0;
  for (let i = 0; i < p.values.length; i++) {
    const k = p.values[i] as number;
    const f = p.freqs[i] as number;
    const e = Math.exp(-k);
    missed += f * e;
    spread += f * (e - e * e);
    weighted += f * k * e;
  }
  const P = missed / S;
  const half = (Z95 * Math.sqrt(Math.max(spread - (weighted * weighted) / N, 0))) / (1 - P);
  const centre = S / (1 - P);
  return { lower: Math.max(S, centre - half), upper: centre + half };
}

/**
 * Normal 95% interval estimate ± z·se, its lower end raised to `floor` (the observed
 * richness) but never above the estimate itself (jack2 can fall below S_obs).
 */
export function normalInterval(floor: number, estimate: number, variance: number): Estimate {
  const se = Math.sqrt(Math.max(variance, 0));
  const lower = Math.min(estimate, Math.max(floor, estimate - Z95 * se));
  return { estimate, se, lower, upper: estimate + Z95 * se, intervalMethod: "normal" };
}

/**
 * Undetected richness f̂0 with the small-sample factor A = (N−1)/N (Chiu et al. 2014):
 * A·f1²/(2f2) if f2 > 0, else A·f1(f1−1)/2 (Chao 1987; Chao et al. 2014). N is the
 * number of individuals or of sampling units.
 */
export function undetectedChao(p: FrequencyProfile): number {
  const N = p.size;
  if (N <= 1) return 0;
  const A = (N - 1) / N;
  return p.f2 > 0 ? (A * p.f1 * p.f1) / (2 * p.f2) : (A * p.f1 * (p.f1 - 1)) / 2;
}

/**
 * Â = N f̂0 / (N f̂0 + f1): the ratio in the coverage and extrapolation formulas of
 * Chao & Jost (2012) and Chao et al. (2014); (N−1)f1/((N−1)f1 + 2f2) when f2 > 0,
 * (N−1)(f1−1)/((N−1)(f1−1) + 2) when f2 = 0. Zero when f1 = 0.
 */
export function deficitRatio(p: FrequencyProfile): number {
  if (p.f1 <= 0) return 0;
  const nf0 = p.size * undetectedChao(p);
  return nf0 / (nf0 + p.f1);
}

/**
 * Chao1 in the Chao-group form (classic with (n−1)/n if f2 > 0, bias-corrected if f2 = 0)
 * or, for incidence profiles, Chao2 exactly as vegan `specpool` reports `chao`/`chao.se`.
 * Variance: Chao (1987) weighted by A = (N−1)/N; log-normal interval (Chao 1987).
 */
export function chaoRichness(p: FrequencyProfile): Estimate {
  const S = p.observed;
  if (S === 0) return { ...ZERO_ESTIMATE };
  const N = p.size;
  const A = N > 1 ? (N - 1) / N : 0;
  const { f1, f2 } = p;
  const estimate = S + undetectedChao(p);
  let variance: number;
  if (A === 0) variance = 0;
  else if (f2 > 0) {
    const G = f1 / f2;
    variance = f2 * ((A * G * G) / 2 + A * A * G * G * G + (A * A * G * G * G * G) / 4); // Chao (1987)
  } else {
    variance = (A * f1 * (f1 - 1)) / 2 + (A * A * f1 * (2 * f1 - 1) ** 2) / 4 - (A * A * f1 ** 4) / (4 * estimate); // Chao (1987), f2 = 0 form
  }
  return logNormalInterval(S, estimate, variance, p);
}
