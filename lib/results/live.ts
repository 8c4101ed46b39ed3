// The live board's completeness figures and "where to look next", read off the same
// Results as the results page (one Chao1 everywhere: the Chao-group form, abundance
// `chao1Classic`; Chao2 when the event's counts are not of individuals).
import type { Block, Reason, Results } from "./compute";
import type { EarlierEventRef, EventComparison } from "./compare-events";

export type Richness = { estimator: "chao1" | "chao2"; estimate: number; lower: number; upper: number };

export type BlockLead = {
  observed: number;
  individuals: number;
  completeSessions: number;
  tooFew: boolean;
  reasons: Reason[];
  /** Estimated richness, the same number the results table prints; null when too few records. */
  richness: Richness | null;
  /** Completeness: observed ÷ estimated richness (a share of species). */
  completeness: number | null;
  /** Sample coverage (share of individuals, or of incidences, belonging to detected species). */
  coverage: number | null;
  coverageKind: "sample" | "incidence" | null;
  undetected: number | null;
};

export type ZoneLead = { id: string; name: string; habitat: string } & BlockLead;

export function blockLead(b: Block): BlockLead {
  const base = {
    observed: b.observed,
    individuals: b.individuals,
    completeSessions: b.completeSessions,
    tooFew: b.tooFew,
    reasons: b.reasons,
  };
  let richness: Richness | null = null;
  let coverage: number | null = null;
  let coverageKind: BlockLead["coverageKind"] = null;
  if (b.abundance) {
    const c = b.abundance.chao1Classic;
    richness = { estimator: "chao1", estimate: c.estimate, lower: c.lower, upper: c.upper };
    coverage = b.abundance.coverage;
    coverageKind = "sample";
  } else if (b.incidence) {
    const c = b.incidence.chao2;
    richness = { estimator: "chao2", estimate: c.estimate, lower: c.lower, upper: c.upper };
    coverage = b.incidence.coverage;
    coverageKind = "incidence";
  }
  return {
    ...base,
    richness,
    coverage,
    coverageKind,
    completeness: richness && richness.estimate > 0 ? b.observed / richness.estimate : null,
    undetected: richness ? Math.max(0, richness.estimate - b.observed) : null,
  };
}

/**
 * Where to look next: blocks with too few records first (unsampled zones first among
 * them), then the largest coverage deficit, then the most undetected species.
 */
export function completeness(results: Results) {
  const zones: ZoneLead[] = results.zones.map((z) => ({ id: z.id, name: z.name, habitat: z.habitat, ...blockLead(z) }));
  zones.sort(
    (a, b) =>
      Number(b.tooFew) - Number(a.tooFew) ||
      Number(b.individuals === 0) - Number(a.individuals === 0) ||
      1 - (b.coverage ?? 0) - (1 - (a.coverage ?? 0)) ||
      (b.undetected ?? 0) - (a.undetected ?? 0) ||
      a.name.localeCompare(b.name),
  );
  return { event: blockLead(results.event), zones, pending: results.pending };
}

export type LiveCompleteness = ReturnType<typeof completeness>;

/**
 * The running event beside the newest earlier event of its site, by the results page's rule
 * (lib/results/compare-events.ts: equal coverage, "more"/"fewer" only when the bootstrap
 * interval of the difference excludes 0), with when it was computed; null without an
 * earlier event.
 */
export type LiveBeside = { earlier: EarlierEventRef; comparison: EventComparison; at: string } | null;
