// Incidence-based statistics from sampling units (rows) × species (columns): Chao2 and
// the jackknives as vegan `specpool` reports them, ICE, and incidence sample coverage.

import { coverageEstimator, sampleCoverage } from "./abundance";
import { deltaVariance } from "./dual";
import { checkUnits, describe, isCount } from "./errors";
import { buildProfile, rareFrequencies, type FrequencyProfile } from "./profile";
import { chaoRichness, logNormalInterval, normalInterval, ZERO_ESTIMATE, type Estimate } from "./richness";

/** Sparse summary of an incidence matrix, built once and shared by every incidence method. */
export interface IncidenceData {
  readonly units: number;
  readonly profile: FrequencyProfile;
  /** Row pointers into `nzClass`: entries rowStart[t] … rowStart[t+1]−1 belong to unit t. */
  readonly rowStart: Int32Array;
  /** For each detection, the index in profile.values of its species' incidence count. */
  readonly nzClass: Int32Array;
  /** Number of unique species (found in one unit only) in each unit. */
  readonly uniquesPerUnit: Float64Array;
  /** Units holding at least one infrequent species (found in ≤ 10 units). */
  readonly infrequentUnits: number;
}

export type IncidenceStats = {
  units: number;
  observed: number;
  uniques: number;
  duplicates: number;
  /** Total incidences U = Σ Y_i. */
  incidences: number;
  chao2: Estimate;
  ice: Estimate;
  jack1: Estimate;
  jack2: Estimate;
  coverage: number;
};

/** Validates the unit × species matrix and summarizes it. */
export function incidenceData(units: readonly (readonly number[])[]): IncidenceData {
  if (!Array.isArray(units)) checkUnits(units, "units"); // throws with the right message
  const T = units.length;
  const width = T > 0 && Array.isArray(units[0]) ? (units[0] as readonly number[]).length : 0;
  const y = new Float64Array(width);
  const rowStart = new Int32Array(T + 1);
  let cols = new Int32Array(Math.max(16, T * 8));
  let nnz = 0;
  // One pass validates and collects detections; zero cells (most of them) cost one comparison.
  for (let t = 0; t < T; t++) {
    const row = units[t] as readonly number[];
    if (!Array.isArray(row) || row.length !== width) checkUnits(units, "units"); // throws: names the bad row
    for (let s = 0; s < width; s++) {
      const v = row[s];
      if (v === 0) continue;
      if (!isCount(v)) throw describe(v, `units[${t}][${s}]`);
      if (nnz === cols.length) {
        const grown = new Int32Array(cols.length * 2);
        grown.set(cols);
        cols = grown;
      }
      cols[nnz++] = s;
      y[s] = (y[s] as number) + 1;
    }
    rowStart[t + 1] = nnz;
  }
  return summarise(T, y, rowStart, cols);
}

/**
 * The same summary from each unit's list of detected species (indices into 0 … width−1):
 * presence only, so a large unit × species grid never has to be built. A species listed
 * twice in one unit counts once.
 */
export function incidenceDataFromLists(lists: readonly (readonly number[])[], width: number): IncidenceData {
  if (!Number.isInteger(width) || width < 0) throw describe(width, "width");
  if (!Array.isArray(lists)) throw describe(lists, "lists");
  const T = lists.length;
  const y = new Float64Array(width);
  const rowStart = new Int32Array(T + 1);
  const seenIn = new Int32Array(width).fill(-1);
  let cols = new Int32Array(Math.max(16, T * 8));
  let nnz = 0;
  for (let t = 0; t < T; t++) {
    const list = lists[t];
    if (!Array.isArray(list)) throw describe(list, `lists[${t}]`);
    for (let j = 0; j < list.length; j++) {
      const s = list[j];
      if (!Number.isInteger(s) || (s as number) < 0 || (s as number) >= width) throw describe(s, `lists[${t}][${j}]`);
      if (seenIn[s as number] === t) continue;
      seenIn[s as number] = t;
      if (nnz === cols.length) {
        const grown = new Int32Array(cols.length * 2);
        grown.set(cols);
        cols = grown;
      }
      cols[nnz++] = s as number;
      y[s as number] = (y[s as number] as number) + 1;
    }
    rowStart[t + 1] = nnz;
  }
  return summarise(T, y, rowStart, cols);
}

