import "server-only";
import { sql } from "drizzle-orm";
import type { CsvProblem, SpeciesRow } from "@/lib/species/csv";
import { getDb } from "../client";

// Species-list import. Taxa and their common names are shared by every event on the
// site, so an import follows these rules (the decision is also stated on the page):
// - a taxon is matched by its scientific name (case-insensitive) and never duplicated;
// - a common name already stored for a language is KEPT: one event's file cannot rename
//   what other events show; the report lists each name that was not applied;
// - a missing common name is added;
// - sensitivity is only ever raised (open → generalised → restricted), never lowered,
//   because lowering it would expose exact locations at other events;
// - a file that gives another taxon group or rank than the stored taxon is refused for
//   that line (a misfiled taxon would go to the wrong coordinators).

export type SpeciesNotice = {
  line: number;
  code: "newTaxon" | "alreadyListed" | "nameKept" | "nameAdded" | "sensitivityRaised" | "sensitivityKept";
  values?: Record<string, string | number>;
};
export type SpeciesSummary = {
  rows: number;
  newTaxa: number;
  addedToList: number;
  alreadyListed: number;
  namesAdded: number;
  namesKept: number;
};
export type SpeciesImportResult = {
  problems: CsvProblem[];
  notices: SpeciesNotice[];
  summary: SpeciesSummary;
  saved: boolean;
};

const LEVEL = { open: 0, generalised: 1, restricted: 2 } as const;

type Existing = {
  id: string;
  scientific_name: string;
  rank: string;
  taxon_group: string;
  sensitivity: keyof typeof LEVEL;
  names: Record<string, string> | null;
  listed: boolean;
};
type Tx = Parameters<Parameters<ReturnType<typeof getDb>["transaction"]>[0]>[0];

async function existingTaxa(tx: Tx, eventId: string, names: string[]): Promise<Map<string, Existing>> {
  if (!names.length) return new Map();
  const { rows } = await tx.execute<Existing>(sql`
    SELECT t.id, t.scientific_name, t.rank, t.taxon_group, t.sensitivity,
           (SELECT jsonb_object_agg(n.locale, n.name) FROM taxon_names n WHERE n.taxon_id = t.id) AS names,
           EXISTS (SELECT 1 FROM event_species es WHERE es.event_id = ${eventId} AND es.taxon_id = t.id) AS listed
    FROM taxa t
    WHERE lower(t.scientific_name) = ANY(${sql.param(names.map((n) => n.toLowerCase()))}::text[])`);
  return new Map(rows.map((r) => [r.scientific_name.toLowerCase(), r]));
}

function compare(rows: SpeciesRow[], existing: Map<string, Existing>) {
  const problems: CsvProblem[] = [];
  const notices: SpeciesNotice[] = [];
  const summary: SpeciesSummary = {
    rows: rows.length,
    newTaxa: 0,
    addedToList: 0,
    alreadyListed: 0,
    namesAdded: 0,
    namesKept: 0,
  };
  for (const row of rows) {
    const found = existing.get(row.scientificName.toLowerCase());
    if (!found) {
      summary.newTaxa++;
      summary.addedToList++;
      summary.namesAdded += Object.keys(row.names).length;
      notices.push({ line: row.line, code: "newTaxon", values: { name: row.scientificName } });
      continue;
    }
    if (found.taxon_group !== row.taxonGroup) {
      problems.push({
        line: row.line,
        column: "taxon_group",
        code: "groupConflict",
        values: { name: found.scientific_name, stored: found.taxon_group, given: row.taxonGroup },
      });
      continue;
    }
    if (found.rank !== row.rank) {
      problems.push({
        line: row.line,
        column: "rank",
        code: "rankConflict",
        values: { name: found.scientific_name, stored: found.rank, given: row.rank },
      });
      continue;
    }
    if (found.listed) {
      summary.alreadyListed++;
      notices.push({ line: row.line, code: "alreadyListed", values: { name: found.scientific_name } });
    } else summary.addedToList++;
    for (const [locale, name] of Object.entries(row.names)) {
      const stored = found.names?.[locale];
      if (stored === undefined) {
        summary.namesAdded++;
        notices.push({ line: row.line, code: "nameAdded", values: { locale, name } });
      } else if (stored !== name) {
        summary.namesKept++;
        notices.push({ line: row.line, code: "nameKept", values: { locale, stored, given: name } });
      }
    }
    if (row.sensitivity && row.sensitivity !== found.sensitivity) {
      if (LEVEL[row.sensitivity] > LEVEL[found.sensitivity])
        notices.push({
          line: row.line,
          code: "sensitivityRaised",
          values: { stored: found.sensitivity, given: row.sensitivity },
        });
      else
        notices.push({
          line: row.line,
          code: "sensitivityKept",
          values: { stored: found.sensitivity, given: row.sensitivity },
        });
    }
  }
  return { problems, notices, summary };
}

