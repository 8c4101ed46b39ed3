// Results of an event from its aggregates (counts per taxon per zone, presence per
// complete count session). Pure: no database, no framework, so a report can be
// re-computed from its recorded inputs anywhere and give the same numbers.
import {
  compareZones,
  diversityResults,
  ENGINE_VERSION,
  type AbundanceStats,
  type CurvePoint,
  type IncidenceStats,
} from "@/lib/diversity/index";
import type { Sensitivity } from "@/lib/domain";

export const NO_ZONE = "00000000-0000-0000-0000-000000000000";
export const CURVE_POINTS = 40;

export type ResultsTaxon = {
  id: string;
  scientificName: string;
  rank: string;
  group: string;
  sensitivity: Sensitivity;
  names: Record<string, string>;
};

export type ResultsInput = {
  zones: { id: string; name: string; habitat: string }[];
  taxa: ResultsTaxon[];
  /** Individuals per taxon (index into `taxa`) per zone (NO_ZONE: outside every zone). */
  counts: { zoneId: string; taxon: number; individuals: number }[];
  /** Complete count sessions (sampling units): zone and the taxa (indices) detected. */
  sessions: { zoneId: string; taxa: number[] }[];
};

export type Block = {
  abundance: AbundanceStats;
  incidence: IncidenceStats | null;
  rarefaction: CurvePoint[];
  accumulation: CurvePoint[];
};

export type ZoneResult = { id: string; name: string; habitat: string } & Block;

export type AtEffort = { richness: number; lower: number; upper: number; size: number; kind: CurvePoint["kind"] };

export type ComparisonSentence = { a: string; b: string; verdict: "more" | "fewer" | "similar"; overlap: boolean };

export type Comparison = {
  size: number;
  coverage: number;
  zones: { id: string; name: string; habitat: string; atSize: AtEffort; atCoverage: AtEffort }[];
  sentences: ComparisonSentence[];
};

export type SpeciesRow = ResultsTaxon & { individuals: number; byZone: Record<string, number> };

export type Results = {
  engineVersion: string;
  totals: { individuals: number; species: number; completeSessions: number };
  event: Block;
  zones: ZoneResult[];
  comparison: Comparison | null;
  species: SpeciesRow[];
};

/** The engine's results for one block; each complete session goes in as its list of taxa (presence). */
function block(counts: number[], sessionTaxa: number[][]): Block {
  const r = diversityResults({
    counts,
    unitLists: sessionTaxa.length ? sessionTaxa : undefined,
    curvePoints: CURVE_POINTS,
  });
  return {
    abundance: r.abundance,
    incidence: r.incidence,
    rarefaction: r.rarefactionCurve,
    accumulation: r.accumulationCurve,
  };
}

const atEffort = (p: CurvePoint): AtEffort => ({
  richness: p.richness,
  lower: p.lower,
  upper: p.upper,
  size: p.size,
  kind: p.kind,
});

/** Plain-language comparisons: each edge zone against each interior zone, at equal coverage. */
function sentences(zones: Comparison["zones"]): ComparisonSentence[] {
  const edges = zones.filter((z) => z.habitat === "edge");
  const interiors = zones.filter((z) => z.habitat === "interior");
  const pairs: [Comparison["zones"][number], Comparison["zones"][number]][] = [];
  if (edges.length && interiors.length) for (const e of edges) for (const i of interiors) pairs.push([e, i]);
  else if (zones.length >= 2) {
    const sorted = [...zones].sort((x, y) => y.atCoverage.richness - x.atCoverage.richness);
    pairs.push([sorted[0]!, sorted[sorted.length - 1]!]);
  }
  return pairs.map(([a, b]) => {
    const overlap = a.atCoverage.lower <= b.atCoverage.upper && b.atCoverage.lower <= a.atCoverage.upper;
    const diff = a.atCoverage.richness - b.atCoverage.richness;
    const verdict = Math.abs(diff) < 0.5 ? "similar" : diff > 0 ? "more" : "fewer";
    return { a: a.id, b: b.id, verdict, overlap };
  });
}

export function computeResults(input: ResultsInput): Results {
  const width = input.taxa.length;
  const total = new Array<number>(width).fill(0);
  const perZone = new Map<string, number[]>(input.zones.map((z) => [z.id, new Array<number>(width).fill(0)]));
  const byZone: Record<string, number>[] = input.taxa.map(() => ({}));
  for (const c of input.counts) {
    total[c.taxon] = (total[c.taxon] ?? 0) + c.individuals;
    const z = perZone.get(c.zoneId);
    if (z) z[c.taxon] = (z[c.taxon] ?? 0) + c.individuals;
    const row = byZone[c.taxon]!;
    row[c.zoneId] = (row[c.zoneId] ?? 0) + c.individuals;
  }
  const event = block(
    total,
    input.sessions.map((s) => s.taxa),
  );
  const zones: ZoneResult[] = input.zones.map((z) => ({
    ...z,
    ...block(
      perZone.get(z.id)!,
      input.sessions.filter((s) => s.zoneId === z.id).map((s) => s.taxa),
    ),
  }));

  let comparison: Comparison | null = null;
  const sampled = input.zones.filter((z) => perZone.get(z.id)!.some((v) => v > 0));
  if (sampled.length >= 2) {
    // Chao & Jost (2012) coverage-based and Colwell et al. (2012) size-based comparison;
    // the common size is the smallest zone's sample, so no zone is extrapolated by size.
    const size = Math.min(...sampled.map((z) => perZone.get(z.id)!.reduce((a, b) => a + b, 0)));
    const c = compareZones({
      kind: "abundance",
      zones: Object.fromEntries(sampled.map((z) => [z.id, perZone.get(z.id)!])),
      size,
    });
    const rows = sampled.map((z) => ({
      id: z.id,
      name: z.name,
      habitat: z.habitat,
      atSize: atEffort(c.zones[z.id]!.atSize),
      atCoverage: atEffort(c.zones[z.id]!.atCoverage),
    }));
    comparison = { size: c.size, coverage: c.coverage, zones: rows, sentences: sentences(rows) };
  }

  const species: SpeciesRow[] = input.taxa
    .map((t, i) => ({ ...t, individuals: total[i] ?? 0, byZone: byZone[i]! }))
    .filter((s) => s.individuals > 0)
    .sort((a, b) => b.individuals - a.individuals || a.scientificName.localeCompare(b.scientificName));

  return {
    engineVersion: ENGINE_VERSION,
    totals: {
      individuals: event.abundance.individuals,
      species: event.abundance.observed,
      completeSessions: input.sessions.length,
    },
    event,
    zones,
    comparison,
    species,
  };
}

/** Key order and Infinity made canonical, as they come back from a JSON column. */
export function canonicalJson(value: unknown): string {
  return JSON.stringify(value, (_k, v: unknown) =>
    v && typeof v === "object" && !Array.isArray(v)
      ? Object.fromEntries(
          Object.entries(v as Record<string, unknown>).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0)),
        )
      : v,
  );
}
