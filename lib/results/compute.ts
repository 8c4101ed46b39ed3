// Results of an event from its aggregates (counts per taxon per zone, presence per
// complete count session). Pure: no database, no framework, so a report can be
// re-computed from its recorded inputs anywhere and give the same numbers.
// Records → units → numbers (README "Statistics"): taxon ranks resolved per block
// (ranks.ts), complete sessions are units even when empty, counts that are not of
// individuals get incidence-based estimates only, and a block below the sufficiency
// thresholds (settings.ts) is "too few records", without estimates.
import {
  diversityResults,
  ENGINE_VERSION,
  hillBeta,
  zoneSimilarity,
  zoneSimilarityIncidence,
  type AbundanceStats,
  type CurvePoint,
  type HillBeta,
  type HillCurveRow,
  type HillProfileRow,
  type IncidenceStats,
} from "@/lib/diversity/index";
import { hillAtCoverageFromProfile, hillCurveFromProfile } from "@/lib/diversity/hill-curves";
import { hillProfileFromProfile } from "@/lib/diversity/hill-profile";
import { curvePoint } from "@/lib/diversity/curves";
import { abundanceProfile, abundanceStatsFromProfile } from "@/lib/diversity/abundance";
import { sizeForCoverage } from "@/lib/diversity/compare";
import { bootstrapAtCoverage, differenceInterval, profileOf, type Sample } from "./compare";
import { resolveRanks, type RankStatus } from "./ranks";
import {
  COMPARISON_BOOTSTRAP,
  countUnitOf,
  HILL_RESULTS,
  SIMILARITY_BOOTSTRAP,
  SUFFICIENCY,
  type CountUnit,
} from "./settings";
import { Rng, multinomial } from "@/lib/diversity/random";
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
  /** What this taxon's counts mean in the event (settings.ts); individuals when absent. */
  countUnit?: CountUnit;
};

/** Sightings not (yet) in the results: waiting for review, or returned to their recorder. */
export type Pending = {
  pending: number;
  returned: number;
  pendingInCompleteSessions: number;
  returnedInCompleteSessions: number;
};

export type ResultsInput = {
  zones: { id: string; name: string; habitat: string }[];
  taxa: ResultsTaxon[];
  /** Individuals per taxon (index into `taxa`) per zone (NO_ZONE: outside every zone). */
  counts: { zoneId: string; taxon: number; individuals: number }[];
  /** Complete count sessions (sampling units): zone and the taxa (indices) detected; empty lists count. */
  sessions: { zoneId: string; taxa: number[] }[];
  /** Declared at the time of reading, not computed: carried through to the results. */
  pending?: Pending;
};

/** Why a block has no estimates of one kind. */
export type Reason = "countUnits" | "individuals" | "coverage" | "sessions" | "incidenceCoverage";

export type Block = {
  /** Taxa counted under the rank rule. */
  observed: number;
  /** Every approved individual, including those of records left out of richness. */
  individuals: number;
  /** Records identified above species left out of richness (a species under them is recorded here). */
  leftOut: { taxa: number; individuals: number };
  /** Subspecies, varieties and forms folded into their species. */
  folded: number;
  completeSessions: number;
  /** Count units other than individuals among the counted taxa (their presence blocks abundance estimates). */
  countUnits: CountUnit[];
  /** No estimate of either kind: "too few records". */
  tooFew: boolean;
  reasons: Reason[];
  /** Abundance-based estimates: only for counts of individuals, with enough individuals and coverage. */
  abundance: AbundanceStats | null;
  /** Incidence-based estimates: only with enough complete sessions and incidence coverage. */
  incidence: IncidenceStats | null;
  rarefaction: CurvePoint[];
  accumulation: CurvePoint[];
  /** Hill numbers q = 0, 1, 2 along size and the asymptotic profile: null when the block has no estimates of the event's kind. */
  hill: HillBlock | null;
};

/**
 * Hill-number curves of one block (Chao et al. 2014): `curve` holds q = 0, 1, 2 at each
 * size (individuals, or complete sessions) with its sample coverage (the
 * sample-completeness curve); `profile` the asymptotic estimates over q from 0 to 2.
 * Bands and intervals from HILL_RESULTS.replicates bootstrap replicates (fixed seed);
 * `replicates` 0 on a row: no band (not yet computed, or too few data).
 */
export type HillBlock = {
  kind: "abundance" | "incidence";
  curve: HillCurveRow[];
  profile: HillProfileRow[];
};

