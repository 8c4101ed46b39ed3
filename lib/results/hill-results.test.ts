import { describe, expect, it } from "vitest";
import { computeResults, hillSizes, NO_ZONE, type ResultsInput, type ResultsTaxon } from "./compute";
import { HILL_RESULTS } from "./settings";

const taxon = (i: number, group = "insects"): ResultsTaxon => ({
  id: `t${i}`,
  scientificName: `Genus species${i}`,
  rank: "species",
  group,
  sensitivity: "open",
  names: {},
});
const zones = [
  { id: "a", name: "Fringe", habitat: "edge" },
  { id: "b", name: "Heart", habitat: "interior" },
  { id: "c", name: "Meadow", habitat: "interior" },
];

// Hand-made: three zones over 15 taxa with uneven counts, four complete sessions each.
function input(group = "insects"): ResultsInput {
  const taxa = Array.from({ length: 15 }, (_, i) => taxon(i, group));
  const counts: ResultsInput["counts"] = [];
  const sessions: ResultsInput["sessions"] = [];
  zones.forEach((z, zi) => {
    for (let i = zi * 3; i < zi * 3 + 9; i++)
      counts.push({ zoneId: z.id, taxon: i, individuals: 1 + ((i * 7 + zi) % 6) });
    for (let s = 0; s < 4; s++) sessions.push({ zoneId: z.id, taxa: [zi * 3 + s, zi * 3 + s + 2, zi * 3 + 5] });
  });
  counts.push({ zoneId: NO_ZONE, taxon: 14, individuals: 2 });
  return { zones, taxa, counts, sessions };
}

