// Is one zone richer than another? The difference of their richness at one common sample
// coverage (Chao & Jost 2012), with a bootstrap interval: each replicate redraws every
// zone from its estimated assemblage (Chao et al. 2014: detected species' probabilities
// adjusted for the coverage deficit, plus the estimated undetected species), standardises
// both to the same fixed coverage and takes the difference. Interval: observed difference
// ± 1.96 × bootstrap sd. "More"/"fewer" only when that interval excludes 0.
import { bootstrapAssemblage, forgetHillBootstraps } from "@/lib/diversity/hill";
import { buildProfile, type FrequencyProfile } from "@/lib/diversity/profile";
import { Rng, binomial, multinomial } from "@/lib/diversity/random";
import { sampleCoverage } from "@/lib/diversity/abundance";
import { sizeForCoverage } from "@/lib/diversity/compare";
import { coverageAt, curvePoint } from "@/lib/diversity/curves";
import { undetectedChao } from "@/lib/diversity/richness";

export type Sample =
  | { kind: "abundance"; counts: readonly number[] }
  | { kind: "incidence"; frequencies: readonly number[]; units: number };

const Z95 = 1.959963984540054;

export function profileOf(s: Sample): FrequencyProfile {
  if (s.kind === "abundance")
    return buildProfile(
      "abundance",
      s.counts,
      s.counts.reduce((a, b) => a + b, 0),
    );
  return buildProfile("incidence", s.frequencies, s.units);
}

/**
 * The size at which a profile reaches coverage c: the same answer as the engine's
 * sizeForCoverage (the integer m ≤ N whose rarefied coverage is closest to c, or the
 * analytic m beyond N), found by a safeguarded regula falsi instead of plain bisection,
 * since the bootstrap asks it hundreds of times per zone.
 */
export function sizeAtCoverage(p: FrequencyProfile, c: number, guess?: number): number {
  const N = p.size;
  if (N === 0) return 0;
  const full = sampleCoverage(p);
  if (c > full) return sizeForCoverage(p, c);
  const cov = (m: number) => coverageAt(p, m);
  let lo = 0;
  let hi = N;
  let cLo = 0;
  let cHi = full;
  // With a guess (a bootstrap replicate: the observed sample's size at c), the bracket is
  // first narrowed around it, widening by doubling until it holds c: coverage rises with
  // the size, so the same lo < size ≤ hi is found as from [0, N], in fewer evaluations.
  if (guess !== undefined && guess > 0 && guess < N) {
    const g = Math.round(guess);
    const cg = cov(g);
    let step = Math.max(1, Math.ceil(g / 64));
    if (cg >= c) {
      hi = g;
      cHi = cg;
      for (;;) {
        const m = hi - step;
        if (m <= lo) break;
        const cm = cov(m);
        if (cm >= c) {
          hi = m;
          cHi = cm;
          step *= 2;
        } else {
          lo = m;
          cLo = cm;
          break;
        }
      }
    } else {
      lo = g;
      cLo = cg;
      for (;;) {
        const m = lo + step;
        if (m >= hi) break;
        const cm = cov(m);
        if (cm < c) {
          lo = m;
          cLo = cm;
          step *= 2;
        } else {
          hi = m;
          cHi = cm;
          break;
        }
      }
    }
  }
  let bisect = false;
  while (hi - lo > 1) {
    let m: number;
    if (bisect || cHi <= cLo) m = Math.floor((lo + hi) / 2);
    else m = Math.min(hi - 1, Math.max(lo + 1, Math.round(lo + ((hi - lo) * (c - cLo)) / (cHi - cLo))));
    const width = hi - lo;
    const cm = cov(m);
    if (cm >= c) {
      hi = m;
      cHi = cm;
    } else {
      lo = m;
      cLo = cm;
    }
    bisect = !bisect && hi - lo > width / 2; // a falsi step that did not halve the bracket: bisect next
  }
  return Math.abs(cLo - c) < Math.abs(cHi - c) ? lo : hi;
}

/** Richness of a profile at coverage c (interpolated or extrapolated). */
export function richnessAtCoverage(p: FrequencyProfile, c: number, guess?: number): number {
  if (p.size === 0) return 0;
  return curvePoint(p, sizeAtCoverage(p, c, guess)).richness;
}

/**
 * Detection probabilities of the estimated incidence assemblage (Chao et al. 2014,
 * incidence analogue): detected π = (Y/T)[1 − λ(1 − Y/T)^T], λ = (U/T)(1 − Ĉ)/Σ(Y/T)(1 − Y/T)^T,
 * plus ⌈Q̂0⌉ undetected species each with (U/T)(1 − Ĉ)/⌈Q̂0⌉.
 */