/** Shared tail of both builders: the incidence profile and the per-unit facts ICE needs. */
function summarise(T: number, y: Float64Array, rowStart: Int32Array, cols: Int32Array): IncidenceData {
  const nnz = rowStart[T] as number;
  const profile = buildProfile("incidence", y, T);
  const classOf = new Int32Array(T + 1).fill(-1);
  profile.values.forEach((v, i) => {
    classOf[v] = i;
  });
  const nzClass = new Int32Array(nnz);
  const uniquesPerUnit = new Float64Array(T);
  let infrequentUnits = 0;
  for (let t = 0; t < T; t++) {
    let uniques = 0;
    let infrequent = false;
    for (let j = rowStart[t] as number; j < (rowStart[t + 1] as number); j++) {
      const yi = y[cols[j] as number] as number;
      nzClass[j] = classOf[yi] as number;
      if (yi === 1) uniques++;
      if (yi <= 10) infrequent = true;
    }
    uniquesPerUnit[t] = uniques;
    if (infrequent) infrequentUnits++;
  }
  return { units: T, profile, rowStart, nzClass, uniquesPerUnit, infrequentUnits };
}

/**
 * ICE (Lee & Chao 1994; infrequent = found in ≤ 10 units, Chazdon et al. 1998), classic
 * form: C = 1 − Q1/N_infr, γ² = max[(S_infr/C)(m_infr/(m_infr−1)) Σ j(j−1)Q_j / N_infr² − 1, 0].
 * se: delta method over Q1..Q10 (m_infr fixed). No infrequent species: observed.
 * C = 0 (every infrequent species unique): falls back to Chao2.
 */
export function iceEstimate(d: IncidenceData): Estimate {
  const p = d.profile;
  const S = p.observed;
  const rare = rareFrequencies(p, 10);
  let sInfr = 0;
  let nInfr = 0;
  rare.forEach((v, i) => {
    sInfr += v;
    nInfr += (i + 1) * v;
  });
  if (nInfr === 0) return logNormalInterval(S, S, 0, p); // no infrequent species: observed, with the fallback interval
  const m = d.infrequentUnits;
  if (p.f1 >= nInfr || m <= 1) return chaoRichness(p);
  const r = coverageEstimator(rare, S - sInfr, { unitsFactor: m / (m - 1), squaredDenominator: true });
  return logNormalInterval(S, r.value, deltaVariance(r.grad, rare, r.value), p);
}

/**
 * First-order jackknife S + Q1(T−1)/T (Burnham & Overton 1978) with the se of Heltshe &
 * Forrester (1983): var = ((T−1)/T)(Σ_u r_u² − Q1²/T), r_u = uniques in unit u.
 * Normal 95% interval floored at the observed richness.
 */
export function jackknife1(d: IncidenceData): Estimate {
  const p = d.profile;
  const T = d.units;
  if (T === 0 || p.observed === 0) return { ...ZERO_ESTIMATE };
  const q1 = p.f1;
  let sumSq = 0;
  for (let t = 0; t < T; t++) sumSq += (d.uniquesPerUnit[t] as number) ** 2;
  const variance = ((T - 1) / T) * (sumSq - (q1 * q1) / T); // Heltshe & Forrester (1983)
  return normalInterval(p.observed, p.observed + (q1 * (T - 1)) / T, variance);
}

/**
 * Second-order jackknife S + Q1(2T−3)/T − Q2(T−2)²/(T(T−1)) (Burnham & Overton 1978), as
 * vegan `specpool` (S when T = 1). vegan has no se for it; ours is the delta method of the
 * frequency counts (Chao 1987) with Ŝ = jack2; normal interval floored at observed.
 */
export function jackknife2(d: IncidenceData): Estimate {
  const p = d.profile;
  const T = d.units;
  const S = p.observed;
  if (T === 0 || S === 0) return { ...ZERO_ESTIMATE };
  if (T === 1) return { estimate: S, se: 0, lower: S, upper: S, intervalMethod: "none" }; // one unit: no information on unseen species
  const a = (2 * T - 3) / T;
  const b = ((T - 2) * (T - 2)) / (T * (T - 1));
  const estimate = S + p.f1 * a - p.f2 * b;
  const rest = S - p.f1 - p.f2;
  const variance = deltaVariance([1 + a, 1 - b, 1], [p.f1, p.f2, rest], estimate);
  return normalInterval(S, estimate, variance);
}

export function incidenceStatsFromData(d: IncidenceData): IncidenceStats {
  const p = d.profile;
  return {
    units: d.units,
    observed: p.observed,
    uniques: p.f1,
    duplicates: p.f2,
    incidences: p.total,
    chao2: chaoRichness(p),
    ice: iceEstimate(d),
    jack1: jackknife1(d),
    jack2: jackknife2(d),
    coverage: sampleCoverage(p),
  };
}

/** All incidence statistics; units[t][s] > 0 means species s was found in sampling unit t. */
export function incidenceStats(units: readonly (readonly number[])[]): IncidenceStats {
  return incidenceStatsFromData(incidenceData(units));
}
