import { describe, expect, it } from "vitest";
import { SEED_TAXA } from "@/db/seed/taxa";
import { buildSpeciesIndex, fold, recordUsage, type Usage } from "./search";
import type { PackSpecies } from "./types";

const species: PackSpecies[] = SEED_TAXA.map((t, i) => ({
  id: `00000000-0000-4000-8000-${String(i).padStart(12, "0")}`,
  scientificName: t.scientificName,
  rank: "species",
  taxonGroup: t.group,
  sensitivity: t.sensitivity ?? "open",
  onList: true,
  names: { en: t.names.en, es: t.names.es, fr: t.names.fr },
}));
const idOf = (scientific: string) => species.find((s) => s.scientificName === scientific)!.id;

describe("offline species search", () => {
  it("folds accents and case", () => {
    expect(fold("Héron CENDRÉ")).toBe("heron cendre");
    expect(fold("Ánade azulón")).toBe("anade azulon");
  });

  it("finds a species by its common name in the person's language, typed without accents", () => {
    const fr = buildSpeciesIndex(species, "fr");
    expect(fr.search("heron cendre")[0]?.scientificName).toBe("Ardea cinerea");
    expect(fr.search("heron cendre")[0]?.label).toBe("Héron cendré");
    const es = buildSpeciesIndex(species, "es");
    expect(es.search("anade azulon")[0]?.label).toBe("Ánade azulón");
  });

  it("finds a species by its scientific name, and by the start of a word", () => {
    const en = buildSpeciesIndex(species, "en");
    expect(en.search("Ardea cinerea")[0]?.label).toBe("Grey heron");
    expect(en.search("falco tinn")[0]?.label).toBe("Common kestrel");
  });

  it("forgives a typo", () => {
    const en = buildSpeciesIndex(species, "en");
    expect(en.search("mallrd")[0]?.scientificName).toBe("Anas platyrhynchos");
    expect(en.search("kestrle")[0]?.scientificName).toBe("Falco tinnunculus");
  });

  it("puts the person's frequent and recent species first", () => {
    const en = buildSpeciesIndex(species, "en");
    const before = en.search("");
    let usage: Usage = {};
    const old = Date.now() - 10 * 86_400_000;
    for (let i = 0; i < 5; i++) usage = recordUsage(usage, idOf("Anas platyrhynchos"), old);
    usage = recordUsage(usage, idOf("Ardea cinerea"));
    const after = en.search("", usage);
    expect(
      after
        .slice(0, 2)
        .map((h) => h.scientificName)
        .sort(),
    ).toEqual(["Anas platyrhynchos", "Ardea cinerea"]);
    expect(before[0]?.scientificName).not.toBe(after[0]?.scientificName);
    expect(after.length).toBe(before.length);
  });

  it("before any typing, shows the person's recent species, then the event's most recorded, then the rest", () => {
    const popular = [idOf("Falco tinnunculus"), idOf("Ardea cinerea"), idOf("Erithacus rubecula")];
    const en = buildSpeciesIndex(species, "en", popular);
    const usage = recordUsage({}, idOf("Ardea cinerea"));
    const list = en.search("", usage).map((h) => h.scientificName);
    expect(list.slice(0, 3)).toEqual(["Ardea cinerea", "Falco tinnunculus", "Erithacus rubecula"]);
    expect(new Set(list).size).toBe(list.length); // nobody twice
    // Typing searches as before: the matches, whatever is popular.
    expect(en.search("mallard", usage)[0]?.scientificName).toBe("Anas platyrhynchos");
  });
});
