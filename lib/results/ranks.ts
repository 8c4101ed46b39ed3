// Taxon ranks → the taxa that count in a block (the event, or one zone). One rule
// (README "Statistics", method note "ranks"):
// - species count as themselves; subspecies, varieties and forms fold into their species;
// - a genus record counts as a distinct taxon only when no species of that genus is
//   recorded in the same block; otherwise it is left out of richness and frequency
//   counts (its individuals still show in the totals, marked);
// - a family record counts only when no record of the same taxon group in the block is
//   identified to genus or below (taxa carry no family link, so the rule cannot tell
//   which genera belong to the family; it errs towards fewer taxa, never more);
// - unidentified records (no taxon) never reach this code: loaders leave them out.
// Taxa carry no parent link (db/schema.ts taxa: scientific name and rank only), so the
// species of an infraspecific name is its first two words and the genus of a name its
// first word.

export type RankTaxon = { scientificName: string; rank: string; group: string };

export type RankStatus = "species" | "folded" | "aboveSpecies" | "leftOut" | "absent";

export type RankResolution = {
  /** For each taxon, the index of the unit (counted taxon) it adds to, or −1. */
  unitOf: Int32Array;
  units: number;
  status: RankStatus[];
};

const words = (name: string) =>
  name
    .trim()
    .toLowerCase()
    .replace(/\s+/g, " ")
    .split(" ")
    .filter((w) => w !== "×" && w !== "x");
export const genusKey = (name: string) => words(name)[0] ?? "";
export const speciesKey = (name: string) => words(name).slice(0, 2).join(" ");

const SPECIES_OR_BELOW = new Set(["species", "subspecies", "variety", "form"]);

export function resolveRanks(taxa: readonly RankTaxon[], present: (i: number) => boolean): RankResolution {
  const speciesGenera = new Set<string>();
  const groupsBelowFamily = new Set<string>();
  for (let i = 0; i < taxa.length; i++) {
    if (!present(i)) continue;
    const t = taxa[i]!;
    if (SPECIES_OR_BELOW.has(t.rank)) speciesGenera.add(genusKey(t.scientificName));
    if (t.rank !== "family") groupsBelowFamily.add(t.group);
  }
  const unitOf = new Int32Array(taxa.length).fill(-1);
  const status: RankStatus[] = [];
  const keys = new Map<string, number>();
  const unit = (key: string) => {
    let u = keys.get(key);
    if (u === undefined) keys.set(key, (u = keys.size));
    return u;
  };
  for (let i = 0; i < taxa.length; i++) {
    const t = taxa[i]!;
    if (!present(i)) {
      status.push("absent");
      continue;
    }
    if (SPECIES_OR_BELOW.has(t.rank)) {
      unitOf[i] = unit(`s:${speciesKey(t.scientificName)}`);
      status.push(t.rank === "species" ? "species" : "folded");
    } else if (t.rank === "genus") {
      const g = genusKey(t.scientificName);
      if (speciesGenera.has(g)) status.push("leftOut");
      else {
        unitOf[i] = unit(`g:${g}`);
        status.push("aboveSpecies");
      }
    } else {
      // family (or any rank above genus)
      if (groupsBelowFamily.has(t.group)) status.push("leftOut");
      else {
        unitOf[i] = unit(`f:${t.scientificName.trim().toLowerCase()}`);
        status.push("aboveSpecies");
      }
    }
  }
  return { unitOf, units: keys.size, status };
}
