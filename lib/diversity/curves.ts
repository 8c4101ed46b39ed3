// Rarefaction, accumulation and extrapolation curves. Within the sample: Hurlbert (1971)
// and Mao Tau / the exact accumulator (Colwell, Mao & Chang 2004), with vegan's
// conditional standard errors and the unconditional variance of Colwell et al. (2004,
// 2012). Beyond the sample: the Chao1/Chao2-based predictor of Shen, Chao & Lin (2003)
// with a delta-method variance (Colwell et al. 2012), and coverage (Chao & Jost 2012).

import { lnChooseRatio, lnFactorialRatio } from "./combinatorics";
import { Dual, deltaVariance } from "./dual";
import { sampleCoverage } from "./abundance";
import type { IncidenceData } from "./incidence";
import type { FrequencyProfile } from "./profile";
import { chaoRichness, undetectedChao, Z95 } from "./richness";

/** Probabilities below e^−80 are treated as 0 (their total stays below 1e−25). */
const LOG_CUTOFF = -80;

export type CurveKind = "rarefied" | "observed" | "extrapolated";

export type CurvePoint = {
  /** Individuals (abundance curve) or sampling units (incidence curve). */
  size: number;
  kind: CurveKind;
  richness: number;
  /** Unconditional se: Colwell et al. (2012) (abundance), Colwell et al. (2004) (incidence); delta method beyond the sample. */
  se: number;
  lower: number;
  upper: number;
  coverage: number;
  /** Within the sample only: vegan `rarefy` se (Heck et al. 1975) or vegan `specaccum` sd; null beyond it. */
  seConditional: number | null;
};

/** ln C(N−k, m)/C(N, m) for every class, ascending k; −Infinity once below the cutoff. */
function absenceLogs(p: FrequencyProfile, m: number): Float64Array {
  const out = new Float64Array(p.values.length).fill(-Infinity);
  for (let i = 0; i < p.values.length; i++) {
    const l = lnChooseRatio(p.size, p.values[i] as number, m);
    if (l < LOG_CUTOFF) break;
    out[i] = l;
  }
  return out;
}

type Interpolated = { richness: number; varUnconditional: number; coverage: number; logs: Float64Array };

/** Expected richness, unconditional variance and coverage at effort m ≤ N. */
function interpolate(p: FrequencyProfile, m: number, shat: number): Interpolated {
  const N = p.size;
  const logs = absenceLogs(p, m);
  let richness = 0;
  let sq = 0;
  let missed = 0;
  for (let i = 0; i < logs.length; i++) {
    const f = p.freqs[i] as number;
    const l = logs[i] as number;
    const a = Math.exp(l);
    const seen = -Math.expm1(l);
    richness += f * seen; // Hurlbert (1971); Colwell, Mao & Chang (2004)
    sq += f * seen * seen;
    missed += f * (p.values[i] as number) * a;
  }
  const varUnconditional = shat > 0 ? Math.max(sq - (richness * richness) / shat, 0) : 0; // Colwell et al. (2012)
  let coverage: number;
  if (p.total <= 0) coverage = 0;
  else if (m >= N) coverage = sampleCoverage(p);
  else coverage = Math.min(1, Math.max(0, 1 - (missed / p.total) * (N / (N - m)))); // Chao & Jost (2012): C(N−k,m)/C(N−1,m) = α_k N/(N−m); clamped against rounding
  return { richness, varUnconditional, coverage, logs };
}

/**
 * Heck, van Belle & Simberloff (1975) variance of rarefied richness, conditional on the
 * sample, summed over pairs of distinct count values: each pair term is
 * α_a α_b · expm1(ℓ(a+b) − ℓ(a) − ℓ(b)), which avoids cancelling β against α_a α_b.
 */
function heckVariance(p: FrequencyProfile, m: number, logs: Float64Array): number {
  const N = p.size;
  const K = logs.length;
  let last = -1;
  let v = 0;
  for (let i = 0; i < K; i++) {
    const l = logs[i] as number;
    if (l === -Infinity) break;
    last = i;
    const a = Math.exp(l);
    v += (p.freqs[i] as number) * a * (1 - a);
  }
  if (last < 0) return Math.max(v, 0);
  const maxSum = 2 * (p.values[last] as number);
  const pairLog = new Float64Array(maxSum + 1).fill(NaN);
  let pairs = 0;
  for (let i = 0; i <= last; i++) {
    const li = logs[i] as number;
    const vi = p.values[i] as number;
    const fi = p.freqs[i] as number;
    for (let j = i; j <= last; j++) {
      const lj = logs[j] as number;
      if (li + lj < LOG_CUTOFF) break;
      const w = i === j ? (fi * (fi - 1)) / 2 : fi * (p.freqs[j] as number);
      if (w === 0) continue;
      const s = vi + (p.values[j] as number);
      let ls = pairLog[s] as number;
      if (Number.isNaN(ls)) {
        ls = lnChooseRatio(N, s, m);
        pairLog[s] = ls;
      }
      pairs += w * Math.exp(li + lj) * Math.expm1(ls - li - lj);
    }
  }
  return Math.max(v + 2 * pairs, 0);
}

