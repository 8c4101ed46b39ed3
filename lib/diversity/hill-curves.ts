// Hill numbers of order q = 0, 1, 2 along sample size: rarefaction and extrapolation
// (Chao et al. 2014, Ecological Monographs 84:45–67), coverage-based standardisation
// (Chao & Jost 2012, Ecology 93:2533–2547), for abundance data (size = individuals) and
// incidence data (size = sampling units), with seeded bootstrap bands (Chao et al. 2014).
// Everything depends on the data only through the frequency counts f_k (Q_k).

import { curvePoint } from "./curves";
import { lnChooseRatio } from "./combinatorics";
import { checkSize, invalidOption } from "./errors";
import { chaoShannonEntropy, shannonEntropy, simpsonConcentration } from "./hill";
import { buildProfile, type FrequencyProfile } from "./profile";
import { binomial, multinomial, Rng } from "./random";
import { deficitRatio, undetectedChao, Z95 } from "./richness";

export type CurvePart = "rarefied" | "observed" | "extrapolated";
export type HillCurveRow = { size: number; order: number; estimate: number; lower: number; upper: number; coverage: number; part: CurvePart };
export type HillCurveOptions = { orders?: readonly number[]; sizes?: readonly number[]; replicates?: number; seed?: number };
export type HillCoverageRow = { coverage: number; order: number; size: number; estimate: number };
export type HillCoverageOptions = { orders?: readonly number[]; levels: readonly number[] };

/**
 * Default bootstrap replicates for the curve bands and the diversity profile. Measured by
 * hill-noise.test.ts: rerunning with another seed moves every band limit of the spider
 * 'Girdled' data and of pooled BCI by under 2% at 400 replicates (largest move 1.0%; at
 * 200 replicates it reached 2.3% at the far end of the extrapolated q = 0 curve).
 */
export const HILL_CURVE_REPLICATES = 400;
export const HILL_CURVE_SEED = 20140101;
/** Points of a default curve (Chao et al. 2014 draw about 40), from 1 to twice the sample. */
export const HILL_CURVE_POINTS = 40;

const CURVE_ORDERS = [0, 1, 2] as const;

export function checkCurveOrders(orders: readonly number[] | undefined, label: string): number[] {
  const out = orders === undefined ? [...CURVE_ORDERS] : [...orders];
  if (!Array.isArray(out) || out.length === 0) throw invalidOption(label, "expected a non-empty array of orders (0, 1 or 2)");
  out.forEach((q, i) => {
    if (q !== 0 && q !== 1 && q !== 2) throw invalidOption(`${label}[${i}]`, `curves are drawn for q = 0, 1 or 2 (got ${String(q)})`);
  });
  return out;
}

export function checkReplicates(replicates: number | undefined, fallback: number, label: string): number {
  const b = replicates ?? fallback;
  if (!Number.isInteger(b) || b < 0 || b > 100_000) throw invalidOption(label, `replicates must be an integer from 0 to 100000 (got ${String(b)})`);
  return b;
}

function checkSeed(seed: number | undefined, label: string): number {
  const s = seed ?? HILL_CURVE_SEED;
  if (!Number.isInteger(s)) throw invalidOption(label, `seed must be an integer (got ${String(s)})`);
  return s;
}

/** The mass that turns counts into relative frequencies at effort m: m individuals, or m·U/T expected incidences. */
function massAt(p: FrequencyProfile, m: number): number {
  return p.kind === "abundance" ? m : (m * p.total) / p.size;
}

/**
 * E[Y ln Y] for Y ~ Hypergeometric(N, k, m) (draw m of N, k marked), summed outward from
 * the mode with the ratio pmf(y+1)/pmf(y) = (k−y)(m−y)/((y+1)(N−k−m+y+1)) and normalised
 * by the summed pmf, so no log-binomial enters; terms below 1e−17 of the mode are dropped.
 */
export function expectedYLogY(N: number, k: number, m: number): number {
  const lo = Math.max(0, m - (N - k));
  const hi = Math.min(k, m);
  if (lo === hi) return lo > 1 ? lo * Math.log(lo) : 0;
  let mode = Math.floor(((m + 1) * (k + 1)) / (N + 2));
  mode = Math.min(hi, Math.max(lo, mode));
  const g = (y: number): number => (y > 1 ? y * Math.log(y) : 0);
  let mass = 1;
  let sum = g(mode);
  let w = 1;
  for (let y = mode; y < hi; y++) {
    w *= ((k - y) * (m - y)) / ((y + 1) * (N - k - m + y + 1));
    mass += w;
    sum += w * g(y + 1);
    if (w < 1e-17 * mass) break;
  }
  w = 1;
  for (let y = mode; y > lo; y--) {
    w *= (y * (N - k - m + y)) / ((k - y + 1) * (m - y + 1));
    mass += w;
    sum += w * g(y - 1);
    if (w < 1e-17 * mass) break;
  }
  return sum / mass;
}

