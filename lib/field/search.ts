import MiniSearch from "minisearch";
import type { PackSpecies } from "./types";

// Offline species search over the event pack: common names in the person's language
// (then the event's other languages) and scientific names, forgiving accents, case and
// small typos; the species this person records most, and most lately, come first.

export type SpeciesHit = {
  taxonId: string;
  label: string;
  scientificName: string;
  otherNames: string[];
  onList: boolean;
  sensitivity: PackSpecies["sensitivity"];
  taxonGroup: string;
};

/** Usage per taxon on this device: how often, and when last. */
export type Usage = Record<string, { n: number; last: number }>;

/** Lower case, accents off ("Héron" → "heron", "Ánade" → "anade"), ß and œ spelled out. */
export function fold(text: string): string {
  return text
    .normalize("NFD")
    .replace(/\p{M}+/gu, "")
    .toLowerCase()
    .replace(/ß/g, "ss")
    .replace(/œ/g, "oe")
    .replace(/æ/g, "ae");
}

export function speciesLabel(s: PackSpecies, locale: string): string {
  return s.names[locale] ?? s.names.en ?? Object.values(s.names)[0] ?? s.scientificName;
}

type Doc = { id: string; common: string; others: string; scientific: string };

export type SpeciesIndex = { search(query: string, usage?: Usage, limit?: number): SpeciesHit[] };

/** A usage score: frequent and recent both count; a week-old habit fades (common practice for "recent first" lists). */
export function usageScore(u: { n: number; last: number } | undefined, now = Date.now()): number {
  if (!u) return 0;
  const ageDays = Math.max(0, (now - u.last) / 86_400_000);
  return Math.log2(1 + u.n) + 2 / (1 + ageDays);
}

/**
 * `mostRecorded`: the event's most-recorded taxa (the pack's list), shown after the person's
 * own recent ones before any typing.
 */
export function buildSpeciesIndex(species: PackSpecies[], locale: string, mostRecorded: string[] = []): SpeciesIndex {
  const byId = new Map(species.map((s) => [s.id, s]));
  const hit = (s: PackSpecies): SpeciesHit => ({
    taxonId: s.id,
    label: speciesLabel(s, locale),
    scientificName: s.scientificName,
    otherNames: Object.entries(s.names)
      .filter(([l]) => l !== locale)
      .map(([, n]) => n),
    onList: s.onList,
    sensitivity: s.sensitivity,
    taxonGroup: s.taxonGroup,
  });
  const mini = new MiniSearch<Doc>({
    fields: ["common", "scientific", "others"],
    storeFields: [],
    processTerm: (term) => fold(term),
    searchOptions: {
      boost: { common: 3, scientific: 2, others: 1 },
      prefix: true,
      // One typo in a short word, two in a longer one.
      fuzzy: (term) => (term.length <= 3 ? 0 : term.length <= 6 ? 1 : 2),
      combineWith: "AND",
    },
  });
  mini.addAll(
    species.map((s) => ({
      id: s.id,
      common: speciesLabel(s, locale),
      scientific: s.scientificName,
      others: Object.entries(s.names)
        .filter(([l]) => l !== locale)
        .map(([, n]) => n)
        .join(" "),
    })),
  );

  const alphabetical = [...species].sort(
    (a, b) =>
      Number(b.onList) - Number(a.onList) || speciesLabel(a, locale).localeCompare(speciesLabel(b, locale), locale),
  );

  return {
    search(query, usage = {}, limit = 30) {
      const q = query.trim();
      const now = Date.now();
      if (!q) {
        // No query: the person's recent and frequent species, then this event's most recorded, then the list A–Z.
        const used = species
          .filter((s) => usage[s.id])
          .sort((a, b) => usageScore(usage[b.id], now) - usageScore(usage[a.id], now));
        const popular = mostRecorded.flatMap((id) => {
          const s = byId.get(id);
          return s && !usage[id] ? [s] : [];
        });
        const first = new Set([...used, ...popular].map((s) => s.id));
        const rest = alphabetical.filter((s) => !first.has(s.id));
        return [...used, ...popular, ...rest].slice(0, limit).map(hit);
      }
      let results = mini.search(q, { boostDocument: (id) => 1 + usageScore(usage[String(id)], now) / 2 });
      if (results.length === 0)
        results = mini.search(q, {
          combineWith: "OR",
          boostDocument: (id) => 1 + usageScore(usage[String(id)], now) / 2,
        });
      return results.slice(0, limit).flatMap((r) => {
        const s = byId.get(String(r.id));
        return s ? [hit(s)] : [];
      });
    },
  };
}

export function recordUsage(usage: Usage, taxonId: string, now = Date.now()): Usage {
  const u = usage[taxonId];
  return { ...usage, [taxonId]: { n: (u?.n ?? 0) + 1, last: now } };
}