/**
 * Σ_t n_tc n_tc' for every pair of incidence classes c ≥ c' (n_tc = species of class c in
 * unit t), packed lower-triangular: species pairs grouped by their two frequencies, with
 * their shared units summed (Σ over pairs of shared units is all the correlation sum needs).
 * Built once per data set; null when it would be larger than the detections themselves.
 */
type ClassPairs = { K: number; packed: Float64Array };
const classPairCache = new WeakMap<IncidenceData, ClassPairs | null>();

function classPairs(d: IncidenceData, force = false): ClassPairs | null {
  const cached = classPairCache.get(d);
  if (cached || (cached === null && !force)) return cached;
  const K = d.profile.values.length;
  const T = d.units;
  const size = (K * (K + 1)) / 2;
  let result: ClassPairs | null = null;
  if (force || (size <= 4 * (d.rowStart[T] as number) + 1024 && size <= 8_000_000)) {
    const packed = new Float64Array(size);
    const inUnit = new Float64Array(K);
    const present = new Int32Array(K);
    const { rowStart, nzClass } = d;
    for (let t = 0; t < T; t++) {
      let m = 0;
      const end = rowStart[t + 1] as number;
      for (let j = rowStart[t] as number; j < end; j++) {
        const cls = nzClass[j] as number;
        if (inUnit[cls] === 0) present[m++] = cls;
        inUnit[cls] = (inUnit[cls] as number) + 1;
      }
      // Each unordered pair of present classes once (and each class with itself): the sums
      // are of whole numbers, exact in any order.
      for (let a = 0; a < m; a++) {
        const ca = present[a] as number;
        const na = inUnit[ca] as number;
        for (let b = 0; b <= a; b++) {
          const cb = present[b] as number;
          const idx = ca >= cb ? (ca * (ca + 1)) / 2 + cb : (cb * (cb + 1)) / 2 + ca;
          packed[idx] = (packed[idx] as number) + na * (inUnit[cb] as number);
        }
      }
      for (let a = 0; a < m; a++) inUnit[present[a] as number] = 0;
    }
    result = { K, packed };
  }
  classPairCache.set(d, result);
  return result;
}

/**
 * vegan `specaccum(method = "exact")` sd (conditioned = TRUE; J. Oksanen, unpublished, per the vegan vignette):
 * sd² = Σ V_i + 2 Σ_{i<j} r_ij sqrt(V_i V_j), V_i = α_i(1−α_i), r_ij the Pearson correlation
 * of the incidence columns. With u_i = sqrt(V_i/(Y_i(T−Y_i))), 2Σ_{i<j} r_ij sqrt(V_iV_j) =
 * T(Σ_t G_t² − Σ_i Y_i u_i²) − (Σ_i Y_i u_i)² + Σ_i Y_i² u_i², G_t = Σ_{i in unit t} u_i.
 * u depends on the species only through its class c (its Y), so Σ_t G_t² = Σ_{c,c'} u_c u_c'
 * Σ_t n_tc n_tc': per point, a sum over the active class pairs (`classPairs`) or one pass
 * over the detections, whichever is shorter; both give the same number.
 */
/** Which sum gives Σ_t G_t²: "auto" picks the shorter; the others exist for the equality test. */
export type AccumulationPath = "auto" | "detections" | "pairs";