/** Hill number of order q at integer effort m < N, by rarefaction (Chao et al. 2014, eqs for f̂_k(m)). */
function rarefied(p: FrequencyProfile, q: number, m: number): number {
  const N = p.size;
  if (m <= 0) return 0;
  if (q === 2) return secondOrderAt(p, m);
  if (q === 0) {
    let s = 0;
    for (let i = 0; i < p.values.length; i++) s += (p.freqs[i] as number) * -Math.expm1(lnChooseRatio(N, p.values[i] as number, m)); // Hurlbert (1971)
    return s;
  }
  // q = 1: exp(−Σ_k (k/M) ln(k/M) f̂_k(m)) = exp(ln M − Σ_i E[Y_i ln Y_i]/M), M = m (abundance) or mU/T (incidence).
  const M = massAt(p, m);
  let s = 0;
  for (let i = 0; i < p.values.length; i++) s += (p.freqs[i] as number) * expectedYLogY(N, p.values[i] as number, m);
  return Math.exp(Math.log(M) - s / M);
}

/**
 * q = 2 at any effort m > 0, rarefied or extrapolated (exact; methods.md §8):
 * abundance 1/[1/m + (1−1/m) ΣX(X−1)/(n(n−1))]; incidence 1/[(1/t)(T/U) + (1−1/t) ΣY(Y−1)/(U²(1−1/T))].
 */
function secondOrderAt(p: FrequencyProfile, m: number): number {
  const N = p.size;
  if (m <= 0 || p.total <= 0) return 0;
  let pairs = 0;
  for (let i = 0; i < p.values.length; i++) {
    const x = p.values[i] as number;
    pairs += (p.freqs[i] as number) * x * (x - 1);
  }
  const ratio = N > 1 ? (p.kind === "abundance" ? pairs / (N * (N - 1)) : pairs / (p.total * p.total * (1 - 1 / N))) : 0;
  const single = p.kind === "abundance" ? 1 / m : N / (m * p.total);
  return 1 / (single + (1 - 1 / m) * ratio);
}

/** Observed Hill numbers of the sample: S_obs, exp(H), 1/Σp² with p = X/n or Y/U (Hill 1973). */
export function observedHill(p: FrequencyProfile, q: number): number {
  if (p.total <= 0) return 0;
  if (q === 0) return p.observed;
  if (q === 1) return Math.exp(shannonEntropy(p));
  if (q === 2) return 1 / simpsonConcentration(p);
  let s = 0;
  for (let i = 0; i < p.values.length; i++) s += (p.freqs[i] as number) * Math.pow((p.values[i] as number) / p.total, q);
  return Math.pow(s, 1 / (1 - q));
}

/**
 * Asymptotic Shannon diversity exp(Ĥ): Chao, Wang & Jost (2013) for abundance; for incidence
 * Ĥ = (T/U)·[the same estimator on the incidence counts with n → T] + ln(U/T) (Chao et al. 2014).
 */
export function asymptoticShannon(p: FrequencyProfile): number {
  if (p.total <= 0) return 0;
  const h = chaoShannonEntropy(p);
  return p.kind === "abundance" ? Math.exp(h) : Math.exp((p.size / p.total) * h + Math.log(p.total / p.size));
}

/**
 * Extrapolated Hill number at N + m* (m* > 0, real):
 * q = 0: S_obs + f̂0[1 − Â^{m*}] (Shen, Chao & Lin 2003; Chao et al. 2014);
 * q = 1: D_obs + (D̂_asy − D_obs)[1 − (1−β)^{m*}], β = (D_obs − D_rare(N−1))/(D̂_asy − D_rare(N−1)),
 *        the variant of the Chao group's current R code (methods.md §8; for q = 0 it is the formula above);
 * q = 2: the exact closed form of `secondOrderAt`.
 * With one individual or one unit (N ≤ 1) nothing can be extrapolated: flat at the observed value.
 */