describe("Hill curves, profile and zone similarity in the results", () => {
  const r = computeResults(input());

  it("records the settings and seed the bands came from", () => {
    expect(r.rules.hill).toEqual({ ...HILL_RESULTS, bands: true });
  });

  it("draws q = 0, 1, 2 per block up to twice the sample, non-decreasing in size, with coverage rising in [0, 1]", () => {
    for (const b of [r.event, ...r.zones]) {
      const h = b.hill!;
      expect(h.kind).toBe("abundance");
      const n = b.individuals - b.leftOut.individuals;
      expect(new Set(h.curve.map((x) => x.order))).toEqual(new Set([0, 1, 2]));
      expect(Math.max(...h.curve.map((x) => x.size))).toBe(2 * n);
      expect(h.curve.filter((x) => x.part === "observed").map((x) => x.size)).toEqual([n, n, n]);
      for (const q of [0, 1, 2]) {
        const rows = h.curve.filter((x) => x.order === q);
        for (let i = 1; i < rows.length; i++) {
          expect(rows[i]!.estimate).toBeGreaterThanOrEqual(rows[i - 1]!.estimate - 1e-9);
          expect(rows[i]!.coverage).toBeGreaterThanOrEqual(rows[i - 1]!.coverage - 1e-12);
        }
        for (const x of rows) {
          expect(x.coverage).toBeGreaterThanOrEqual(0);
          expect(x.coverage).toBeLessThanOrEqual(1);
          expect(x.lower).toBeLessThanOrEqual(x.estimate);
          expect(x.upper).toBeGreaterThanOrEqual(x.estimate);
          expect(x.replicates).toBe(HILL_RESULTS.replicates);
        }
      }
      expect(h.profile.map((x) => x.order)).toEqual([...HILL_RESULTS.profileOrders]);
      // Observed Hill numbers never rise with q (the estimators of neighbouring q need not be ordered).
      for (let i = 1; i < h.profile.length; i++)
        expect(h.profile[i]!.observed).toBeLessThanOrEqual(h.profile[i - 1]!.observed + 1e-9);
      for (const x of h.profile) expect(x.lower).toBeLessThanOrEqual(x.estimate);
    }
  });

  it("gives a symmetric zone × zone table with 1 on the diagonal, and beta between 1 and the number of zones", () => {
    const s = r.similarity!;
    expect(s.kind).toBe("abundance");
    expect(s.zones.map((z) => z.id)).toEqual(["a", "b", "c"]);
    for (let i = 0; i < 3; i++) {
      expect(s.cells[i]![i]!.sorensenAdjusted).toBeCloseTo(1, 12);
      expect(s.cells[i]![i]!.jaccardAdjusted).toBeCloseTo(1, 12);
      expect(s.cells[i]![i]!.shared).toBe(r.zones[i]!.observed);
      for (let j = 0; j < 3; j++) {
        expect(s.cells[i]![j]).toEqual(s.cells[j]![i]);
        for (const v of [s.cells[i]![j]!.sorensenAdjusted, s.cells[i]![j]!.jaccardAdjusted]) {
          expect(v).toBeGreaterThanOrEqual(0);
          expect(v).toBeLessThanOrEqual(1);
        }
        expect(s.cells[i]![j]!.jaccardAdjusted).toBeLessThanOrEqual(s.cells[i]![j]!.sorensenAdjusted + 1e-12);
      }
    }
    // Hand count: zones a (t0–t8), b (t3–t11) and c (t6–t14) share 6 taxa pairwise when adjacent, 3 between a and c.
    expect(s.cells[0]![1]!.shared).toBe(6);
    expect(s.cells[0]![2]!.shared).toBe(3);
    expect(s.beta.map((b) => b.order)).toEqual([0, 1, 2]);
    for (const b of s.beta) {
      expect(b.beta).toBeGreaterThanOrEqual(1 - 1e-12);
      expect(b.beta).toBeLessThanOrEqual(3 + 1e-12);
    }
    expect(s.beta[0]!.gamma).toBeCloseTo(15, 12); // every taxon is in some zone
  });

  it("gives each pair of zones a bootstrap interval of the corrected indices, inside [0, 1], none on the diagonal", () => {
    const s = r.similarity!;
    expect(s.replicates).toBeGreaterThanOrEqual(200);
    for (let i = 0; i < 3; i++) {
      expect(s.cells[i]![i]!.sorensenInterval).toBeNull();
      for (let j = 0; j < 3; j++) {
        if (i === j) continue;
        const c = s.cells[i]![j]!;
        for (const iv of [c.sorensenInterval!, c.jaccardInterval!]) {
          expect(iv[0]).toBeGreaterThanOrEqual(0);
          expect(iv[1]).toBeLessThanOrEqual(1);
          expect(iv[0]).toBeLessThanOrEqual(iv[1]);
        }
        // Overlapping zones: the interval has width (the redraws differ), and Jaccard's sits at or below Sørensen's.
        expect(c.sorensenInterval![1] - c.sorensenInterval![0]).toBeGreaterThan(0);
        expect(c.jaccardInterval![1]).toBeLessThanOrEqual(c.sorensenInterval![1] + 1e-12);
      }
    }
    // Fixed seed: the same records give the same intervals.
    expect(computeResults(input()).similarity).toEqual(s);
  });

  it("gives zones with nothing in common an interval of [0, 0]", () => {
    const taxa = Array.from({ length: 20 }, (_, i) => taxon(i));
    const counts = [
      ...Array.from({ length: 10 }, (_, i) => ({ zoneId: "a", taxon: i, individuals: 3 + (i % 4) })),
      ...Array.from({ length: 10 }, (_, i) => ({ zoneId: "b", taxon: 10 + i, individuals: 3 + (i % 4) })),
    ];
    const s = computeResults({ zones: zones.slice(0, 2), taxa, counts, sessions: [] }).similarity!;
    expect(s.cells[0]![1]!.sorensenInterval).toEqual([0, 0]);
    expect(s.cells[0]![1]!.jaccardInterval).toEqual([0, 0]);
  });

  it("uses complete sessions when counts are not of individuals", () => {
    const p = computeResults(input("fungi"));
    expect(p.event.hill?.kind).toBe("incidence");
    expect(p.similarity?.kind).toBe("incidence");
    const rows = p.event.hill!.curve.filter((x) => x.order === 0);
    expect(Math.max(...rows.map((x) => x.size))).toBe(2 * p.event.completeSessions);
  });

  it("without bands gives the same estimates with no band, and reproduces exactly with them", () => {
    const quick = computeResults(input(), { bands: false });
    expect(quick.rules.hill.bands).toBe(false);
    expect(quick.event.hill!.curve.map((x) => x.estimate)).toEqual(r.event.hill!.curve.map((x) => x.estimate));
    expect(quick.event.hill!.curve.every((x) => x.replicates === 0)).toBe(true);
    expect(JSON.stringify(computeResults(input()))).toBe(JSON.stringify(r));
  });

  it("without bands leaves the similarity intervals for later and keeps every other number, the comparison's verdicts included", () => {
    const quick = computeResults(input(), { bands: false });
    const s = quick.similarity!;
    expect(s.replicates).toBe(0);
    expect(s.cells.flat().every((c) => c.sorensenInterval === null && c.jaccardInterval === null)).toBe(true);
    const strip = (x: typeof r) => ({
      ...x,
      rules: null,
      event: { ...x.event, hill: null },
      zones: x.zones.map((z) => ({ ...z, hill: null })),
      similarity: {
        ...x.similarity!,
        replicates: 0,
        cells: x.similarity!.cells.map((row) =>
          row.map((c) => ({ ...c, sorensenInterval: null, jaccardInterval: null })),
        ),
      },
    });
    expect(JSON.stringify(strip(quick))).toBe(JSON.stringify(strip(r)));
    expect(quick.comparison!.sentences.length).toBeGreaterThan(0);
    expect(quick.comparison!.replicates).toBe(r.comparison!.replicates);
  });

  it("spaces the sizes from 1 to twice the sample and includes the sample", () => {
    expect(hillSizes(0)).toEqual([]);
    const s = hillSizes(1000);
    expect(s[0]).toBe(1);
    expect(s.at(-1)).toBe(2000);
    expect(s).toContain(1000);
    expect(s.length).toBeLessThanOrEqual(HILL_RESULTS.points + 1);
  });
});
