// Frequency counts ("f_k"): how many species were detected exactly k times. Every
// estimator here depends on the data only through them, so work scales with the number
// of distinct detection counts rather than with species or individuals.

export type DataKind = "abundance" | "incidence";

export interface FrequencyProfile {
  readonly kind: DataKind;
  /** Sampling effort: individuals n (abundance) or sampling units T (incidence). */
  readonly size: number;
  /** Denominator of sample coverage: n (abundance) or total incidences U (incidence). */
  readonly total: number;
  readonly observed: number;
  /** Distinct positive detection counts k, ascending. */
  readonly values: Float64Array;
  /** Number of species detected exactly values[i] times. */
  readonly freqs: Float64Array;
  readonly f1: number;
  readonly f2: number;
}

/** Groups positive detection counts (individuals per species, or units per species). */
export function buildProfile(kind: DataKind, detections: ArrayLike<number>, size: number): FrequencyProfile {
  let positive = 0;
  for (let i = 0; i < detections.length; i++) if ((detections[i] ?? 0) > 0) positive++;
  const sorted = new Float64Array(positive);
  let j = 0;
  let total = 0;
  for (let i = 0; i < detections.length; i++) {
    const v = detections[i] ?? 0;
    if (v > 0) {
      sorted[j++] = v;
      total += v;
    }
  }
  sorted.sort();
  let distinct = 0;
  for (let i = 0; i < positive; i++) if (i === 0 || sorted[i] !== sorted[i - 1]) distinct++;
  const values = new Float64Array(distinct);
  const freqs = new Float64Array(distinct);
  let c = -1;
  for (let i = 0; i < positive; i++) {
    const v = sorted[i] ?? 0;
    if (i === 0 || v !== sorted[i - 1]) {
      c++;
      values[c] = v;
    }
    freqs[c] = (freqs[c] ?? 0) + 1;
  }
  return {
    kind,
    size,
    total,
    observed: positive,
    values,
    freqs,
    f1: frequencyOf(values, freqs, 1),
    f2: frequencyOf(values, freqs, 2),
  };
}

export function frequencyOf(values: Float64Array, freqs: Float64Array, k: number): number {
  for (let i = 0; i < values.length && (values[i] ?? 0) <= k; i++) if (values[i] === k) return freqs[i] ?? 0;
  return 0;
}

/** f_1 … f_10 (index 0 … 9), the "rare"/"infrequent" classes of ACE and ICE. */
export function rareFrequencies(p: FrequencyProfile, cutoff = 10): Float64Array {
  const out = new Float64Array(cutoff);
  for (let i = 0; i < p.values.length; i++) {
    const k = p.values[i] ?? 0;
    if (k > cutoff) break;
    out[k - 1] = p.freqs[i] ?? 0;
  }
  return out;
}
