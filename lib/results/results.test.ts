import { describe, expect, it } from "vitest";
import { computeResults, NO_ZONE, type ResultsTaxon } from "./compute";
import { generalise, gridCellKm, speciesCsv } from "./exports";
import { diffRecords, inputFromRecords, inputHash, type InputRecord } from "./records";

const taxon = (id: string, sensitivity: ResultsTaxon["sensitivity"] = "open"): ResultsTaxon => ({
  id,
  scientificName: `Genus ${id}`,
  rank: "species",
  group: "insects",
  sensitivity,
  names: { en: `Name "${id}", common` },
});
const zones = [
  { id: "z-edge", name: "Fringe", habitat: "edge" },
  { id: "z-int", name: "Heart", habitat: "interior" },
];

function records(): InputRecord[] {
  const out: InputRecord[] = [];
  let n = 0;
  const add = (taxonId: string, count: number, zone: string, session: string | null) =>
    out.push([
      `00000000-0000-0000-0000-${String(++n).padStart(12, "0")}`,
      "approved",
      taxonId,
      count,
      zone,
      session,
      session ? zone : null,
    ]);
  // The edge zone: many species, several seen once; the interior: few, common ones.
  for (let i = 0; i < 12; i++) add(`t${i}`, 1 + (i % 3), "z-edge", `s-e${i % 4}`);
  for (let i = 0; i < 8; i++) add(`t${i % 3}`, 5, "z-int", `s-i${i % 4}`);
  add("t20", 2, NO_ZONE, null);
  return out;
}

describe("lib/results", () => {
  const meta = new Map([...Array.from({ length: 21 }, (_, i) => taxon(`t${i}`))].map((t) => [t.id, t]));

  it("computes the event, each zone and an edge-against-interior sentence from the records", () => {
    const r = computeResults(inputFromRecords(records(), zones, meta));
    expect(r.totals.species).toBe(13); // 12 edge taxa + the one outside every zone
    expect(r.zones.find((z) => z.id === "z-edge")!.observed).toBe(12);
    expect(r.zones.find((z) => z.id === "z-int")!.observed).toBe(3);
    expect(r.totals.completeSessions).toBe(8);
    expect(r.comparison!.size).toBe(Math.min(...r.zones.map((z) => z.individuals)));
    expect(r.comparison!.kind).toBe("abundance");
    expect(r.comparison!.sentences).toEqual([expect.objectContaining({ a: "z-edge", b: "z-int", verdict: "more" })]);
    expect(r.comparison!.sentences[0]!.lower).toBeGreaterThan(0);
    expect(r.species[0]!.individuals).toBeGreaterThanOrEqual(r.species.at(-1)!.individuals);
  });

  it("hashes the records independently of their order and lists what changed", () => {
    const rs = records();
    expect(inputHash([...rs].reverse())).toBe(inputHash(rs));
    const next = rs
      .slice(1)
      .concat([["00000000-0000-0000-0000-999999999999", "approved", "t19", 1, "z-edge", null, null]]);
    next[0] = [...next[0]!] as InputRecord;
    next[0][3] = 40;
    const d = diffRecords(1, rs, next, (id) => `Genus ${id}`);
    expect(d).toMatchObject({ previousVersion: 1, added: 1, removed: 1, changed: 1, newTaxa: ["Genus t19"] });
  });

  it("generalises a point to its 0.1° cell centre with an uncertainty that covers the cell", () => {
    const g = generalise(-1.80437, 52.10712, 10);
    expect(g).toMatchObject({ lon: -1.85, lat: 52.15 });
    // A 0.1° cell at 52° N is 11.1 × 6.8 km (111.32 km per degree, common practice): half its diagonal is 6.53 km.
    expect(g.uncertaintyM).toBeGreaterThan(6500);
    expect(g.uncertaintyM).toBeLessThan(6700);
  });

  it("sizes the 0.1° cell per latitude: the same north–south everywhere, narrower east–west towards the poles", () => {
    // 111.32 km per degree (common practice); east–west × cos(latitude) on a sphere.
    expect(gridCellKm(0)).toEqual({ northSouth: 11.132, eastWest: 11.132 });
    expect(gridCellKm(52).eastWest).toBeCloseTo(6.85, 2); // 11.132 × cos 52° = 6.853
    expect(gridCellKm(-60).eastWest).toBeCloseTo(5.566, 3); // cos 60° = 0.5, south as north
    expect(gridCellKm(78).eastWest).toBeCloseTo(2.314, 3); // high Arctic: about a fifth of the equator's width
    expect(gridCellKm(90).eastWest).toBeCloseTo(0, 6);
  });

  it("quotes CSV fields that hold commas or quotes (RFC 4180)", () => {
    const r = computeResults(inputFromRecords(records(), zones, meta));
    const csv = speciesCsv(r, "en");
    expect(csv.split("\r\n")[0]).toBe(
      "scientificName,vernacularName,taxonRank,taxonGroup,individualCount,Fringe,Heart",
    );
    expect(csv).toContain('"Name ""t0"", common"');
  });
});
