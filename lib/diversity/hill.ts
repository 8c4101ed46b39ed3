// Hill numbers of order 0, 1, 2: observed values (Hill 1973) and asymptotic estimators
// (Chao et al. 2014), with 95% intervals. q = 0 uses the analytic Chao1 (Chao-group form)
// variance and log-normal interval; q = 1 and q = 2 use a seeded bootstrap from the
// estimated assemblage of Chao et al. (2014, Appendix), so results are reproducible.

import { harmonicDifference, logSeriesTail } from "./combinatorics";
import type { FrequencyProfile } from "./profile";
import { multinomial, Rng } from "./random";
import { chaoRichness, undetectedChao, Z95, type IntervalMethod } from "./richness";

export type HillValue = {
  observed: number;
  estimate: number;
  se: number;
  lower: number;
  upper: number;
  intervalMethod: IntervalMethod;
};
export type HillSummary = Record<"q0" | "q1" | "q2", HillValue>;

export type BootstrapOptions = { replicates?: number; seed?: number };
export const HILL_BOOTSTRAP_REPLICATES = 200;
export const HILL_BOOTSTRAP_SEED = 20140101;

/** Observed Shannon entropy −Σ p ln p (Shannon 1948), natural log, p = X/n. */
export function shannonEntropy(p: FrequencyProfile): number {
  const n = p.total;
  if (n <= 0) return 0;
  let h = 0;
  for (let i = 0; i < p.values.length; i++) {
    const pi = (p.values[i] ?? 0) / n;
    h -= (p.freqs[i] ?? 0) * pi * Math.log(pi);
  }
  return h;
}

/** Σ p² (Simpson 1949), p = X/n. */
export function simpsonConcentration(p: FrequencyProfile): number {
  const n = p.total;
  if (n <= 0) return 0;
  let s = 0;
  for (let i = 0; i < p.values.length; i++) {
    const pi = (p.values[i] ?? 0) / n;
    s += (p.freqs[i] ?? 0) * pi * pi;
  }
  return s;
}

/**
 * Entropy estimator of Chao, Wang & Jost (2013):
 * Ĥ = Σ_{1≤X≤n−1} (X/n)(ψ(n) − ψ(X)) + (f1/n)(1−A)^{1−n}[−ln A − Σ_{r=1}^{n−1}(1−A)^r/r],
 * A = 2f2/((n−1)f1 + 2f2), or 2/((n−1)(f1−1) + 2) when f2 = 0, or 1 when f1 = 0.
 */
export function chaoShannonEntropy(p: FrequencyProfile): number {
  const n = p.size;
  if (n <= 1) return 0;
  let h = 0;
  for (let i = 0; i < p.values.length; i++) {
    const x = p.values[i] ?? 0;
    if (x <= n - 1) h += ((p.freqs[i] ?? 0) * x * harmonicDifference(x, n)) / n;
  }
  return h + undetectedEntropy(n, p.f1, p.f2);
}

/** Second term of the Chao, Wang & Jost (2013) estimator: (f1/n)(1−A)^{1−n}[−ln A − Σ_{r<n}(1−A)^r/r]. */
function undetectedEntropy(n: number, f1: number, f2: number): number {
  if (f1 <= 0) return 0;
  const A = f2 > 0 ? (2 * f2) / ((n - 1) * f1 + 2 * f2) : 2 / ((n - 1) * (f1 - 1) + 2);
  return (f1 / n) * logSeriesTail(n, A);
}

/** Asymptotic q = 1 and q = 2 Hill numbers straight from one replicate's counts (no sorting). */
function replicateHill(x: Float64Array, n: number): [number, number] {
  let h = 0;
  let f1 = 0;
  let f2 = 0;
  let sxx = 0;
  for (let i = 0; i < x.length; i++) {
    const v = x[i] as number;
    if (v === 0) continue;
    if (v === 1) f1++;
    else if (v === 2) f2++;
    if (v <= n - 1) h += (v * harmonicDifference(v, n)) / n;
    sxx += v * (v - 1);
  }
  return [Math.exp(h + undetectedEntropy(n, f1, f2)), sxx > 0 ? (n * (n - 1)) / sxx : Infinity];
}

/**
 * Asymptotic Hill number of order 2: n(n−1)/Σ X(X−1) (Chao et al. 2014), the inverse of
 * the unbiased Simpson concentration. Infinity when every species is a singleton (n ≥ 2);
 * the observed value when n < 2.
 */
export function asymptoticSimpson(p: FrequencyProfile): number {
  const n = p.size;
  if (n < 2) return n;
  let s = 0;
  for (let i = 0; i < p.values.length; i++) {
    const x = p.values[i] ?? 0;
    s += (p.freqs[i] ?? 0) * x * (x - 1);
  }
  return s > 0 ? (n * (n - 1)) / s : Infinity;
}

