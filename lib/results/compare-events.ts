// Two events of one site side by side (this year's count and an earlier one): each event as
// a whole is one sample, compared with the zones' rule (compute.ts compareSamples): richness
// at equal sample size and at equal coverage (Chao & Jost 2012), the difference at equal
// coverage with its bootstrap interval ("more"/"fewer" only when it excludes 0), and Hill
// numbers q = 0, 1, 2 at that coverage. Taxa are matched by id; the rank rule applies within
// each event, as it does within each zone. Pure: the caller loads each event's aggregates.
import { compareSamples, type Comparison, type HillAtCoverage, type ResultsInput } from "./compute";

export type EventSide = {
  id: string;
  name: string;
  startsAt: string;
  /** The event's aggregates as the results page reads them (zones are folded into the event). */
  input: Pick<ResultsInput, "taxa" | "counts" | "sessions">;
};

/** An earlier event of the same site, as a comparison names it. */
export type EarlierEventRef = { id: string; name: string; slug: string; startsAt: string; endsAt: string };

/** What a report keeps of the comparison: the earlier event it was made with, and the numbers. */
export type ReportBesideEarlier = { earlier: EarlierEventRef; comparison: EventComparison };

export type EventComparison = {
  kind: Comparison["kind"];
  size: number;
  coverage: number;
  replicates: number;
  seed: number;
  events: {
    id: string;
    name: string;
    startsAt: string;
    observed: number;
    atSize: Comparison["zones"][number]["atSize"] | null;
    atCoverage: Comparison["zones"][number]["atCoverage"] | null;
    hill: HillAtCoverage[];
  }[];
  /** Events without estimates of the compared kind, with the reasons ("too few records"). */
  leftOut: Comparison["leftOut"];
  /** This event against the earlier one, or null when either has too few records. */
  sentence: Comparison["sentences"][number] | null;
};

export function compareEvents(current: EventSide, earlier: EventSide): EventComparison {
  const taxa: ResultsInput["taxa"] = [];
  const index = new Map<string, number>();
  const indexOf = (t: ResultsInput["taxa"][number]) => {
    let i = index.get(t.id);
    if (i === undefined) {
      i = taxa.length;
      index.set(t.id, i);
      taxa.push(t);
    }
    return i;
  };
  const counts: ResultsInput["counts"] = [];
  const sessions: ResultsInput["sessions"] = [];
  for (const side of [current, earlier]) {
    const local = side.input.taxa.map(indexOf);
    for (const c of side.input.counts)
      counts.push({ zoneId: side.id, taxon: local[c.taxon]!, individuals: c.individuals });
    for (const s of side.input.sessions) sessions.push({ zoneId: side.id, taxa: s.taxa.map((t) => local[t]!) });
  }
  const zones = [current, earlier].map((e) => ({ id: e.id, name: e.name, habitat: "" }));
  const { comparison, observed, hill } = compareSamples({ zones, taxa, counts, sessions }, [[current.id, earlier.id]]);
  const row = (e: EventSide) => {
    const z = comparison.zones.find((x) => x.id === e.id);
    return {
      id: e.id,
      name: e.name,
      startsAt: e.startsAt,
      observed: observed[e.id] ?? 0,
      atSize: z?.atSize ?? null,
      atCoverage: z?.atCoverage ?? null,
      hill: hill[e.id] ?? [],
    };
  };
  return {
    kind: comparison.kind,
    size: comparison.size,
    coverage: comparison.coverage,
    replicates: comparison.replicates,
    seed: comparison.seed,
    events: [row(current), row(earlier)],
    leftOut: comparison.leftOut,
    sentence: comparison.sentences[0] ?? null,
  };
}