/** One cell of the zone × zone table (Chao et al. 2005; the diagonal compares a zone with itself). */
export type SimilarityCell = {
  shared: number;
  sorensen: number;
  jaccard: number;
  sorensenAdjusted: number;
  jaccardAdjusted: number;
  /** Percentile bootstrap 95% intervals of the corrected indices (SIMILARITY_BOOTSTRAP); null on the diagonal. */
  sorensenInterval: [number, number] | null;
  jaccardInterval: [number, number] | null;
};

/** Between zones: shared species, similarity, and multiplicative beta (Jost 2007) for q = 0, 1, 2. */
export type Similarity = {
  kind: "abundance" | "incidence";
  zones: { id: string; name: string; habitat: string }[];
  /** cells[i][j]: zone i against zone j (symmetric). */
  cells: SimilarityCell[][];
  beta: HillBeta[];
  /** Bootstrap replicates of the intervals; 0: not yet computed (the first read after a change, ComputeOptions.bands). */
  replicates: number;
  seed: number;
};

export type ZoneResult = { id: string; name: string; habitat: string } & Block;

export type AtEffort = { richness: number; lower: number; upper: number; size: number; kind: CurvePoint["kind"] };

export type ComparisonSentence = {
  a: string;
  b: string;
  verdict: "more" | "fewer" | "noClearDifference";
  /** Richness of a minus b at the common coverage, with its bootstrap 95% interval. */
  difference: number;
  lower: number;
  upper: number;
};

export type Comparison = {
  /** Abundance (individuals) when every count of the event is of individuals, else incidence (complete sessions). */
  kind: "abundance" | "incidence";
  /** Common sample size (individuals or sessions): the smallest compared zone's sample. */
  size: number;
  /** Common coverage: the lowest coverage a compared zone reaches at twice its sample. */
  coverage: number;
  replicates: number;
  seed: number;
  zones: { id: string; name: string; habitat: string; atSize: AtEffort; atCoverage: AtEffort }[];
  leftOut: { id: string; name: string; habitat: string; reasons: Reason[] }[];
  sentences: ComparisonSentence[];
};

export type SpeciesRow = ResultsTaxon & {
  individuals: number;
  byZone: Record<string, number>;
  rankStatus: RankStatus;
  countUnit: CountUnit;
};

export type Results = {
  engineVersion: string;
  rules: {
    sufficiency: typeof SUFFICIENCY;
    comparison: typeof COMPARISON_BOOTSTRAP;
    /** Hill curves' settings; `bands` false: computed without their bootstrap (not yet). */
    hill: typeof HILL_RESULTS & { bands: boolean };
  };
  totals: { individuals: number; species: number; completeSessions: number; leftOutIndividuals: number };
  pending: Pending | null;
  event: Block;
  zones: ZoneResult[];
  comparison: Comparison | null;
  similarity: Similarity | null;
  species: SpeciesRow[];
};

type Prepared = {
  block: Block;
  sample: { abundance: number[]; frequencies: number[]; units: number };
  /** The block's unit (counted taxon) of each taxon, −1 when left out. */
  unitOf: ArrayLike<number>;
};

export type ComputeOptions = {
  /**
   * Bootstrap bands of the Hill curves and profile, and the bootstrap intervals of the zone ×
   * zone similarity table (default true). The results page's first read after a change skips
   * them (server/results/current.ts) and fills them in later from a worker thread; a report
   * always has them. The comparison's bootstrap is never skipped: its verdicts need it.
   */
  bands?: boolean;
};

/** Sizes of a Hill curve: HILL_RESULTS.points from 1 to twice the sample, and the sample itself. */
export function hillSizes(n: number): number[] {
  if (n <= 0) return [];
  const out = new Set<number>([n]);
  const k = HILL_RESULTS.points - 1;
  for (let i = 0; i <= k; i++) out.add(Math.max(1, Math.round((i / k) * 2 * n)));
  return [...out].sort((a, b) => a - b);
}

function hillOf(kind: HillBlock["kind"], sample: Prepared["sample"], bands: boolean): HillBlock {
  const p =
    kind === "abundance"
      ? profileOf({ kind, counts: sample.abundance })
      : profileOf({ kind, frequencies: sample.frequencies, units: sample.units });
  const replicates = bands ? HILL_RESULTS.replicates : 0;
  return {
    kind,
    curve: hillCurveFromProfile(p, { sizes: hillSizes(p.size), replicates, seed: HILL_RESULTS.seed }, "hill"),
    profile: hillProfileFromProfile(
      p,
      { orders: kind === "abundance" ? HILL_RESULTS.profileOrders : [0, 1, 2], replicates, seed: HILL_RESULTS.seed },
      "hill",
    ),
  };
}