/**
 * Species probabilities of the estimated assemblage (Chao et al. 2014, Appendix):
 * detected species p̂ = (X/n)[1 − λ̂(1 − X/n)^n] with λ̂ = (1 − Ĉ)/Σ (X/n)(1 − X/n)^n,
 * plus ⌈f̂0⌉ undetected species sharing the missing mass 1 − Ĉ equally.
 */
export function bootstrapAssemblage(p: FrequencyProfile, coverage: number): Float64Array {
  const n = p.size;
  const f0 = coverage < 1 ? Math.ceil(undetectedChao(p)) : 0;
  const probs = new Float64Array(p.observed + f0);
  let denom = 0;
  for (let i = 0; i < p.values.length; i++) {
    const r = (p.values[i] ?? 0) / n;
    denom += (p.freqs[i] ?? 0) * r * Math.exp(n * Math.log1p(-r));
  }
  const lambda = f0 > 0 && denom > 0 ? (1 - coverage) / denom : 0;
  let j = 0;
  for (let i = 0; i < p.values.length; i++) {
    const r = (p.values[i] ?? 0) / n;
    const pr = r * (1 - lambda * Math.exp(n * Math.log1p(-r)));
    for (let c = 0; c < (p.freqs[i] ?? 0); c++) probs[j++] = pr;
  }
  for (let u = 0; u < f0; u++) probs[j++] = (1 - coverage) / f0;
  return probs;
}

function sampleSd(values: number[]): number {
  if (values.length < 2) return 0;
  let mean = 0;
  for (const v of values) mean += v;
  mean /= values.length;
  let ss = 0;
  for (const v of values) ss += (v - mean) * (v - mean);
  return Math.sqrt(ss / (values.length - 1));
}

function bootInterval(observed: number, estimate: number, se: number): HillValue {
  if (!Number.isFinite(estimate))
    return { observed, estimate, se, lower: observed, upper: Infinity, intervalMethod: "bootstrap" };
  const lower = Math.min(estimate, Math.max(observed, estimate - Z95 * se));
  return { observed, estimate, se, lower, upper: estimate + Z95 * se, intervalMethod: "bootstrap" };
}

/** Observed and asymptotic Hill numbers of an abundance profile, with 95% intervals. */
export function hillNumbers(p: FrequencyProfile, coverage: number, options: BootstrapOptions = {}): HillSummary {
  const n = p.size;
  if (n === 0 || p.observed === 0) {
    const zero: HillValue = { observed: 0, estimate: 0, se: 0, lower: 0, upper: 0, intervalMethod: "none" };
    return { q0: { ...zero }, q1: { ...zero }, q2: { ...zero } };
  }
  const chao = chaoRichness(p);
  const q0: HillValue = { observed: p.observed, ...chao };
  const obs1 = Math.exp(shannonEntropy(p));
  const obs2 = 1 / simpsonConcentration(p);
  const est1 = Math.exp(chaoShannonEntropy(p));
  const est2 = asymptoticSimpson(p);
  const replicates = options.replicates ?? HILL_BOOTSTRAP_REPLICATES;
  let se1 = 0;
  let se2 = 0;
  if (replicates >= 2 && n >= 2)
    [se1, se2] = bootstrapSds(p, coverage, replicates, options.seed ?? HILL_BOOTSTRAP_SEED);
  return { q0, q1: bootInterval(obs1, est1, se1), q2: bootInterval(obs2, est2, se2) };
}

/**
 * Bootstrap sds of q = 1 and q = 2, kept by everything they depend on (the frequency
 * profile, the coverage, the replicates and the seed): a results page that reads again after
 * one more approval redraws only the blocks that changed. Same inputs, same numbers.
 */
const keptSds = new Map<string, [number, number]>();
const MAX_KEPT = 64;

/** Forgets the kept bootstrap sds (a benchmark's cold figure). */
export function forgetHillBootstraps(): void {
  keptSds.clear();
}

function bootstrapSds(p: FrequencyProfile, coverage: number, replicates: number, seed: number): [number, number] {
  const key = JSON.stringify([Array.from(p.values), Array.from(p.freqs), p.size, coverage, replicates, seed]);
  const kept = keptSds.get(key);
  if (kept) return [kept[0], kept[1]];
  const n = p.size;
  const probs = bootstrapAssemblage(p, coverage);
  const rng = new Rng(seed);
  const b1: number[] = [];
  const b2: number[] = [];
  for (let b = 0; b < replicates; b++) {
    const [d1, d2] = replicateHill(multinomial(rng, n, probs), n);
    b1.push(d1);
    if (Number.isFinite(d2)) b2.push(d2);
  }
  const out: [number, number] = [sampleSd(b1), sampleSd(b2)];
  keptSds.set(key, out);
  if (keptSds.size > MAX_KEPT) keptSds.delete(keptSds.keys().next().value!);
  return [out[0], out[1]];
}