function extrapolated(p: FrequencyProfile, q: number, mStar: number, cache: Map<string, number>): number {
  const N = p.size;
  if (N <= 1 || p.total <= 0) return observedHill(p, q);
  if (q === 0) return p.observed + undetectedChao(p) * (1 - Math.pow(deficitRatio(p), mStar));
  if (q === 2) return secondOrderAt(p, N + mStar);
  let beta = cache.get("beta");
  const obs = observedHill(p, 1);
  let asy = cache.get("asy");
  if (asy === undefined) {
    asy = asymptoticShannon(p);
    cache.set("asy", asy);
  }
  if (beta === undefined) {
    const before = rarefied(p, 1, N - 1);
    beta = asy > obs && asy > before ? Math.min(1, Math.max(0, (obs - before) / (asy - before))) : 0;
    cache.set("beta", beta);
  }
  if (!(asy > obs)) return obs;
  return obs + (asy - obs) * (1 - Math.pow(1 - beta, mStar));
}

/** Hill number of order q at effort m (real where extrapolated). */
function hillAt(p: FrequencyProfile, q: number, m: number, cache: Map<string, number>): number {
  const N = p.size;
  if (m < N) return rarefied(p, q, m);
  if (m === N) return observedHill(p, q);
  return extrapolated(p, q, m - N, cache);
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

function sd(sum: number, sumSq: number, count: number): number {
  if (count < 2) return 0;
  const mean = sum / count;
  return Math.sqrt(Math.max(0, (sumSq - count * mean * mean) / (count - 1)));
}

function partOf(m: number, N: number): CurvePart {
  return m < N ? "rarefied" : m === N ? "observed" : "extrapolated";
}

/** Sizes for a default curve: about 40 integers from 1 to 2N, always including N. */
function defaultSizes(N: number): number[] {
  if (N === 0) return [0];
  const set = new Set<number>([N]);
  for (let i = 0; i < HILL_CURVE_POINTS; i++) set.add(Math.max(1, Math.round(1 + ((2 * N - 1) * i) / (HILL_CURVE_POINTS - 1))));
  return [...set].sort((a, b) => a - b);
}

/**
 * Size-based rarefaction/extrapolation curve of Hill numbers with bootstrap 95% bands
 * (estimate ± z·sd over replicates drawn from the estimated assemblage, Chao et al. 2014).
 * Bands are floored: at sizes ≥ 1 never below min(1, estimate) (one individual is one
 * species), and in the extrapolated part never below the observed Hill number (for q = 0
 * a larger sample cannot hold fewer species; for q = 1, 2 the same floor is our convention).
 * Sizes above 2N are refused: extrapolation past twice the sample is unreliable (Chao et al. 2014).
 */
export function hillCurveFromProfile(p: FrequencyProfile, options: HillCurveOptions, label: string): HillCurveRow[] {
  const orders = checkCurveOrders(options.orders, `${label}.orders`);
  const replicates = checkReplicates(options.replicates, HILL_CURVE_REPLICATES, `${label}.replicates`);
  const seed = checkSeed(options.seed, `${label}.seed`);
  const N = p.size;
  let sizes: number[];
  if (options.sizes !== undefined) {
    if (!Array.isArray(options.sizes)) throw invalidOption(`${label}.sizes`, "expected an array of sizes");
    sizes = [...options.sizes];
    sizes.forEach((m, i) => {
      checkSize(m, `${label}.sizes[${i}]`);
      if (m > 2 * N) throw invalidOption(`${label}.sizes[${i}]`, `sizes stop at twice the sample (${2 * N}); estimates past that are unreliable (got ${m})`);
    });
  } else sizes = defaultSizes(N);

  const cache = new Map<string, number>();
  const est = orders.map((q) => sizes.map((m) => (p.total > 0 ? hillAt(p, q, m, cache) : 0)));
  const coverage = sizes.map((m) => Math.min(1, Math.max(0, curvePoint(p, m).coverage)));
  const sums = orders.map(() => new Float64Array(sizes.length));
  const sumSqs = orders.map(() => new Float64Array(sizes.length));
  let used = 0;
  if (replicates >= 2 && N >= 2 && p.observed > 0) {
    const probs = estimatedAssemblage(p);
    const rng = new Rng(seed);
    for (let b = 0; b < replicates; b++) {
      const boot = bootstrapProfile(p, probs, rng);
      const bc = new Map<string, number>();
      orders.forEach((q, oi) => {
        sizes.forEach((m, si) => {
          const v = boot.total > 0 ? hillAt(boot, q, m, bc) : 0;
          const su = sums[oi] as Float64Array;
          const sq = sumSqs[oi] as Float64Array;
          su[si] = (su[si] as number) + v;
          sq[si] = (sq[si] as number) + v * v;
        });
      });
      used++;
    }
  }
  const rows: HillCurveRow[] = [];
  orders.forEach((q, oi) => {
    const observed = p.total > 0 ? observedHill(p, q) : 0;
    sizes.forEach((m, si) => {
      const e = (est[oi] as number[])[si] as number;
      const s = sd((sums[oi] as Float64Array)[si] as number, (sumSqs[oi] as Float64Array)[si] as number, used);
      const part = partOf(m, N);
      let lower = e - Z95 * s;
      if (m >= 1 && p.total > 0) lower = Math.max(lower, Math.min(1, e));
      if (part === "extrapolated") lower = Math.max(lower, Math.min(observed, e));
      lower = Math.min(Math.max(lower, 0), e);
      rows.push({ size: m, order: q, estimate: e, lower, upper: e + Z95 * s, coverage: coverage[si] as number, part });
    });
  });
  return rows;
}

/** Sample coverage at a real effort m (Chao & Jost 2012): rarefied below N, extrapolated above. */
function coverageAtReal(p: FrequencyProfile, m: number): number {
  const N = p.size;
  if (m <= N) return curvePoint(p, m).coverage;
  return 1 - (p.f1 / p.total) * Math.pow(deficitRatio(p), m - N + 1);
}

/**
 * Coverage-based standardisation (Chao & Jost 2012): the size at which the sample would
 * reach each coverage level and the Hill numbers there. Below the observed coverage the
 * size lies between two integer sizes whose rarefied coverages bracket the level, and size
 * and estimate are interpolated linearly between them (so size may be fractional); above
 * it, m* solves 1 − (f1/N_U)Â^{m*+1} = level (real) and the extrapolation formulas are used.
 * Levels beyond the coverage at twice the sample are refused (unreliable, Chao et al. 2014).
 */
export function hillAtCoverageFromProfile(p: FrequencyProfile, options: HillCoverageOptions, label: string): HillCoverageRow[] {
  const orders = checkCurveOrders(options.orders, `${label}.orders`);
  if (!Array.isArray(options.levels) || options.levels.length === 0) throw invalidOption(`${label}.levels`, "expected a non-empty array of coverage levels");
  const N = p.size;
  const rows: HillCoverageRow[] = [];
  const cache = new Map<string, number>();
  const observedCoverage = N > 0 && p.total > 0 ? curvePoint(p, N).coverage : 0;
  const maxCoverage = N > 0 && p.total > 0 ? coverageAtReal(p, 2 * N) : 0;
  options.levels.forEach((c, li) => {
    if (typeof c !== "number" || !(c > 0 && c <= 1)) throw invalidOption(`${label}.levels[${li}]`, `coverage levels must lie in (0, 1] (got ${String(c)})`);
    if (p.total <= 0) {
      for (const q of orders) rows.push({ coverage: c, order: q, size: 0, estimate: 0 });
      return;
    }
    if (c > maxCoverage + 1e-12) {
      throw invalidOption(`${label}.levels[${li}]`, `this sample reaches coverage ${maxCoverage.toFixed(4)} at twice its size; ${c} lies beyond (unreliable)`);
    }
    if (c <= observedCoverage) {
      // Largest integer m with coverage(m) < c, by bisection (coverage rises with m; coverage(0) = 0).
      let lo = 0;
      let hi = N;
      while (hi - lo > 1) {
        const mid = Math.floor((lo + hi) / 2);
        if (curvePoint(p, mid).coverage >= c) hi = mid;
        else lo = mid;
      }
      const cLo = curvePoint(p, lo).coverage;
      const cHi = curvePoint(p, hi).coverage;
      const w = cHi > cLo ? Math.min(1, Math.max(0, (c - cLo) / (cHi - cLo))) : 1;
      for (const q of orders) {
        const dLo = lo === 0 ? 0 : hillAt(p, q, lo, cache);
        const dHi = hillAt(p, q, hi, cache);
        rows.push({ coverage: c, order: q, size: lo + w * (hi - lo), estimate: dLo + w * (dHi - dLo) });
      }
      return;
    }
    const ratio = deficitRatio(p);
    const mStar = Math.log(((1 - c) * p.total) / p.f1) / Math.log(ratio) - 1;
    const size = N + Math.max(0, mStar);
    for (const q of orders) rows.push({ coverage: c, order: q, size, estimate: hillAt(p, q, size, cache) });
  });
  return rows;
}
