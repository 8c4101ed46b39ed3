// Public interface of the diversity engine: pure TypeScript, no runtime dependencies.

import { abundanceProfile } from "./abundance";
import {
  abundanceCurveFromProfile,
  accumulateData,
  curveSizes,
  incidenceCurveFromData,
  rarefyProfile,
  type CurvePoint,
} from "./curves";
import { checkSize, invalidOption } from "./errors";
import { incidenceData } from "./incidence";
import {
  hillAtCoverageFromProfile,
  hillCurveFromProfile,
  type HillCoverageOptions,
  type HillCoverageRow,
  type HillCurveOptions,
  type HillCurveRow,
} from "./hill-curves";
import { hillProfileFromProfile, type HillProfileOptions, type HillProfileRow } from "./hill-profile";

export type { Estimate } from "./richness";
export type { AbundanceStats } from "./abundance";
export type { IncidenceStats } from "./incidence";
export type { HillSummary, HillValue, BootstrapOptions } from "./hill";
export type { CurvePoint, CurveKind } from "./curves";
export type { CompareInput, ZoneAtEffort, ZoneComparison } from "./compare";
export type { DiversityInput, DiversityResults } from "./results";

export { abundanceStats } from "./abundance";
export { incidenceStats } from "./incidence";
export { compareZones } from "./compare";
export { diversityResults, ENGINE_VERSION } from "./results";
export { DiversityInputError, type DiversityInputErrorCode } from "./errors";
export { HILL_BOOTSTRAP_REPLICATES, HILL_BOOTSTRAP_SEED } from "./hill";
export { HILL_CURVE_REPLICATES, HILL_CURVE_SEED, HILL_CURVE_POINTS } from "./hill-curves";
export type { CurvePart, HillCurveRow, HillCurveOptions, HillCoverageRow, HillCoverageOptions } from "./hill-curves";
export type { HillProfileRow, HillProfileOptions } from "./hill-profile";
export { HILL_PROFILE_REPLICATES } from "./hill-profile";
export type { IntervalMethod } from "./richness";
export { zoneSimilarity, zoneSimilarityIncidence, hillBeta, type ZoneSimilarity, type HillBeta } from "./similarity";

function checkSizes(sizes: readonly number[], label: string): void {
  if (!Array.isArray(sizes)) throw invalidOption(label, "expected an array of sizes");
  sizes.forEach((m, i) => checkSize(m, `${label}[${i}]`));
}

/**
 * vegan `rarefy(x, sample, se = TRUE)`: expected richness in a random subsample of `size`
 * individuals (Hurlbert 1971) and its se conditional on the sample (Heck et al. 1975).
 * Sizes above the sample give the observed richness with se 0, as vegan does.
 */
export function rarefaction(
  counts: readonly number[],
  sizes: readonly number[],
): { size: number; richness: number; se: number }[] {
  const p = abundanceProfile(counts);
  checkSizes(sizes, "sizes");
  return rarefyProfile(p, sizes);
}

/**
 * Expected species accumulation over t = 1..T units (Mao Tau; vegan `specaccum(method =
 * "exact")` richness and its default conditional sd), with the 95% band of the
 * unconditional variance of Colwell, Mao & Chang (2004), Ŝ = Chao2. `at` picks units.
 */
export function accumulation(
  units: readonly (readonly number[])[],
  at?: readonly number[],
): { units: number; richness: number; sd: number; lower: number; upper: number }[] {
  const d = incidenceData(units);
  const T = d.units;
  const ts = at ?? Array.from({ length: T }, (_, i) => i + 1);
  checkSizes(ts, "at");
  ts.forEach((t, i) => {
    if (t < 1 || t > T)
      throw invalidOption(
        `at[${i}]`,
        `units must lie between 1 and ${T} (got ${t}); use incidenceCurve to extrapolate`,
      );
  });
  return accumulateData(d, ts);
}

export type CurveOptions = { points?: number; endpoint?: number; sizes?: readonly number[] };

function resolveSizes(N: number, o: CurveOptions, label: string): number[] {
  if (o.sizes) {
    checkSizes(o.sizes, `${label}.sizes`);
    return [...o.sizes];
  }
  const points = o.points ?? 40;
  if (!Number.isInteger(points) || points < 2)
    throw invalidOption(`${label}.points`, `points must be an integer ≥ 2 (got ${points})`);
  const endpoint = o.endpoint ?? 2 * N;
  checkSize(endpoint, `${label}.endpoint`);
  return curveSizes(N, points, endpoint);
}

/** Individual-based rarefaction and extrapolation curve (default to twice the sample), with 95% band and coverage. */
export function abundanceCurve(counts: readonly number[], options: CurveOptions = {}): CurvePoint[] {
  const p = abundanceProfile(counts);
  return abundanceCurveFromProfile(p, resolveSizes(p.size, options, "options"));
}

/** Sample-based accumulation and extrapolation curve (default to twice the units), with 95% band and coverage. */
export function incidenceCurve(units: readonly (readonly number[])[], options: CurveOptions = {}): CurvePoint[] {
  const d = incidenceData(units);
  return incidenceCurveFromData(d, resolveSizes(d.units, options, "options"));
}

/**
 * Size-based rarefaction/extrapolation of Hill numbers q = 0, 1, 2 for abundance data
 * (Chao et al. 2014), sizes up to twice the sample, with seeded bootstrap 95% bands
 * (default HILL_CURVE_REPLICATES replicates, seed HILL_CURVE_SEED). `coverage` is the
 * sample coverage at each size (Chao & Jost 2012): the sample-completeness curve.
 */
export function hillCurve(counts: readonly number[], options: HillCurveOptions = {}): HillCurveRow[] {
  return hillCurveFromProfile(abundanceProfile(counts), options, "options");
}

/** The same for incidence data: complete sessions as rows (empty rows count as units); size = number of units. */
export function hillCurveIncidence(
  units: readonly (readonly number[])[],
  options: HillCurveOptions = {},
): HillCurveRow[] {
  return hillCurveFromProfile(incidenceData(units).profile, options, "options");
}

/** Hill numbers at given sample-coverage levels (Chao & Jost 2012); size fractional where interpolated. */
export function hillAtCoverage(counts: readonly number[], options: HillCoverageOptions): HillCoverageRow[] {
  return hillAtCoverageFromProfile(abundanceProfile(counts), options, "options");
}

/** The same for incidence data (size = number of units). */
export function hillAtCoverageIncidence(
  units: readonly (readonly number[])[],
  options: HillCoverageOptions,
): HillCoverageRow[] {
  return hillAtCoverageFromProfile(incidenceData(units).profile, options, "options");
}

/** Asymptotic diversity profile over orders in [0, 2] with bootstrap se and 95% intervals (see hill-profile.ts for each q's estimator). */
export function hillProfile(counts: readonly number[], options: HillProfileOptions): HillProfileRow[] {
  return hillProfileFromProfile(abundanceProfile(counts), options, "options");
}

/** The same for incidence data, orders 0, 1 and 2 only. */
export function hillProfileIncidence(
  units: readonly (readonly number[])[],
  options: HillProfileOptions,
): HillProfileRow[] {
  return hillProfileFromProfile(incidenceData(units).profile, options, "options");
}