/** What a block's counts alone give: ranks resolved on them, individuals per counted unit, and what is left out. */
function countsSide(taxa: readonly ResultsTaxon[], counts: readonly number[]) {
  const ranks = resolveRanks(taxa, (i) => (counts[i] ?? 0) > 0);
  const unitCounts = new Array<number>(ranks.units).fill(0);
  const leftOut = { taxa: 0, individuals: 0 };
  let individuals = 0;
  let folded = 0;
  const units = new Set<CountUnit>();
  for (let i = 0; i < taxa.length; i++) {
    const c = counts[i] ?? 0;
    if (c <= 0) continue;
    individuals += c;
    const u = ranks.unitOf[i]!;
    if (u < 0) {
      leftOut.taxa++;
      leftOut.individuals += c;
      continue;
    }
    if (ranks.status[i] === "folded") folded++;
    unitCounts[u]! += c;
    const unit = taxa[i]!.countUnit ?? "individuals";
    if (unit !== "individuals") units.add(unit);
  }
  return { ranks, unitCounts, leftOut, individuals, folded, units };
}

/** One block: ranks resolved on its own records, then the engine on what may be estimated. */
function block(
  taxa: readonly ResultsTaxon[],
  counts: readonly number[],
  sessionTaxa: readonly (readonly number[])[],
  hillKind: HillBlock["kind"],
  bands: boolean,
  status?: RankStatus[],
): Prepared {
  const { ranks, unitCounts, leftOut, individuals, folded, units } = countsSide(taxa, counts);
  if (status) status.push(...ranks.status);
  // Each session's distinct counted units, ascending: a stamp per unit instead of a Set per
  // session, and an insertion sort (a session lists a few dozen taxa at most).
  const stamp = new Int32Array(ranks.units).fill(-1);
  const lists = sessionTaxa.map((list, s) => {
    const out: number[] = [];
    for (const i of list) {
      const u = ranks.unitOf[i]!;
      if (u < 0 || stamp[u] === s) continue;
      stamp[u] = s;
      let j = out.length;
      out.push(u);
      while (j > 0 && out[j - 1]! > u) {
        out[j] = out[j - 1]!;
        j--;
      }
      out[j] = u;
    }
    return out;
  });
  const frequencies = new Array<number>(ranks.units).fill(0);
  for (const l of lists) for (const u of l) frequencies[u]!++;
  const T = lists.length;

  const reasons: Reason[] = [];
  const countUnits = [...units].sort();
  if (countUnits.length) reasons.push("countUnits");
  if (individuals - leftOut.individuals < SUFFICIENCY.minIndividuals) reasons.push("individuals");
  if (T < SUFFICIENCY.minCompleteSessions) reasons.push("sessions");
  const r = diversityResults({ counts: unitCounts, unitLists: T ? lists : undefined, curvePoints: CURVE_POINTS });
  if (
    !reasons.includes("countUnits") &&
    !reasons.includes("individuals") &&
    r.abundance.coverage < SUFFICIENCY.minCoverage
  )
    reasons.push("coverage");
  if (!reasons.includes("sessions") && r.incidence && r.incidence.coverage < SUFFICIENCY.minCoverage)
    reasons.push("incidenceCoverage");
  const abundanceOk = !reasons.some((x) => x === "countUnits" || x === "individuals" || x === "coverage");
  const incidenceOk = r.incidence !== null && !reasons.some((x) => x === "sessions" || x === "incidenceCoverage");
  const sample = { abundance: unitCounts, frequencies, units: T };
  const hillOk = hillKind === "abundance" ? abundanceOk : incidenceOk;
  return {
    block: {
      observed: ranks.units,
      individuals,
      leftOut,
      folded,
      completeSessions: T,
      countUnits,
      tooFew: !abundanceOk && !incidenceOk,
      reasons,
      abundance: abundanceOk ? r.abundance : null,
      incidence: incidenceOk ? r.incidence : null,
      rarefaction: abundanceOk ? r.rarefactionCurve : [],
      accumulation: incidenceOk ? r.accumulationCurve : [],
      hill: hillOk ? hillOf(hillKind, sample, bands) : null,
    },
    sample,
    unitOf: ranks.unitOf,
  };
}

