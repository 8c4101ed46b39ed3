// Similarity between two zones (Chao, Chazdon, Colwell & Shen 2005, Ecology Letters
// 8:148–159) and multiplicative beta diversity from Hill numbers (Jost 2007, Ecology
// 88:2427–2439). Counts are per-species arrays aligned across zones.

import { checkCounts, DiversityInputError, invalidOption } from "./errors";
import { incidenceData } from "./incidence";

export type ZoneSimilarity = {
  /** Species seen in both zones. */
  shared: number;
  /** Classic Sørensen 2a/(2a + b + c) on presence (a = shared, b, c = seen in one zone only). */
  sorensen: number;
  /** Classic Jaccard a/(a + b + c) on presence. */
  jaccard: number;
  /** Chao et al. (2005) abundance- (or incidence-) based Sørensen 2ÛV̂/(Û + V̂), with the correction for unseen shared species. */
  sorensenAdjusted: number;
  /** Chao et al. (2005) Jaccard ÛV̂/(Û + V̂ − ÛV̂), with the correction for unseen shared species. */
  jaccardAdjusted: number;
  /** Û, V̂: estimated share of zone A's (B's) individuals or incidences that belong to species shared with the other zone. */
  uHat: number;
  vHat: number;
};

/**
 * Chao et al. (2005) for two aligned vectors of detections (individuals, or units with the
 * species). With n, m the totals and N1, N2 the effort factors (n, m for abundance; T1, T2
 * for incidence, eq. for replicated incidence data):
 *   Û = Σ_shared X_i/n + ((N2−1)/N2)·(f+1/(2 f+2))·Σ_shared (X_i/n)·I(Y_i = 1), truncated at 1,
 *   V̂ likewise with the roles exchanged; f+1, f+2 = shared species seen once, twice in zone B
 *   (f1+, f2+ in zone A); f+2 = 0 (f2+ = 0) is replaced by 1, as in the Chao group's SpadeR.
 * Empty zones (no detections in one of them) give 0 throughout.
 */
function chaoSimilarity(x: ArrayLike<number>, y: ArrayLike<number>, effortA: number, effortB: number): ZoneSimilarity {
  let n = 0;
  let m = 0;
  let onlyA = 0;
  let onlyB = 0;
  let shared = 0;
  for (let i = 0; i < x.length; i++) {
    const a = x[i] as number;
    const b = y[i] as number;
    n += a;
    m += b;
    if (a > 0 && b > 0) shared++;
    else if (a > 0) onlyA++;
    else if (b > 0) onlyB++;
  }
  if (n === 0 || m === 0)
    return { shared: 0, sorensen: 0, jaccard: 0, sorensenAdjusted: 0, jaccardAdjusted: 0, uHat: 0, vHat: 0 };
  let uTilde = 0;
  let vTilde = 0;
  let f1plus = 0;
  let f2plus = 0;
  let fplus1 = 0;
  let fplus2 = 0;
  let uSingletonB = 0; // Σ_shared X_i/n over species seen once in B
  let vSingletonA = 0; // Σ_shared Y_i/m over species seen once in A
  for (let i = 0; i < x.length; i++) {
    const a = x[i] as number;
    const b = y[i] as number;
    if (!(a > 0 && b > 0)) continue;
    uTilde += a; // sums of whole counts, divided once below: exactly 1 when every species is shared
    vTilde += b;
    if (a === 1) {
      f1plus++;
      vSingletonA += b;
    } else if (a === 2) f2plus++;
    if (b === 1) {
      fplus1++;
      uSingletonB += a;
    } else if (b === 2) fplus2++;
  }
  uTilde /= n;
  vTilde /= m;
  uSingletonB /= n;
  vSingletonA /= m;
  const uHat = Math.min(1, uTilde + ((effortB - 1) / effortB) * (fplus1 / (2 * Math.max(fplus2, 1))) * uSingletonB);
  const vHat = Math.min(1, vTilde + ((effortA - 1) / effortA) * (f1plus / (2 * Math.max(f2plus, 1))) * vSingletonA);
  const union = shared + onlyA + onlyB;
  return {
    shared,
    sorensen: (2 * shared) / (2 * shared + onlyA + onlyB),
    jaccard: shared / union,
    sorensenAdjusted: uHat + vHat > 0 ? (2 * uHat * vHat) / (uHat + vHat) : 0,
    jaccardAdjusted: uHat + vHat - uHat * vHat > 0 ? (uHat * vHat) / (uHat + vHat - uHat * vHat) : 0,
    uHat,
    vHat,
  };
}

