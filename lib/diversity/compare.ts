// Comparing zones at equal effort: richness rarefied or extrapolated to a common sample
// size, and to a common sample coverage (Chao & Jost 2012), each with a 95% interval.

import { abundanceProfile, sampleCoverage } from "./abundance";
import { coverageAt, curvePoint, type CurvePoint } from "./curves";
import { checkSize, invalidOption } from "./errors";
import { incidenceData } from "./incidence";
import type { FrequencyProfile } from "./profile";
import { deficitRatio } from "./richness";

export type ZoneAtEffort = {
  /** Richness at the common size (individuals or units). */
  atSize: CurvePoint;
  /** Richness at the size where this zone reaches the common coverage (size may be fractional beyond the sample). */
  atCoverage: CurvePoint;
};

export type ZoneComparison = { size: number; coverage: number; zones: Record<string, ZoneAtEffort> };

export type CompareInput =
  | { kind: "abundance"; zones: Readonly<Record<string, readonly number[]>>; size?: number; coverage?: number }
  | {
      kind: "incidence";
      zones: Readonly<Record<string, readonly (readonly number[])[]>>;
      size?: number;
      coverage?: number;
    };

/**
 * Effort at which the zone reaches coverage c: the integer m ≤ N whose rarefied coverage
 * is closest to c, or beyond N the real m* solving 1 − (f1/N)Â^{m*+1} = c (Chao & Jost 2012).
 */
export function sizeForCoverage(p: FrequencyProfile, c: number): number {
  const N = p.size;
  if (N === 0) return 0;
  if (c <= sampleCoverage(p)) {
    let lo = 0;
    let hi = N;
    while (hi - lo > 1) {
      const mid = Math.floor((lo + hi) / 2);
      if (coverageAt(p, mid) >= c) hi = mid;
      else lo = mid;
    }
    return Math.abs(coverageAt(p, lo) - c) < Math.abs(coverageAt(p, hi) - c) ? lo : hi;
  }
  const ratio = deficitRatio(p);
  return N + Math.log(((1 - c) * p.total) / p.f1) / Math.log(ratio) - 1;
}

/**
 * Richness of each zone at a common size and at a common coverage. Defaults follow
 * iNEXT `estimateD` (from memory): the smallest doubled sample size among the zones, and
 * the smallest coverage the zones reach at their doubled sample sizes.
 */
export function compareZones(input: CompareInput): ZoneComparison {
  const profiles: [string, FrequencyProfile][] =
    input.kind === "abundance"
      ? Object.entries(input.zones).map(([k, v]) => [k, abundanceProfile(v)])
      : Object.entries(input.zones).map(([k, v]) => [k, incidenceData(v).profile]);
  const nonEmpty = profiles.filter(([, p]) => p.size > 0);
  let size = input.size;
  if (size === undefined) size = nonEmpty.length ? Math.min(...nonEmpty.map(([, p]) => 2 * p.size)) : 0;
  checkSize(size, "size");
  let coverage = input.coverage;
  if (coverage === undefined) {
    coverage = nonEmpty.length ? Math.min(...nonEmpty.map(([, p]) => coverageAt(p, 2 * p.size))) : 0;
  } else if (!(coverage > 0 && coverage < 1)) {
    throw invalidOption("coverage", `coverage must lie strictly between 0 and 1 (got ${coverage})`);
  }
  const zones: Record<string, ZoneAtEffort> = {};
  for (const [name, p] of profiles) {
    const atSize = curvePoint(p, size);
    const atCoverage = coverage > 0 && p.size > 0 ? curvePoint(p, sizeForCoverage(p, coverage)) : curvePoint(p, 0);
    zones[name] = { atSize, atCoverage };
  }
  return { size, coverage, zones };
}
