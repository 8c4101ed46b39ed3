import { describe, expect, it } from "vitest";
import { computeResults, type ResultsInput, type ResultsTaxon } from "./compute";
import { genusKey, resolveRanks, speciesKey } from "./ranks";
import { SUFFICIENCY } from "./settings";

const tx = (
  id: string,
  scientificName: string,
  rank = "species",
  group = "insects",
  countUnit?: ResultsTaxon["countUnit"],
): ResultsTaxon => ({
  id,
  scientificName,
  rank,
  group,
  sensitivity: "open",
  names: { en: scientificName },
  ...(countUnit ? { countUnit } : {}),
});

describe("taxon ranks (one worked case per branch, hand-computed)", () => {
  it("derives genus and species from the name's first words", () => {
    expect(genusKey("Bombus terrestris audax")).toBe("bombus");
    expect(speciesKey("Bombus  terrestris audax")).toBe("bombus terrestris");
  });

  it("folds a subspecies into its species (recorded or not)", () => {
    const taxa = [
      tx("a", "Bombus terrestris"),
      tx("b", "Bombus terrestris audax", "subspecies"),
      tx("c", "Pieris rapae rapae", "variety"),
    ];
    const r = resolveRanks(taxa, () => true);
    expect(r.units).toBe(2); // B. terrestris (with audax), P. rapae
    expect(r.unitOf[1]).toBe(r.unitOf[0]);
    expect(r.status).toEqual(["species", "folded", "folded"]);
  });

  it("counts a genus record as a distinct taxon when no species of it is recorded in the block", () => {
    const r = resolveRanks([tx("a", "Bombus", "genus"), tx("b", "Pieris rapae")], () => true);
    expect(r.units).toBe(2);
    expect(r.status).toEqual(["aboveSpecies", "species"]);
  });

  it("leaves a genus record out when a species of that genus is recorded in the same block", () => {
    const r = resolveRanks([tx("a", "Bombus", "genus"), tx("b", "Bombus pascuorum")], () => true);
    expect(r.units).toBe(1);
    expect(r.unitOf[0]).toBe(-1);
    expect(r.status).toEqual(["leftOut", "species"]);
  });

  it("counts a family record only when nothing of its group is identified to genus or below", () => {
    const alone = resolveRanks([tx("a", "Apidae", "family"), tx("b", "Turdus merula", "species", "birds")], () => true);
    expect(alone.status).toEqual(["aboveSpecies", "species"]);
    const withGenus = resolveRanks([tx("a", "Apidae", "family"), tx("b", "Bombus", "genus")], () => true);
    expect(withGenus.status).toEqual(["leftOut", "aboveSpecies"]);
  });

  it("decides per block: a genus left out in the event may count in a zone without its species", () => {
    const taxa = [tx("g", "Bombus", "genus"), tx("s", "Bombus pascuorum")];
    const input: ResultsInput = {
      zones: [
        { id: "z1", name: "One", habitat: "edge" },
        { id: "z2", name: "Two", habitat: "interior" },
      ],
      taxa,
      counts: [
        { zoneId: "z1", taxon: 0, individuals: 3 },
        { zoneId: "z2", taxon: 1, individuals: 2 },
      ],
      sessions: [],
    };
    const r = computeResults(input);
    expect(r.event.observed).toBe(1);
    expect(r.event.individuals).toBe(5); // the genus record's individuals stay in the totals
    expect(r.event.leftOut).toEqual({ taxa: 1, individuals: 3 });
    expect(r.zones[0]!.observed).toBe(1); // z1 holds only the genus: it counts there
    expect(r.zones[0]!.leftOut.taxa).toBe(0);
    expect(r.species.find((s) => s.id === "g")!.rankStatus).toBe("leftOut");
  });
});