const atEffort = (p: CurvePoint): AtEffort => ({
  richness: p.richness,
  lower: p.lower,
  upper: p.upper,
  size: p.size,
  kind: p.kind,
});

/** Pairs to put in words: each edge zone against each interior zone, else the richest against the poorest. */
function pairs(zones: Comparison["zones"]): [Comparison["zones"][number], Comparison["zones"][number]][] {
  const edges = zones.filter((z) => z.habitat === "edge");
  const interiors = zones.filter((z) => z.habitat === "interior");
  const out: [Comparison["zones"][number], Comparison["zones"][number]][] = [];
  if (edges.length && interiors.length) for (const e of edges) for (const i of interiors) out.push([e, i]);
  else if (zones.length >= 2) {
    const sorted = [...zones].sort((x, y) => y.atCoverage.richness - x.atCoverage.richness);
    out.push([sorted[0]!, sorted[sorted.length - 1]!]);
  }
  return out;
}

function compare(
  kind: Comparison["kind"],
  zones: ResultsInput["zones"],
  prepared: Map<string, Prepared>,
  chosenPairs?: readonly (readonly [string, string])[],
): Comparison {
  const sampleOf = (id: string): Sample => {
    const s = prepared.get(id)!.sample;
    return kind === "abundance" ? { kind, counts: s.abundance } : { kind, frequencies: s.frequencies, units: s.units };
  };
  const ok = (b: Block) => (kind === "abundance" ? b.abundance !== null : b.incidence !== null);
  const compared = zones.filter((z) => ok(prepared.get(z.id)!.block));
  const leftOut = zones
    .filter((z) => !ok(prepared.get(z.id)!.block))
    .map((z) => {
      const b = prepared.get(z.id)!.block;
      const mine: Reason[] =
        kind === "abundance" ? ["countUnits", "individuals", "coverage"] : ["sessions", "incidenceCoverage"];
      return { ...z, reasons: b.reasons.filter((r) => mine.includes(r)) };
    });
  const base = { kind, replicates: COMPARISON_BOOTSTRAP.replicates, seed: COMPARISON_BOOTSTRAP.seed, leftOut };
  if (compared.length < 2) return { ...base, size: 0, coverage: 0, zones: [], sentences: [] };
  const profiles = new Map(compared.map((z) => [z.id, profileOf(sampleOf(z.id))]));
  // Colwell et al. (2012) size-based: the smallest zone's sample, so no zone is extrapolated
  // by size; Chao & Jost (2012) coverage-based: the lowest coverage any zone reaches at twice its sample.
  const size = Math.min(...[...profiles.values()].map((p) => p.size));
  const coverage = Math.min(...[...profiles.values()].map((p) => curvePoint(p, 2 * p.size).coverage));
  const rows = compared.map((z) => {
    const p = profiles.get(z.id)!;
    return {
      ...z,
      atSize: atEffort(curvePoint(p, size)),
      atCoverage: atEffort(curvePoint(p, sizeForCoverage(p, coverage))),
    };
  });
  // Each zone is redrawn once (its own seed: the common seed plus its place among the
  // compared zones) and its replicates serve every pair it is in.
  const replicates = new Map<string, Float64Array>();
  const repsOf = (id: string) => {
    let r = replicates.get(id);
    if (!r) {
      const seed = COMPARISON_BOOTSTRAP.seed + compared.findIndex((z) => z.id === id);
      replicates.set(
        id,
        (r = bootstrapAtCoverage(sampleOf(id), coverage, { replicates: COMPARISON_BOOTSTRAP.replicates, seed })),
      );
    }
    return r;
  };
  const byId = new Map(rows.map((r) => [r.id, r]));
  const toWords = chosenPairs
    ? chosenPairs.flatMap(([a, b]) => (byId.has(a) && byId.has(b) ? [[byId.get(a)!, byId.get(b)!] as const] : []))
    : pairs(rows);
  const sentences = toWords.map(([a, b]): ComparisonSentence => {
    const d = differenceInterval(a.atCoverage.richness, b.atCoverage.richness, repsOf(a.id), repsOf(b.id));
    const verdict = d.lower > 0 ? "more" : d.upper < 0 ? "fewer" : "noClearDifference";
    return { a: a.id, b: b.id, verdict, difference: d.difference, lower: d.lower, upper: d.upper };
  });
  return { ...base, size, coverage, zones: rows, sentences };
}