function checkAligned(a: readonly unknown[], b: readonly unknown[], label: string): void {
  if (a.length !== b.length) {
    throw new DiversityInputError(
      "ragged-units",
      label,
      `both zones must list the same species (${a.length} vs ${b.length})`,
    );
  }
}

/** Abundance-based similarity of two zones (Chao et al. 2005); counts aligned per species, zeros allowed. */
export function zoneSimilarity(countsA: readonly number[], countsB: readonly number[]): ZoneSimilarity {
  const n = checkCounts(countsA, "countsA");
  const m = checkCounts(countsB, "countsB");
  checkAligned(countsA, countsB, "countsB");
  return chaoSimilarity(countsA, countsB, n, m);
}

/**
 * Incidence-based similarity (Chao et al. 2005): per species the number of units (complete
 * sessions) of each zone that hold it; totals are incidences, the effort factors (T−1)/T use
 * each zone's number of units (empty units count).
 */
export function zoneSimilarityIncidence(
  unitsA: readonly (readonly number[])[],
  unitsB: readonly (readonly number[])[],
): ZoneSimilarity {
  const a = incidenceData(unitsA);
  const b = incidenceData(unitsB);
  const width = (u: readonly (readonly number[])[]): number => (u.length > 0 ? (u[0] as readonly number[]).length : -1);
  const wa = width(unitsA);
  const wb = width(unitsB);
  if (wa >= 0 && wb >= 0 && wa !== wb)
    throw new DiversityInputError("ragged-units", "unitsB", `both zones must list the same species (${wa} vs ${wb})`);
  const S = Math.max(wa, wb, 0);
  return chaoSimilarity(incidenceCounts(unitsA, S), incidenceCounts(unitsB, S), a.units, b.units);
}

function incidenceCounts(units: readonly (readonly number[])[], width: number): Float64Array {
  const y = new Float64Array(width);
  for (const row of units) for (let s = 0; s < row.length; s++) if ((row[s] as number) > 0) y[s] = (y[s] as number) + 1;
  return y;
}

export type HillBeta = { order: number; gamma: number; alpha: number; beta: number; zones: number };

/**
 * Multiplicative beta diversity of order q from observed relative abundances, zones weighted
 * equally (Jost 2007): gamma = Hill number of the pooled p̄_i = (1/N)Σ_j p_ij; alpha =
 * [(1/N) Σ_j Σ_i p_ij^q]^{1/(1−q)} (q ≠ 1), exp((1/N) Σ_j H_j) (q = 1); beta = gamma/alpha,
 * between 1 (identical zones) and N (no species shared). Observed values, not estimates.
 */
export function hillBeta(countsByZone: readonly (readonly number[])[], order: number): HillBeta {
  if (!Array.isArray(countsByZone) || countsByZone.length === 0)
    throw invalidOption("countsByZone", "expected at least one zone");
  if (typeof order !== "number" || !(order >= 0) || !Number.isFinite(order))
    throw invalidOption("order", `order must be a finite number ≥ 0 (got ${String(order)})`);
  const totals = countsByZone.map((c, j) => checkCounts(c, `countsByZone[${j}]`));
  const S = (countsByZone[0] as readonly number[]).length;
  countsByZone.forEach((c, j) => {
    if (c.length !== S)
      throw new DiversityInputError(
        "ragged-units",
        `countsByZone[${j}]`,
        `every zone must list the same ${S} species (this one has ${c.length})`,
      );
    if (totals[j] === 0)
      throw invalidOption(`countsByZone[${j}]`, "a zone with no individuals has no relative abundances; leave it out");
  });
  const N = countsByZone.length;
  const q = order;
  const pooled = new Float64Array(S);
  let alphaSum = 0;
  countsByZone.forEach((c, j) => {
    const t = totals[j] as number;
    for (let i = 0; i < S; i++) {
      const x = c[i] as number;
      if (x === 0) continue;
      const p = x / t;
      pooled[i] = (pooled[i] as number) + p / N;
      alphaSum += q === 0 ? 1 : q === 1 ? -p * Math.log(p) : Math.pow(p, q);
    }
  });
  const alpha = q === 1 ? Math.exp(alphaSum / N) : Math.pow(alphaSum / N, 1 / (1 - q));
  let g = 0;
  for (let i = 0; i < S; i++) {
    const p = pooled[i] as number;
    if (p === 0) continue;
    g += q === 0 ? 1 : q === 1 ? -p * Math.log(p) : Math.pow(p, q);
  }
  const gamma = q === 1 ? Math.exp(g) : Math.pow(g, 1 / (1 - q));
  return { order: q, gamma, alpha, beta: gamma / alpha, zones: N };
}