function incidenceAssemblage(p: FrequencyProfile): Float64Array {
  const T = p.size;
  const C = sampleCoverage(p);
  const q0 = C < 1 ? Math.ceil(undetectedChao(p)) : 0;
  const out = new Float64Array(p.observed + q0);
  const missing = (p.total / T) * (1 - C);
  let denom = 0;
  for (let i = 0; i < p.values.length; i++) {
    const r = (p.values[i] ?? 0) / T;
    denom += (p.freqs[i] ?? 0) * r * Math.pow(1 - r, T);
  }
  const lambda = q0 > 0 && denom > 0 ? missing / denom : 0;
  let j = 0;
  for (let i = 0; i < p.values.length; i++) {
    const r = (p.values[i] ?? 0) / T;
    const pr = Math.min(1, Math.max(0, r * (1 - lambda * Math.pow(1 - r, T))));
    for (let k = 0; k < (p.freqs[i] ?? 0); k++) out[j++] = pr;
  }
  for (let u = 0; u < q0; u++) out[j++] = Math.min(1, missing / q0);
  return out;
}

function redraw(p: FrequencyProfile, rng: Rng, assemblage: Float64Array): FrequencyProfile {
  if (p.kind === "abundance") {
    const x = multinomial(rng, p.size, assemblage);
    return buildProfile("abundance", x, p.size);
  }
  const y = new Float64Array(assemblage.length);
  for (let i = 0; i < assemblage.length; i++) y[i] = binomial(rng, p.size, assemblage[i] ?? 0);
  return buildProfile("incidence", y, p.size);
}

/**
 * Replicates already drawn in this process, by everything they depend on (the sample, the
 * coverage, the number of replicates and the seed): after one more approval only the zone
 * it touched is redrawn. The same inputs give the same numbers, so a hit changes nothing.
 */
const drawn = new Map<string, Float64Array>();
const MAX_DRAWN = 64;

/** Forgets the kept replicates, these and the engine's Hill q = 1, 2 ones (the benchmark's cold figure). */
export function forgetBootstraps(): void {
  drawn.clear();
  forgetHillBootstraps();
}

/** Richness at coverage c of `replicates` redraws of the sample's estimated assemblage (fixed seed). */
export function bootstrapAtCoverage(s: Sample, c: number, options: { replicates: number; seed: number }): Float64Array {
  const key = JSON.stringify([
    s.kind,
    s.kind === "abundance" ? s.counts : s.frequencies,
    s.kind === "abundance" ? 0 : s.units,
    c,
    options.replicates,
    options.seed,
  ]);
  const hit = drawn.get(key);
  if (hit) {
    drawn.delete(key);
    drawn.set(key, hit);
    return hit.slice();
  }
  const out = drawReplicates(s, c, options);
  drawn.set(key, out.slice());
  if (drawn.size > MAX_DRAWN) drawn.delete(drawn.keys().next().value!);
  return out;
}

function drawReplicates(s: Sample, c: number, options: { replicates: number; seed: number }): Float64Array {
  const p = profileOf(s);
  const assemblage = p.kind === "abundance" ? bootstrapAssemblage(p, sampleCoverage(p)) : incidenceAssemblage(p);
  const rng = new Rng(options.seed);
  const out = new Float64Array(options.replicates);
  // Every replicate has the sample's size; where the sample reaches c, its size there is a close guess.
  const guess = c <= sampleCoverage(p) ? sizeAtCoverage(p, c) : undefined;
  for (let r = 0; r < options.replicates; r++) out[r] = richnessAtCoverage(redraw(p, rng, assemblage), c, guess);
  return out;
}

export type Difference = { difference: number; lower: number; upper: number; sd: number };

/**
 * The difference a − b at one coverage from each zone's estimate and its own bootstrap
 * replicates (independent draws, so replicate r of the difference is a[r] − b[r]):
 * observed difference ± 1.96 × sd of the replicate differences.
 */
export function differenceInterval(estimateA: number, estimateB: number, a: Float64Array, b: Float64Array): Difference {
  const difference = estimateA - estimateB;
  const diffs: number[] = [];
  for (let r = 0; r < Math.min(a.length, b.length); r++) {
    const d = (a[r] as number) - (b[r] as number);
    if (Number.isFinite(d)) diffs.push(d);
  }
  let mean = 0;
  for (const d of diffs) mean += d;
  mean /= Math.max(1, diffs.length);
  let ss = 0;
  for (const d of diffs) ss += (d - mean) ** 2;
  const sd = diffs.length > 1 ? Math.sqrt(ss / (diffs.length - 1)) : 0;
  return { difference, lower: difference - Z95 * sd, upper: difference + Z95 * sd, sd };
}

/** The difference a − b of richness at coverage c, with its bootstrap interval (fixed seeds: `seed` for a, `seed + 1` for b). */
export function differenceAtCoverage(
  a: Sample,
  b: Sample,
  c: number,
  options: { replicates: number; seed: number },
): Difference {
  return differenceInterval(
    richnessAtCoverage(profileOf(a), c),
    richnessAtCoverage(profileOf(b), c),
    bootstrapAtCoverage(a, c, options),
    bootstrapAtCoverage(b, c, { ...options, seed: options.seed + 1 }),
  );
}
