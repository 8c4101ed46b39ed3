import { describe, expect, it } from "vitest";
import { compareEvents, type EventSide } from "./compare-events";
import type { ResultsTaxon } from "./compute";

// Hand-made cases (invented counts, not a published example): the verdict follows the
// bootstrap interval of the difference at equal coverage, as between zones.
const bird = (i: number): ResultsTaxon => ({
  id: `t${i}`,
  scientificName: `Avis s${i}`,
  rank: "species",
  group: "birds",
  sensitivity: "open",
  names: {},
});

/** An event whose species `from..to` were counted `each(i)` times, all in one zone. */
function side(id: string, species: number[], each: (i: number) => number): EventSide {
  const taxa = species.map(bird);
  return {
    id,
    name: id,
    startsAt: "2026-06-20T05:00:00Z",
    input: {
      taxa,
      counts: species.map((s, i) => ({ zoneId: "z", taxon: i, individuals: each(s) })),
      sessions: [],
    },
  };
}
const range = (a: number, b: number) => Array.from({ length: b - a }, (_, i) => a + i);

describe("between events of one site", () => {
  it("says 'more' when this year's richness at equal coverage is above last year's beyond its interval", () => {
    // This year: 60 species, well sampled (each 3 to 12 individuals); last year: 20 of them.
    const now = side("2026", range(0, 60), (i) => 3 + (i % 10));
    const before = side("2025", range(0, 20), (i) => 3 + (i % 10));
    const c = compareEvents(now, before);
    expect(c.kind).toBe("abundance");
    expect(c.events.map((e) => [e.id, e.observed])).toEqual([
      ["2026", 60],
      ["2025", 20],
    ]);
    expect(c.coverage).toBeGreaterThan(0.5);
    expect(c.sentence).toMatchObject({ a: "2026", b: "2025", verdict: "more" });
    expect(c.sentence!.lower).toBeGreaterThan(0);
    // Hill numbers at the common coverage: q = 0 ≥ q = 1 ≥ q = 2 in each event (Hill numbers never rise with q).
    for (const e of c.events) {
      const [h0, h1, h2] = e.hill.map((h) => h.estimate);
      expect(e.hill.map((h) => h.order)).toEqual([0, 1, 2]);
      expect(h0!).toBeGreaterThanOrEqual(h1! - 1e-9);
      expect(h1!).toBeGreaterThanOrEqual(h2! - 1e-9);
    }
    // The other way round the verdict turns, with the same size of difference.
    const back = compareEvents(before, now);
    expect(back.sentence).toMatchObject({ a: "2025", b: "2026", verdict: "fewer" });
    expect(back.sentence!.difference).toBeCloseTo(-c.sentence!.difference, 9);
  });

  it("says 'no clear difference' for two years with the same assemblage, and matches taxa by id", () => {
    const now = side("2026", range(0, 30), (i) => 2 + (i % 7));
    // The same species listed in another order: matched by id, not by position.
    const before = side("2025", range(0, 30).reverse(), (i) => 2 + (i % 7));
    const c = compareEvents(now, before);
    expect(c.sentence?.verdict).toBe("noClearDifference");
    expect(c.sentence!.lower).toBeLessThanOrEqual(0);
    expect(c.sentence!.upper).toBeGreaterThanOrEqual(0);
    expect(c.events[0]!.atCoverage!.richness).toBeCloseTo(c.events[1]!.atCoverage!.richness, 9);
  });

  it("leaves an event with too few records out, with its reason, and gives no verdict", () => {
    const now = side("2026", range(0, 40), (i) => 3 + (i % 5));
    const before = side("2025", [1, 2, 3], () => 1); // 3 individuals: below the sufficiency threshold
    const c = compareEvents(now, before);
    expect(c.sentence).toBeNull();
    expect(c.leftOut).toEqual([
      expect.objectContaining({ id: "2025", reasons: expect.arrayContaining(["individuals"]) }),
    ]);
    expect(c.events[1]).toMatchObject({ id: "2025", observed: 3, atCoverage: null });
  });

  it("reproduces exactly: the same inputs give the same interval (fixed seed)", () => {
    const now = side("2026", range(0, 45), (i) => 1 + (i % 9));
    const before = side("2025", range(5, 40), (i) => 1 + (i % 6));
    expect(compareEvents(now, before)).toEqual(compareEvents(now, before));
  });
});