describe("units, sufficiency and honest comparisons", () => {
  it("empty complete sessions change T but not the observed richness", () => {
    const taxa = [tx("a", "Aus bus"), tx("b", "Aus cus")];
    const base: ResultsInput = {
      zones: [],
      taxa,
      counts: [
        { zoneId: "x", taxon: 0, individuals: 2 },
        { zoneId: "x", taxon: 1, individuals: 1 },
      ],
      sessions: [
        { zoneId: "x", taxa: [0, 1] },
        { zoneId: "x", taxa: [0] },
        { zoneId: "x", taxa: [0] },
      ],
    };
    const more = { ...base, sessions: [...base.sessions, { zoneId: "x", taxa: [] }, { zoneId: "x", taxa: [] }] };
    const a = computeResults(base);
    const b = computeResults(more);
    expect(b.event.completeSessions).toBe(a.event.completeSessions + 2);
    expect(b.event.observed).toBe(a.event.observed);
    expect(b.event.incidence!.units).toBe(5);
  });

  it("a block with one individual is too few records: no estimates, no 100% coverage", () => {
    const r = computeResults({
      zones: [],
      taxa: [tx("a", "Aus bus")],
      counts: [{ zoneId: "x", taxon: 0, individuals: 1 }],
      sessions: [],
    });
    expect(r.event.tooFew).toBe(true);
    expect(r.event.reasons).toEqual(expect.arrayContaining(["individuals", "sessions"]));
    expect(r.event.abundance).toBeNull();
    expect(r.event.incidence).toBeNull();
    expect(r.event.rarefaction).toEqual([]);
  });

  it("counts that are not individuals give incidence-based estimates only", () => {
    const taxa = Array.from({ length: 8 }, (_, i) => tx(`f${i}`, `Fungus sp${i}`, "species", "fungi"));
    const counts = taxa.map((_, i) => ({ zoneId: "x", taxon: i, individuals: 5 }));
    const sessions = Array.from({ length: 6 }, (_, u) => ({ zoneId: "x", taxa: [u % 8, (u + 1) % 8, (u + 3) % 8] }));
    const r = computeResults({ zones: [], taxa, counts, sessions });
    expect(r.event.countUnits).toEqual(["presence"]); // fungi default: presence only
    expect(r.event.reasons).toContain("countUnits");
    expect(r.event.abundance).toBeNull();
    expect(r.event.incidence).not.toBeNull();
    expect(r.event.tooFew).toBe(false);
  });

  it("says 'no clear difference' when the bootstrap interval of the difference includes 0, and leaves out a too-small zone with its reason", () => {
    const taxa = Array.from({ length: 30 }, (_, i) => tx(`t${i}`, `Genus s${i}`));
    const counts: ResultsInput["counts"] = [];
    // Two zones drawn alike (hand-made): the same 12 species with the same counts, one extra singleton each.
    for (let i = 0; i < 12; i++)
      for (const z of ["e", "i"]) counts.push({ zoneId: z, taxon: i, individuals: 1 + (i % 4) });
    counts.push({ zoneId: "e", taxon: 20, individuals: 1 }, { zoneId: "i", taxon: 21, individuals: 1 });
    counts.push({ zoneId: "few", taxon: 25, individuals: 3 });
    const zones = [
      { id: "e", name: "Edge", habitat: "edge" },
      { id: "i", name: "Inside", habitat: "interior" },
      { id: "few", name: "Few", habitat: "other" },
    ];
    const r = computeResults({ zones, taxa, counts, sessions: [] });
    const c = r.comparison!;
    expect(c.zones.map((z) => z.id)).toEqual(["e", "i"]);
    expect(c.leftOut).toEqual([expect.objectContaining({ id: "few", reasons: ["individuals"] })]);
    expect(c.sentences).toHaveLength(1);
    expect(c.sentences[0]!.verdict).toBe("noClearDifference");
    expect(c.sentences[0]!.lower).toBeLessThan(0);
    expect(c.sentences[0]!.upper).toBeGreaterThan(0);
    expect(c.replicates).toBeGreaterThanOrEqual(200);
    // Fixed seed: the same numbers every time.
    expect(computeResults({ zones, taxa, counts, sessions: [] }).comparison!.sentences).toEqual(c.sentences);
    expect(SUFFICIENCY.minIndividuals).toBe(20);
  });
});
