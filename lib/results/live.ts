// The live board's completeness figures and "where to look next", from the per-zone
// counts alone (no curves, no bootstrap), so the board can poll cheaply.
import { abundanceStats } from "@/lib/diversity/index";
import type { ResultsInput } from "./compute";

export type ZoneLead = {
  id: string;
  name: string;
  habitat: string;
  observed: number;
  chao1: number;
  undetected: number;
  coverage: number;
  coverageDeficit: number;
  individuals: number;
};

export type Completeness = ReturnType<typeof completeness>;

export function completeness(input: ResultsInput) {
  const width = input.taxa.length;
  const total = new Array<number>(width).fill(0);
  const per = new Map(input.zones.map((z) => [z.id, new Array<number>(width).fill(0)]));
  for (const c of input.counts) {
    total[c.taxon] = (total[c.taxon] ?? 0) + c.individuals;
    const z = per.get(c.zoneId);
    if (z) z[c.taxon] = (z[c.taxon] ?? 0) + c.individuals;
  }
  const opts = { replicates: 0 };
  const ev = abundanceStats(total, opts);
  const zones: ZoneLead[] = input.zones.map((z) => {
    const s = abundanceStats(per.get(z.id)!, opts);
    const chao1 = s.chao1Classic.estimate;
    return {
      ...z,
      observed: s.observed,
      chao1,
      undetected: Math.max(0, chao1 - s.observed),
      coverage: s.coverage,
      coverageDeficit: 1 - s.coverage,
      individuals: s.individuals,
    };
  });
  // Unsampled zones first, then the largest coverage deficit, then the most undetected species.
  zones.sort(
    (a, b) =>
      (a.individuals === 0 ? -1 : 0) - (b.individuals === 0 ? -1 : 0) ||
      b.coverageDeficit - a.coverageDeficit ||
      b.undetected - a.undetected,
  );
  return {
    observed: ev.observed,
    chao1: ev.chao1Classic.estimate,
    chao1Lower: ev.chao1Classic.lower,
    chao1Upper: ev.chao1Classic.upper,
    share: ev.chao1Classic.estimate > 0 ? ev.observed / ev.chao1Classic.estimate : 0,
    coverage: ev.coverage,
    zones,
  };
}