/**
 * The zone × zone table on the event's units (the rank rule applied to the whole event, so
 * every zone lists the same taxa): abundance-based where every count is of individuals, else
 * incidence-based on complete sessions. Zones with no detections of that kind are left out.
 */
function similarity(
  kind: Similarity["kind"],
  zones: ResultsInput["zones"],
  perZone: Map<string, number[]>,
  sessions: ResultsInput["sessions"],
  unitOf: ArrayLike<number>,
  width: number,
  withIntervals: boolean,
): Similarity | null {
  const aligned = (counts: readonly number[]) => {
    const out = new Array<number>(width).fill(0);
    counts.forEach((c, i) => {
      const u = unitOf[i] ?? -1;
      if (u >= 0 && c > 0) out[u]! += c;
    });
    return out;
  };
  const rows = (zoneId: string) =>
    sessions
      .filter((s) => s.zoneId === zoneId)
      .map((s) => {
        const row = new Array<number>(width).fill(0);
        for (const i of s.taxa) if ((unitOf[i] ?? -1) >= 0) row[unitOf[i]!] = 1;
        return row;
      });
  const data = zones
    .map((z) => {
      if (kind === "abundance") {
        const counts = aligned(perZone.get(z.id)!);
        return { zone: z, counts, units: [] as number[][], total: counts.reduce((a, b) => a + b, 0) };
      }
      const units = rows(z.id);
      const counts = new Array<number>(width).fill(0);
      for (const r of units) r.forEach((v, u) => (counts[u]! += v));
      return { zone: z, counts, units, total: counts.reduce((a, b) => a + b, 0) };
    })
    .filter((d) => d.total > 0);
  if (data.length < 2) return null;
  type Zone = (typeof data)[number];
  const index = (a: Zone, b: Zone) =>
    kind === "abundance" ? zoneSimilarity(a.counts, b.counts) : zoneSimilarityIncidence(a.units, b.units);
  // One redraw of a zone: its individuals from its observed proportions, or its complete
  // sessions drawn with replacement.
  const redraw = (z: Zone, rng: Rng): Zone => {
    if (kind === "abundance") {
      const p = Float64Array.from(z.counts, (c) => c / z.total);
      return { ...z, counts: Array.from(multinomial(rng, z.total, p)) };
    }
    const units = z.units.map(() => z.units[Math.floor(rng.next() * z.units.length)]!);
    return { ...z, units };
  };
  const intervals = (a: Zone, b: Zone, seed: number) => {
    const rng = new Rng(seed);
    const sor: number[] = [];
    const jac: number[] = [];
    for (let r = 0; r < SIMILARITY_BOOTSTRAP.replicates; r++) {
      const x = index(redraw(a, rng), redraw(b, rng));
      if (Number.isFinite(x.sorensenAdjusted)) sor.push(x.sorensenAdjusted);
      if (Number.isFinite(x.jaccardAdjusted)) jac.push(x.jaccardAdjusted);
    }
    return { sorensen: percentile95(sor), jaccard: percentile95(jac) };
  };
  const cell = (a: Zone, b: Zone, seed: number | null): SimilarityCell => {
    const s = index(a, b);
    const iv = seed === null || !withIntervals ? null : intervals(a, b, seed);
    return {
      shared: s.shared,
      sorensen: s.sorensen,
      jaccard: s.jaccard,
      sorensenAdjusted: s.sorensenAdjusted,
      jaccardAdjusted: s.jaccardAdjusted,
      sorensenInterval: iv?.sorensen ?? null,
      jaccardInterval: iv?.jaccard ?? null,
    };
  };
  const cells: SimilarityCell[][] = data.map(() => []);
  for (let i = 0; i < data.length; i++)
    for (let j = i; j < data.length; j++) {
      const c = cell(data[i]!, data[j]!, i === j ? null : SIMILARITY_BOOTSTRAP.seed + i * data.length + j);
      cells[i]![j] = c;
      cells[j]![i] = c;
    }
  return {
    kind,
    zones: data.map((d) => d.zone),
    cells,
    beta: [0, 1, 2].map((q) =>
      hillBeta(
        data.map((d) => d.counts),
        q,
      ),
    ),
    replicates: withIntervals ? SIMILARITY_BOOTSTRAP.replicates : 0,
    seed: SIMILARITY_BOOTSTRAP.seed,
  };
}

