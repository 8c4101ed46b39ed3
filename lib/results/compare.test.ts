import { describe, expect, it } from "vitest";
import { sizeForCoverage } from "@/lib/diversity/compare";
import { abundanceStats } from "@/lib/diversity/index";
import { computeResults, warmResults, type ResultsInput, type ResultsTaxon } from "./compute";
import { bootstrapAtCoverage, differenceAtCoverage, forgetBootstraps, profileOf, sizeAtCoverage } from "./compare";

describe("comparison at equal coverage", () => {
  it("finds the same size for a coverage as the engine's bisection", () => {
    const samples = [
      [1, 1, 1, 2, 2, 3, 5, 8, 13, 40],
      [50, 20, 10, 5, 3, 2, 1, 1, 1, 1, 1, 1],
      Array.from({ length: 120 }, (_, i) => 1 + ((i * 7919) % 37)),
    ];
    for (const counts of samples) {
      const p = profileOf({ kind: "abundance", counts });
      for (const c of [0.1, 0.35, 0.6, 0.8, 0.9, 0.97, 0.995]) {
        const size = sizeForCoverage(p, c);
        expect(sizeAtCoverage(p, c), `${c}`).toBe(size);
        // A guess (the bootstrap's: the observed sample's size) only shortens the search.
        for (const guess of [1, size - 3, size, size + 1, p.size / 3, p.size - 1])
          expect(sizeAtCoverage(p, c, guess), `${c}, guess ${guess}`).toBe(size);
      }
    }
  });

  it("keeps drawn replicates: the same inputs give the same numbers whether drawn or kept, and a caller cannot change them", () => {
    const s = { kind: "abundance" as const, counts: [50, 20, 10, 5, 3, 2, 1, 1, 1, 1, 1, 1] };
    forgetBootstraps();
    const first = bootstrapAtCoverage(s, 0.9, { replicates: 50, seed: 7 });
    const kept = bootstrapAtCoverage(s, 0.9, { replicates: 50, seed: 7 });
    expect(Array.from(kept)).toEqual(Array.from(first));
    kept.fill(0);
    forgetBootstraps();
    expect(Array.from(bootstrapAtCoverage(s, 0.9, { replicates: 50, seed: 7 }))).toEqual(Array.from(first));
    expect(Array.from(bootstrapAtCoverage(s, 0.9, { replicates: 50, seed: 8 }))).not.toEqual(Array.from(first));
  });

  it("keeps the engine's Hill q = 1, 2 bootstrap too: kept or drawn again, the same intervals", () => {
    const counts = [50, 20, 10, 5, 3, 2, 1, 1, 1, 1, 1, 1];
    forgetBootstraps();
    const first = abundanceStats(counts).hill;
    expect(abundanceStats(counts).hill).toEqual(first);
    forgetBootstraps();
    expect(abundanceStats(counts).hill).toEqual(first);
    expect(abundanceStats(counts, { seed: 3 }).hill.q1.se).not.toBe(first.q1.se);
  });

  it("draws the abundance side's bootstraps from the counts first (warmResults) without changing a digit", () => {
    const taxa: ResultsTaxon[] = Array.from({ length: 30 }, (_, i) => ({
      id: `b${i}`,
      scientificName: `Avis s${i}`,
      rank: "species",
      group: "birds",
      sensitivity: "open",
      names: {},
    }));
    const zones = [
      { id: "e", name: "Edge", habitat: "edge" },
      { id: "i", name: "Inside", habitat: "interior" },
      { id: "w", name: "Wet", habitat: "interior" },
    ];
    const sessions = Array.from({ length: 45 }, (_, u) => ({
      zoneId: zones[u % 3]!.id,
      taxa: Array.from({ length: 1 + (u % 6) }, (_, k) => (u * 7 + k * k) % (10 + 10 * (u % 3))).sort((a, b) => a - b),
    }));
    const counts = sessions.flatMap((s, u) =>
      s.taxa.map((t) => ({ zoneId: s.zoneId, taxon: t, individuals: 1 + ((u * 13 + t) % 9) })),
    );
    const input: ResultsInput = { zones, taxa, counts, sessions };
    for (const kind of ["individuals", "clumps"] as const) {
      const x = { ...input, taxa: taxa.map((t) => ({ ...t, countUnit: kind })) };
      forgetBootstraps();
      const plain = JSON.stringify(computeResults(x, { bands: false }));
      forgetBootstraps();
      warmResults({ ...x, sessions: [] });
      const r = computeResults(x, { bands: false });
      expect(JSON.stringify(r)).toBe(plain);
      expect(r.comparison!.kind).toBe(kind === "individuals" ? "abundance" : "incidence");
    }
  });

  it("gives the same interval for the same seed and a real difference a sign", () => {
    const rich = { kind: "abundance" as const, counts: Array.from({ length: 40 }, (_, i) => 1 + (i % 5)) };
    const poor = { kind: "abundance" as const, counts: [30, 25, 20, 10, 5, 2, 1] };
    const d = differenceAtCoverage(rich, poor, 0.8, { replicates: 200, seed: 5 });
    expect(d).toEqual(differenceAtCoverage(rich, poor, 0.8, { replicates: 200, seed: 5 }));
    expect(d.lower).toBeGreaterThan(0);
  });

  it("compares on complete sessions when counts are not of individuals, and says 'more' only on an interval above 0", () => {
    const taxa: ResultsTaxon[] = Array.from({ length: 40 }, (_, i) => ({
      id: `p${i}`,
      scientificName: `Planta s${i}`,
      rank: "species",
      group: "vascular_plants",
      sensitivity: "open",
      names: {},
      countUnit: "clumps",
    }));
    const zones = [
      { id: "e", name: "Edge", habitat: "edge" },
      { id: "i", name: "Inside", habitat: "interior" },
    ];
    // Hand-made: the edge's 12 sessions each hold 8 of 40 species in rotation; the interior's hold the same 3.
    const sessions = [
      ...Array.from({ length: 12 }, (_, u) => ({
        zoneId: "e",
        taxa: Array.from({ length: 8 }, (_, k) => (u * 3 + k) % 40),
      })),
      ...Array.from({ length: 12 }, () => ({ zoneId: "i", taxa: [0, 1, 2] })),
    ];
    const counts = sessions.flatMap((s) => s.taxa.map((t) => ({ zoneId: s.zoneId, taxon: t, individuals: 2 })));
    const r = computeResults({ zones, taxa, counts, sessions });
    expect(r.comparison!.kind).toBe("incidence");
    expect(r.event.abundance).toBeNull();
    expect(r.comparison!.sentences[0]).toMatchObject({ a: "e", b: "i", verdict: "more" });
    expect(r.comparison!.sentences[0]!.lower).toBeGreaterThan(0);
  });
});
