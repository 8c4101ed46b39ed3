// Seeded pseudo-random numbers for the bootstrap and the benchmark: xoshiro128**
// (Blackman & Vigna 2018) seeded through splitmix32, and an exact binomial sampler.

import { lnChoose } from "./combinatorics";

export class Rng {
  private a: number;
  private b: number;
  private c: number;
  private d: number;

  constructor(seed: number) {
    let state = seed | 0;
    const splitmix = (): number => {
      state = (state + 0x9e3779b9) | 0;
      let z = state;
      z = Math.imul(z ^ (z >>> 16), 0x85ebca6b);
      z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35);
      return (z ^ (z >>> 16)) >>> 0;
    };
    this.a = splitmix();
    this.b = splitmix();
    this.c = splitmix();
    this.d = splitmix();
  }

  /** Next 32-bit unsigned integer (xoshiro128**). */
  nextUint32(): number {
    const result = Math.imul(rotl(Math.imul(this.b, 5), 7), 9) >>> 0;
    const t = this.b << 9;
    this.c ^= this.a;
    this.d ^= this.b;
    this.b ^= this.c;
    this.a ^= this.d;
    this.c ^= t;
    this.d = rotl(this.d, 11);
    return result;
  }

  /** Uniform double in [0, 1) with 53 random bits. */
  next(): number {
    const hi = this.nextUint32() >>> 5;
    const lo = this.nextUint32() >>> 6;
    return (hi * 67108864 + lo) / 9007199254740992;
  }

  /** Uniform integer in [0, n). */
  below(n: number): number {
    return Math.floor(this.next() * n);
  }
}

function rotl(x: number, k: number): number {
  return (x << k) | (x >>> (32 - k));
}

/**
 * Binomial(N, p) by inversion with a sequential search that starts at the mode and moves
 * outward, so the expected work is O(sqrt(N p (1−p))) (Devroye 1986, ch. X; from memory).
 * Exact up to rounding of the probabilities.
 */
export function binomial(rng: Rng, N: number, p: number): number {
  if (N <= 0 || p <= 0) return 0;
  if (p >= 1) return N;
  if (p > 0.5) return N - binomial(rng, N, 1 - p);
  const q = 1 - p;
  const ratio = p / q;
  const mode = Math.min(N, Math.floor((N + 1) * p));
  const pmfMode = Math.exp(lnChoose(N, mode) + mode * Math.log(p) + (N - mode) * Math.log1p(-p));
  let u = rng.next() - pmfMode;
  if (u <= 0) return mode;
  let lo = mode;
  let hi = mode;
  let pLo = pmfMode;
  let pHi = pmfMode;
  while (true) {
    let moved = false;
    if (lo > 0 && pLo > 0) {
      pLo *= lo / ((N - lo + 1) * ratio);
      lo -= 1;
      u -= pLo;
      if (u <= 0) return lo;
      moved = true;
    }
    if (hi < N && pHi > 0) {
      pHi *= ((N - hi) / (hi + 1)) * ratio;
      hi += 1;
      u -= pHi;
      if (u <= 0) return hi;
      moved = true;
    }
    if (!moved) return mode; // rounding left a sliver of probability unassigned
  }
}

/** Multinomial(N, probs) by sequential conditional binomials; probs need not sum to 1. */
export function multinomial(rng: Rng, N: number, probs: Float64Array): Float64Array {
  const k = probs.length;
  const out = new Float64Array(k);
  const suffix = new Float64Array(k + 1);
  for (let i = k - 1; i >= 0; i--) suffix[i] = (suffix[i + 1] ?? 0) + (probs[i] ?? 0);
  let left = N;
  for (let i = 0; i < k && left > 0; i++) {
    const rest = suffix[i] ?? 0;
    if (i === k - 1 || rest <= 0) {
      out[i] = left;
      break;
    }
    const x = binomial(rng, left, Math.min(1, (probs[i] ?? 0) / rest));
    out[i] = x;
    left -= x;
  }
  return out;
}