/** The 2.5% and 97.5% points (linear interpolation between order statistics); null without values. */
function percentile95(values: number[]): [number, number] | null {
  if (values.length === 0) return null;
  const v = [...values].sort((a, b) => a - b);
  const at = (p: number) => {
    const h = (v.length - 1) * p;
    const lo = Math.floor(h);
    return v[lo]! + (h - lo) * ((v[Math.min(lo + 1, v.length - 1)] ?? v[lo]!) - v[lo]!);
  };
  return [at(0.025), at(0.975)];
}

/** One block per zone, on the zone's own counts and complete sessions. */
function zoneBlocks(
  input: ResultsInput,
  taxa: readonly ResultsTaxon[],
  perZone: Map<string, number[]>,
  hillKind: HillBlock["kind"],
  bands: boolean,
): Map<string, Prepared> {
  return new Map(
    input.zones.map((z) => [
      z.id,
      block(
        taxa,
        perZone.get(z.id)!,
        input.sessions.filter((s) => s.zoneId === z.id).map((s) => s.taxa),
        hillKind,
        bands,
      ),
    ]),
  );
}

/** Hill numbers q = 0, 1, 2 of one sample at one coverage (Chao & Jost 2012; Chao et al. 2014). */
export type HillAtCoverage = { order: number; estimate: number; size: number };

/**
 * Samples side by side with the zones' rule (equal size, equal coverage, bootstrap
 * difference at equal coverage): each "zone" of `input` is one sample — for two events of
 * one site, each event as a whole. `chosenPairs` puts the given pairs in words, in that
 * order (a, b: "a has more/fewer than b"). Also each compared sample's Hill numbers at the
 * common coverage.
 */
export function compareSamples(
  input: ResultsInput,
  chosenPairs: readonly (readonly [string, string])[],
): { comparison: Comparison; observed: Record<string, number>; hill: Record<string, HillAtCoverage[]> } {
  const taxa = input.taxa.map((t) => ({ ...t, countUnit: t.countUnit ?? countUnitOf(t.group) }));
  const width = taxa.length;
  const perZone = new Map<string, number[]>(input.zones.map((z) => [z.id, new Array<number>(width).fill(0)]));
  for (const c of input.counts) {
    const z = perZone.get(c.zoneId);
    if (z) z[c.taxon] = (z[c.taxon] ?? 0) + c.individuals;
  }
  const anyOtherUnit = input.counts.some((c) => c.individuals > 0 && taxa[c.taxon]!.countUnit !== "individuals");
  const kind: Comparison["kind"] = anyOtherUnit ? "incidence" : "abundance";
  // Without bootstrap bands: the comparison draws its own replicates.
  const prepared = zoneBlocks(input, taxa, perZone, kind, false);
  const comparison = compare(kind, input.zones, prepared, chosenPairs);
  const hill: Record<string, HillAtCoverage[]> = {};
  const observed: Record<string, number> = {};
  for (const z of input.zones) observed[z.id] = prepared.get(z.id)!.block.observed;
  if (comparison.coverage > 0)
    for (const z of comparison.zones) {
      const s = prepared.get(z.id)!.sample;
      const p =
        kind === "abundance"
          ? profileOf({ kind, counts: s.abundance })
          : profileOf({ kind, frequencies: s.frequencies, units: s.units });
      hill[z.id] = hillAtCoverageFromProfile(
        p,
        { orders: [0, 1, 2], levels: [comparison.coverage] },
        "compareSamples",
      ).map((r) => ({ order: r.order, estimate: r.estimate, size: r.size }));
    }
  return { comparison, observed, hill };
}

/**
 * The abundance side's bootstraps from the counts alone (input.sessions is not read), before the complete sessions are
 * read: the engine's Hill q = 1, 2 sds of every block and, when the comparison is by
 * individuals, its replicates, drawn into the caches that computeResults reads (kept per
 * sample, coverage, replicates and seed: lib/diversity/hill.ts, ./compare.ts). The results
 * path (server/results/current.ts) runs it while the database still reads the sessions;
 * computeResults then finds them drawn. It changes no number: a miss only draws them again.
 */
