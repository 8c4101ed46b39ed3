// One call for the results page: abundance and incidence statistics plus the
// rarefaction/extrapolation and accumulation/extrapolation curves.

import { abundanceProfile, abundanceStatsFromProfile, type AbundanceStats } from "./abundance";
import { abundanceCurveFromProfile, curveSizes, incidenceCurveFromData, type CurvePoint } from "./curves";
import { invalidOption } from "./errors";
import type { BootstrapOptions } from "./hill";
import { incidenceData, incidenceDataFromLists, incidenceStatsFromData, type IncidenceStats } from "./incidence";

export const ENGINE_VERSION = "ecotone-diversity 1.0.0";

export type DiversityInput = {
  /** Individuals per species; when omitted, the column sums of `units`. */
  counts?: readonly number[];
  /** Sampling units × species counts (a complete count session per row). */
  units?: readonly (readonly number[])[];
  /**
   * Instead of `units`: each unit's detected species as indices into `counts` (presence
   * only). Gives the same incidence statistics without building the unit × species grid,
   * which at tens of thousands of sessions is most of the work.
   */
  unitLists?: readonly (readonly number[])[];
  /** Approximate number of points per curve (default 40; the observed point is always included). */
  curvePoints?: number;
  /** Curves run to this multiple of the sample size or number of units (default 2). */
  extrapolationFactor?: number;
  bootstrap?: BootstrapOptions;
};

export type DiversityResults = {
  engineVersion: string;
  abundance: AbundanceStats;
  incidence: IncidenceStats | null;
  rarefactionCurve: CurvePoint[];
  accumulationCurve: CurvePoint[];
};

export function diversityResults(input: DiversityInput): DiversityResults {
  const points = input.curvePoints ?? 40;
  if (!Number.isInteger(points) || points < 2 || points > 10000) {
    throw invalidOption("curvePoints", `curvePoints must be an integer from 2 to 10000 (got ${points})`);
  }
  const factor = input.extrapolationFactor ?? 2;
  if (!(factor >= 1 && factor <= 100)) {
    throw invalidOption("extrapolationFactor", `extrapolationFactor must lie between 1 and 100 (got ${factor})`);
  }
  if (input.units !== undefined && input.unitLists !== undefined)
    throw invalidOption("unitLists", "give units or unitLists, not both");
  if (input.unitLists !== undefined && input.counts === undefined)
    throw invalidOption("counts", "unitLists needs counts (individuals per species)");
  const inc =
    input.units !== undefined
      ? incidenceData(input.units)
      : input.unitLists !== undefined
        ? incidenceDataFromLists(input.unitLists, input.counts!.length)
        : null;
  let counts = input.counts;
  if (counts === undefined) {
    const sums: number[] = [];
    for (const row of input.units ?? []) row.forEach((v, s) => (sums[s] = (sums[s] ?? 0) + v));
    counts = sums;
  }
  const ab = abundanceProfile(counts);
  const n = ab.size;
  const rarefactionCurve = abundanceCurveFromProfile(ab, curveSizes(n, points, Math.round(factor * n)));
  const accumulationCurve = inc
    ? incidenceCurveFromData(inc, curveSizes(inc.units, points, Math.round(factor * inc.units)))
    : [];
  return {
    engineVersion: ENGINE_VERSION,
    abundance: abundanceStatsFromProfile(ab, input.bootstrap),
    incidence: inc ? incidenceStatsFromData(inc) : null,
    rarefactionCurve,
    accumulationCurve,
  };
}