function veganAccumulationVariance(d: IncidenceData, logs: Float64Array, path: AccumulationPath = "auto"): number {
  const p = d.profile;
  const T = d.units;
  const K = logs.length;
  const u = new Float64Array(K);
  let sumV = 0;
  let yu2 = 0;
  let yu = 0;
  let y2u2 = 0;
  let lastActive = -1;
  for (let c = 0; c < K; c++) {
    const a = Math.exp(logs[c] as number);
    const V = a * (1 - a);
    const y = p.values[c] as number;
    const q = p.freqs[c] as number;
    sumV += q * V;
    const uc = y < T && V > 0 ? Math.sqrt(V / (y * (T - y))) : 0;
    u[c] = uc;
    if (uc > 0) lastActive = c;
    yu2 += q * y * uc * uc;
    yu += q * y * uc;
    y2u2 += q * y * y * uc * uc;
  }
  if (lastActive < 0) return Math.max(sumV, 0);
  let g2 = 0;
  const pairs = path === "detections" ? null : classPairs(d, path === "pairs");
  const pairTerms = ((lastActive + 1) * (lastActive + 2)) / 2;
  if (pairs && (path === "pairs" || pairTerms < (d.rowStart[T] as number))) {
    const { packed } = pairs;
    for (let ca = 0; ca <= lastActive; ca++) {
      const ua = u[ca] as number;
      if (ua === 0) continue;
      const base = (ca * (ca + 1)) / 2;
      let off = 0;
      for (let cb = 0; cb < ca; cb++) off += (packed[base + cb] as number) * (u[cb] as number);
      g2 += ua * (2 * off + (packed[base + ca] as number) * ua);
    }
  } else {
    const { rowStart, nzClass } = d;
    for (let t = 0; t < T; t++) {
      let g = 0;
      const end = rowStart[t + 1] as number;
      for (let j = rowStart[t] as number; j < end; j++) g += u[nzClass[j] as number] as number;
      g2 += g * g;
    }
  }
  return Math.max(sumV + T * (g2 - yu2) - yu * yu + y2u2, 0);
}

type Extrapolated = { richness: number; variance: number; coverage: number };

/**
 * S(N + m*) = S_obs + f̂0[1 − Â^{m*}] (Shen, Chao & Lin 2003; Chao et al. 2014), f̂0 the
 * Chao-group undetected richness; variance by the delta method over (f1, f2) with the
 * other classes lumped (Colwell et al. 2012), Ŝ = Chao1/Chao2; coverage
 * 1 − (f1/N)Â^{m*+1} (Chao & Jost 2012). Flat, with zero variance, when f̂0 = 0.
 */
function extrapolate(p: FrequencyProfile, mStar: number): Extrapolated {
  const S = p.observed;
  const N = p.size;
  const f0 = undetectedChao(p);
  if (!(f0 > 0) || N <= 1) return { richness: S, variance: 0, coverage: sampleCoverage(p) };
  const A = (N - 1) / N;
  const f1 = Dual.variable(p.f1, 0, 2);
  const f2 = Dual.variable(p.f2, 1, 2);
  const rest = S - p.f1 - p.f2;
  const f0d = p.f2 > 0 ? f1.mul(f1).mul(A).div(f2.mul(2)) : f1.mul(f1.sub(1)).mul(A).div(f2.add(1).mul(2));
  const nf0 = f0d.mul(N);
  const ratio = nf0.div(nf0.add(f1)); // Â
  const sObs = f1.add(f2).add(rest);
  const s = sObs.add(f0d.mul(ratio.pow(mStar).mul(-1).add(1)));
  const shat = S + f0;
  const variance = deltaVariance([s.g[0] as number, s.g[1] as number, 1], [p.f1, p.f2, rest], shat);
  const coverage = p.total > 0 ? 1 - (p.f1 / p.total) * Math.pow(ratio.v, mStar + 1) : 0;
  return { richness: s.v, variance, coverage };
}

function point(
  size: number,
  kind: CurveKind,
  richness: number,
  variance: number,
  coverage: number,
  seConditional: number | null,
): CurvePoint {
  const se = Math.sqrt(Math.max(variance, 0));
  return {
    size,
    kind,
    richness,
    se,
    lower: Math.max(0, richness - Z95 * se),
    upper: richness + Z95 * se,
    coverage,
    seConditional,
  };
}

/** Richness, unconditional 95% band and coverage at any effort (interpolated or extrapolated). */
export function curvePoint(
  p: FrequencyProfile,
  size: number,
  conditional?: (m: number, logs: Float64Array) => number,
): CurvePoint {
  const N = p.size;
  if (N === 0) return point(size, size === 0 ? "observed" : "extrapolated", 0, 0, 0, size === 0 ? 0 : null);
  if (size <= N) {
    const shat = chaoRichness(p).estimate;
    const r = interpolate(p, size, shat);
    const cond = conditional ? Math.sqrt(conditional(size, r.logs)) : null;
    return point(size, size === N ? "observed" : "rarefied", r.richness, r.varUnconditional, r.coverage, cond);
  }
  const e = extrapolate(p, size - N);
  return point(size, "extrapolated", e.richness, e.variance, e.coverage, null);
}

/**
 * ln[N!/(N−k)!] of every class k of a profile (the half of lnChooseRatio(N, k, m) that does
 * not depend on m when k ≤ m), kept per profile: a coverage search asks for the same
 * classes at twenty or so efforts.
 */
const fallingLogs = new WeakMap<FrequencyProfile, Float64Array>();

function fallingLogsOf(p: FrequencyProfile): Float64Array {
  let out = fallingLogs.get(p);
  if (!out) {
    out = new Float64Array(p.values.length).fill(NaN);
    fallingLogs.set(p, out);
  }
  return out;
}

