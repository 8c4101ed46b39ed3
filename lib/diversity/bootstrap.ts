// Seeded bootstrap standard errors with a replicate count chosen from the data: enough
// replicates that rerunning with another seed is expected to move every (unfloored)
// interval limit by under 2%. Used by the Hill curves and the diversity profile.

import { buildProfile, type FrequencyProfile } from "./profile";
import { binomial, multinomial, Rng } from "./random";
import { deficitRatio, undetectedChao, Z95 } from "./richness";

/** Replicates are drawn in batches of this size; the first check comes after one batch. */
export const BOOTSTRAP_BATCH = 200;
/** Target: a rerun with another seed moves each limit by under this fraction. */
export const BOOTSTRAP_TARGET_MOVE = 0.02;

export type BootstrapResult = { sd: Float64Array; replicates: number };

/**
 * Replicates needed for one limit L = e ± z·ŝ: the Monte Carlo sd of ŝ is about
 * ŝ·sqrt((κ−1)/(4B)) (κ the kurtosis of the replicates; large-sample variance of a sample
 * sd, e.g. Kendall & Stuart; from memory), so two seeds differ by about √2·z·ŝ·sqrt((κ−1)/(4B)).
 * Requiring three times that to stay under 2% of |L| gives B ≥ (κ−1)/4·(3√2·z·ŝ/(0.02|L|))².
 */
function replicatesFor(sd: number, kurtosis: number, limit: number): number {
  if (!(sd > 0) || !(Math.abs(limit) > 0)) return 0;
  const r = (3 * Math.SQRT2 * Z95 * sd) / (BOOTSTRAP_TARGET_MOVE * Math.abs(limit));
  return (Math.max(kurtosis - 1, 0) / 4) * r * r;
}

/**
 * Bootstrap sd of `cells` statistics from replicates drawn from the estimated assemblage
 * (Chao et al. 2014). With `fixed` the count is fixed; otherwise batches of 200 are drawn
 * until every limit whose floor does not bind meets the 2% rule above, or `cap` is reached.
 * Non-finite replicate values are left out of their cell. Deterministic for a given seed.
 */
export function bootstrapSd(
  p: FrequencyProfile,
  seed: number,
  fixed: number | undefined,
  cap: number,
  estimates: ArrayLike<number>,
  floors: ArrayLike<number>,
  evaluate: (boot: FrequencyProfile, out: Float64Array) => void,
): BootstrapResult {
  const cells = estimates.length;
  const sd = new Float64Array(cells);
  if ((fixed !== undefined && fixed < 2) || p.size < 2 || p.observed === 0) return { sd, replicates: fixed ?? 0 };
  const probs = estimatedAssemblage(p);
  const rng = new Rng(seed);
  const k = new Float64Array(cells);
  const s1 = new Float64Array(cells);
  const s2 = new Float64Array(cells);
  const s3 = new Float64Array(cells);
  const s4 = new Float64Array(cells);
  const out = new Float64Array(cells);
  let done = 0;
  let target = fixed ?? BOOTSTRAP_BATCH;
  for (;;) {
    for (; done < target; done++) {
      evaluate(bootstrapProfile(p, probs, rng), out);
      for (let c = 0; c < cells; c++) {
        const v = out[c] as number;
        if (!Number.isFinite(v)) continue;
        const d = v - (Number.isFinite(estimates[c] as number) ? (estimates[c] as number) : 0); // shifted sums: less cancellation
        const d2 = d * d;
        k[c] = (k[c] as number) + 1;
        s1[c] = (s1[c] as number) + d;
        s2[c] = (s2[c] as number) + d2;
        s3[c] = (s3[c] as number) + d2 * d;
        s4[c] = (s4[c] as number) + d2 * d2;
      }
    }
    let needed = 0;
    for (let c = 0; c < cells; c++) {
      const n = k[c] as number;
      if (n < 2) {
        sd[c] = 0;
        continue;
      }
      const m = (s1[c] as number) / n;
      const m2 = (s2[c] as number) / n - m * m;
      sd[c] = Math.sqrt(Math.max(0, (m2 * n) / (n - 1)));
      if (fixed !== undefined || !(m2 > 0)) continue;
      const m4 =
        (s4[c] as number) / n - (4 * m * (s3[c] as number)) / n + (6 * m * m * (s2[c] as number)) / n - 3 * m ** 4;
      const kurtosis = m4 / (m2 * m2);
      const e = estimates[c] as number;
      if (!Number.isFinite(e)) continue;
      const s = sd[c] as number;
      needed = Math.max(needed, replicatesFor(s, kurtosis, e + Z95 * s));
      if (e - Z95 * s > (floors[c] as number)) needed = Math.max(needed, replicatesFor(s, kurtosis, e - Z95 * s));
    }
    if (fixed !== undefined || needed <= done || done >= cap) return { sd, replicates: done };
    target = Math.min(cap, Math.ceil(needed / BOOTSTRAP_BATCH) * BOOTSTRAP_BATCH);
  }
}

/**
 * Species probabilities of the estimated assemblage (Chao et al. 2014, Appendix): detected
 * species (k/N)[1 − λ̂(1 − k/N)^N], λ̂ = a/Σ_i (k_i/N)(1 − k_i/N)^N, a = (f1/N)·Â, plus ⌈f̂0⌉
 * undetected species of probability a/⌈f̂0⌉ each. N = n (abundance: a multinomial draw) or T
 * (incidence: detection probabilities per unit, each species drawn as a binomial over T units).
 */
export function estimatedAssemblage(p: FrequencyProfile): Float64Array {
  const N = p.size;
  const f0 = undetectedChao(p);
  const unseen = f0 > 0 ? Math.ceil(f0) : 0;
  const a = (p.f1 / N) * deficitRatio(p);
  let b = 0;
  for (let i = 0; i < p.values.length; i++) {
    const r = (p.values[i] as number) / N;
    b += (p.freqs[i] as number) * r * Math.exp(N * Math.log1p(-r));
  }
  const lambda = unseen > 0 && b > 0 ? a / b : 0;
  const probs = new Float64Array(p.observed + unseen);
  let j = 0;
  for (let i = 0; i < p.values.length; i++) {
    const r = (p.values[i] as number) / N;
    const pr = r * (1 - lambda * Math.exp(N * Math.log1p(-r)));
    for (let c = 0; c < (p.freqs[i] as number); c++) probs[j++] = pr;
  }
  for (let u = 0; u < unseen; u++) probs[j++] = a / unseen;
  return probs;
}

/** One bootstrap sample from the estimated assemblage, as a frequency profile. */
export function bootstrapProfile(p: FrequencyProfile, probs: Float64Array, rng: Rng): FrequencyProfile {
  const N = p.size;
  if (p.kind === "abundance") return buildProfile("abundance", multinomial(rng, N, probs), N);
  const y = new Float64Array(probs.length);
  for (let i = 0; i < probs.length; i++) y[i] = binomial(rng, N, Math.min(1, Math.max(0, probs[i] as number)));
  return buildProfile("incidence", y, N);
}