export function warmResults(input: ResultsInput): void {
  const taxa = input.taxa.map((t) => ({ ...t, countUnit: t.countUnit ?? countUnitOf(t.group) }));
  const width = taxa.length;
  const total = new Array<number>(width).fill(0);
  const perZone = new Map<string, number[]>(input.zones.map((z) => [z.id, new Array<number>(width).fill(0)]));
  for (const c of input.counts) {
    total[c.taxon] = (total[c.taxon] ?? 0) + c.individuals;
    const z = perZone.get(c.zoneId);
    if (z) z[c.taxon] = (z[c.taxon] ?? 0) + c.individuals;
  }
  // As block() and diversityResults() do: the stats of each block's unit counts (their
  // bootstrap sds are kept), and which zones the abundance comparison takes.
  const side = (counts: readonly number[]) => {
    const c = countsSide(taxa, counts);
    const stats = abundanceStatsFromProfile(abundanceProfile(c.unitCounts));
    const ok =
      c.units.size === 0 &&
      c.individuals - c.leftOut.individuals >= SUFFICIENCY.minIndividuals &&
      stats.coverage >= SUFFICIENCY.minCoverage;
    return { c, stats, ok };
  };
  const event = side(total);
  const zones = new Map(input.zones.map((z) => [z.id, side(perZone.get(z.id)!)]));
  if (input.zones.length < 2 || event.c.units.size > 0) return; // compared by complete sessions: needs them
  const prepared = new Map<string, Prepared>(
    input.zones.map((z) => {
      const { c, stats, ok } = zones.get(z.id)!;
      const block = { abundance: ok ? stats : null, incidence: null, reasons: [] } as unknown as Block;
      return [z.id, { block, sample: { abundance: c.unitCounts, frequencies: [], units: 0 }, unitOf: c.ranks.unitOf }];
    }),
  );
  compare("abundance", input.zones, prepared);
}

export function computeResults(input: ResultsInput, options: ComputeOptions = {}): Results {
  const bands = options.bands ?? true;
  const taxa = input.taxa.map((t) => ({ ...t, countUnit: t.countUnit ?? countUnitOf(t.group) }));
  const width = taxa.length;
  const total = new Array<number>(width).fill(0);
  const perZone = new Map<string, number[]>(input.zones.map((z) => [z.id, new Array<number>(width).fill(0)]));
  const byZone: Record<string, number>[] = taxa.map(() => ({}));
  for (const c of input.counts) {
    total[c.taxon] = (total[c.taxon] ?? 0) + c.individuals;
    const z = perZone.get(c.zoneId);
    if (z) z[c.taxon] = (z[c.taxon] ?? 0) + c.individuals;
    const row = byZone[c.taxon]!;
    row[c.zoneId] = (row[c.zoneId] ?? 0) + c.individuals;
  }
  const status: RankStatus[] = [];
  // Abundance when every counted taxon of the event is counted in individuals, else complete sessions.
  const hillKind = taxa.some((t, i) => (total[i] ?? 0) > 0 && t.countUnit !== "individuals")
    ? "incidence"
    : "abundance";
  const event = block(
    taxa,
    total,
    input.sessions.map((s) => s.taxa),
    hillKind,
    bands,
    status,
  );
  const prepared = zoneBlocks(input, taxa, perZone, hillKind, bands);
  const zones: ZoneResult[] = input.zones.map((z) => ({ ...z, ...prepared.get(z.id)!.block }));
  const kind = event.block.countUnits.length === 0 ? "abundance" : "incidence";
  const comparison = input.zones.length >= 2 ? compare(kind, input.zones, prepared) : null;
  const between =
    input.zones.length >= 2
      ? similarity(kind, input.zones, perZone, input.sessions, event.unitOf, event.block.observed, bands)
      : null;

  const species: SpeciesRow[] = taxa
    .map((t, i) => ({
      ...t,
      countUnit: t.countUnit,
      individuals: total[i] ?? 0,
      byZone: byZone[i]!,
      rankStatus: status[i]!,
    }))
    .filter((s) => s.individuals > 0)
    .sort((a, b) => b.individuals - a.individuals || a.scientificName.localeCompare(b.scientificName));

  return {
    engineVersion: ENGINE_VERSION,
    rules: { sufficiency: SUFFICIENCY, comparison: COMPARISON_BOOTSTRAP, hill: { ...HILL_RESULTS, bands } },
    totals: {
      individuals: event.block.individuals,
      species: event.block.observed,
      completeSessions: input.sessions.length,
      leftOutIndividuals: event.block.leftOut.individuals,
    },
    pending: input.pending ?? null,
    event: event.block,
    zones,
    comparison,
    similarity: between,
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