/**
 * Sample coverage at effort m, the same number as curvePoint(p, m).coverage (same terms,
 * same order, each ln C(N−k, m)/C(N, m) formed exactly as lnChooseRatio forms it) without
 * the richness, its variance and Chao1: searches for the size at a given coverage ask for
 * it many times per bootstrap replicate.
 */
export function coverageAt(p: FrequencyProfile, m: number): number {
  const N = p.size;
  if (N === 0) return 0;
  if (m > N) return extrapolate(p, m - N).coverage;
  if (p.total <= 0) return 0;
  if (m >= N) return sampleCoverage(p);
  const falling = fallingLogsOf(p);
  let fallingM = NaN; // ln[N!/(N−m)!], shared by the classes with k > m
  let missed = 0;
  for (let i = 0; i < p.values.length; i++) {
    const k = p.values[i] as number;
    // lnChooseRatio(N, k, m), term for term (combinatorics.ts).
    let l: number;
    if (k <= 0 || m <= 0) l = 0;
    else if (N - k < m) l = -Infinity;
    else {
      const small = Math.min(k, m);
      const large = Math.max(k, m);
      if (small <= 8) {
        l = 0;
        for (let j = 0; j < small; j++) l += Math.log1p(-large / (N - j));
      } else {
        let right: number;
        if (small === k) {
          right = falling[i] as number;
          if (Number.isNaN(right)) falling[i] = right = lnFactorialRatio(N, N - small);
        } else {
          if (Number.isNaN(fallingM)) fallingM = lnFactorialRatio(N, N - small);
          right = fallingM;
        }
        l = lnFactorialRatio(N - large, N - large - small) - right;
      }
    }
    if (l < LOG_CUTOFF) break; // absenceLogs stops here too: the classes after it add 0
    missed += (p.freqs[i] as number) * k * Math.exp(l);
  }
  return Math.min(1, Math.max(0, 1 - (missed / p.total) * (N / (N - m))));
}

/**
 * Efforts for a curve of about `points` points from 1 to `endpoint` (default 2N), always
 * including N itself, as integers.
 */
export function curveSizes(N: number, points: number, endpoint = 2 * N): number[] {
  if (N === 0) return [0];
  const set = new Set<number>([N]);
  const k = Math.max(2, Math.floor(points));
  for (let i = 0; i < k; i++) set.add(Math.max(1, Math.round(1 + ((endpoint - 1) * i) / (k - 1))));
  return [...set].sort((a, b) => a - b);
}

export function abundanceCurveFromProfile(p: FrequencyProfile, sizes: readonly number[]): CurvePoint[] {
  return sizes.map((m) => curvePoint(p, m, (mm, logs) => heckVariance(p, mm, logs)));
}

export function incidenceCurveFromData(d: IncidenceData, sizes: readonly number[]): CurvePoint[] {
  return sizes.map((t) => curvePoint(d.profile, t, (_tt, logs) => veganAccumulationVariance(d, logs)));
}

/** vegan `rarefy(x, sample, se = TRUE)`: Hurlbert (1971) richness and Heck et al. (1975) se; S_obs, se 0 beyond n. */
export function rarefyProfile(
  p: FrequencyProfile,
  sizes: readonly number[],
): { size: number; richness: number; se: number }[] {
  return sizes.map((m) => {
    if (m >= p.size) return { size: m, richness: p.observed, se: 0 };
    const logs = absenceLogs(p, m);
    let richness = 0;
    for (let i = 0; i < logs.length; i++) richness += (p.freqs[i] as number) * -Math.expm1(logs[i] as number);
    return { size: m, richness, se: Math.sqrt(heckVariance(p, m, logs)) };
  });
}

/**
 * Mao Tau / vegan `specaccum(method = "exact")` richness and its default (conditional) sd;
 * lower/upper: τ ± z·σ with σ² = Σ_j (1 − α_jt)² Q_j − τ²/Ŝ, Ŝ = Chao2 (Colwell, Mao & Chang 2004).
 */
export function accumulateData(
  d: IncidenceData,
  at: readonly number[],
  path: AccumulationPath = "auto",
): { units: number; richness: number; sd: number; lower: number; upper: number }[] {
  const p = d.profile;
  const shat = chaoRichness(p).estimate;
  return at.map((t) => {
    const r = interpolate(p, t, shat);
    const se = Math.sqrt(r.varUnconditional);
    return {
      units: t,
      richness: r.richness,
      sd: Math.sqrt(veganAccumulationVariance(d, r.logs, path)),
      lower: Math.max(0, r.richness - Z95 * se),
      upper: r.richness + Z95 * se,
    };
  });
}