/**
 * Checks parsed rows against the shared taxa and, when `save` and nothing is wrong,
 * merges them into the event's species list, all in one transaction: either every line
 * is stored or none is.
 */
export async function importSpecies(eventId: string, rows: SpeciesRow[], save: boolean): Promise<SpeciesImportResult> {
  return getDb().transaction(async (tx) => {
    // One import per event at a time.
    await tx.execute(sql`SELECT id FROM events WHERE id = ${eventId} FOR UPDATE`);
    const existing = await existingTaxa(
      tx,
      eventId,
      rows.map((r) => r.scientificName),
    );
    const { problems, notices, summary } = compare(rows, existing);
    if (!save || problems.length) return { problems, notices, summary, saved: false };

    for (const row of rows) {
      const found = existing.get(row.scientificName.toLowerCase());
      let taxonId = found?.id;
      if (!taxonId) {
        // Another import may have added it since the check: take theirs.
        const { rows: made } = await tx.execute<{ id: string }>(sql`
          INSERT INTO taxa (scientific_name, rank, taxon_group, sensitivity)
          VALUES (${row.scientificName}, ${row.rank}, ${row.taxonGroup}, ${row.sensitivity ?? "open"})
          ON CONFLICT (lower(scientific_name)) DO UPDATE SET scientific_name = taxa.scientific_name
          RETURNING id`);
        taxonId = made[0]!.id;
      } else if (row.sensitivity && LEVEL[row.sensitivity] > LEVEL[found!.sensitivity]) {
        await tx.execute(sql`UPDATE taxa SET sensitivity = ${row.sensitivity} WHERE id = ${taxonId}`);
      }
      for (const [locale, name] of Object.entries(row.names)) {
        await tx.execute(
          sql`INSERT INTO taxon_names (taxon_id, locale, name) VALUES (${taxonId}, ${locale}, ${name}) ON CONFLICT DO NOTHING`,
        );
      }
      await tx.execute(
        sql`INSERT INTO event_species (event_id, taxon_id) VALUES (${eventId}, ${taxonId}) ON CONFLICT DO NOTHING`,
      );
    }
    return { problems, notices, summary, saved: true };
  });
}

/** The event's species list with names in every language, for the setup page. */
export async function listEventSpecies(eventId: string) {
  const { rows } = await getDb().execute<{
    id: string;
    scientificName: string;
    rank: string;
    taxonGroup: string;
    sensitivity: string;
    names: Record<string, string> | null;
  }>(sql`
    SELECT t.id, t.scientific_name AS "scientificName", t.rank, t.taxon_group AS "taxonGroup", t.sensitivity,
           (SELECT jsonb_object_agg(n.locale, n.name) FROM taxon_names n WHERE n.taxon_id = t.id) AS names
    FROM event_species es JOIN taxa t ON t.id = es.taxon_id
    WHERE es.event_id = ${eventId}
    ORDER BY t.taxon_group, t.scientific_name`);
  return rows.map((r) => ({ ...r, names: r.names ?? {} }));
}
