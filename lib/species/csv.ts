import { code, norm, readCsvLines } from "@/lib/csv/lines";
import {
  SENSITIVITIES,
  TAXON_GROUPS,
  TAXON_RANKS,
  type Sensitivity,
  type TaxonGroup,
  type TaxonRank,
} from "@/lib/domain";

// Species-list CSV: one taxon per line (read by lib/csv/lines.ts); every problem carries the
// line number a person sees in their spreadsheet or text editor (1 = the header line),
// so a report can say exactly which lines to fix. Pure: no database, no framework.

export const REQUIRED_COLUMNS = ["scientific_name", "rank", "taxon_group"] as const;
export const OPTIONAL_COLUMNS = ["sensitivity"] as const;
const COMMON_NAME = /^common_name_([a-z]{2})$/;
export const MAX_ROWS = 5000;
export const MAX_NAME_LENGTH = 200;

export type CsvProblemCode =
  | "empty"
  | "tooManyRows"
  | "unreadable"
  | "missingColumn"
  | "unknownColumn"
  | "duplicateColumn"
  | "missingValue"
  | "unknownGroup"
  | "unknownRank"
  | "unknownSensitivity"
  | "tooLong"
  | "duplicateName"
  | "wrongFieldCount"
  // Against the site's shared taxa (db/queries/setup-species.ts):
  | "groupConflict"
  | "rankConflict";

export type CsvProblem = {
  line: number;
  column?: string;
  code: CsvProblemCode;
  values?: Record<string, string | number>;
};

export type SpeciesRow = {
  line: number;
  scientificName: string;
  rank: TaxonRank;
  taxonGroup: TaxonGroup;
  sensitivity: Sensitivity | null; // null: not given in the file
  names: Record<string, string>; // locale → common name
};

export type ParsedSpecies = { rows: SpeciesRow[]; problems: CsvProblem[]; locales: string[] };

export function parseSpeciesCsv(text: string): ParsedSpecies {
  const problems: CsvProblem[] = [];
  const body = text.replace(/^\uFEFF/, ""); // a byte-order mark from spreadsheet exports
  if (!body.trim()) return { rows: [], problems: [{ line: 1, code: "empty" }], locales: [] };

  const read = readCsvLines(body, { maxRows: MAX_ROWS });
  const records = read.records;
  if (read.problems.some((p) => p.code === "tooManyRows")) return { rows: [], problems: read.problems, locales: [] };
  problems.push(...read.problems);
  if (records.length === 0) return { rows: [], problems: [{ line: 1, code: "empty" }], locales: [] };

  // Header: known columns only, each once.
  const header = records[0]!;
  const columns = header.cells.map(code);
  const locales: string[] = [];
  const seen = new Set<string>();
  columns.forEach((c, i) => {
    if (seen.has(c)) problems.push({ line: header.line, column: header.cells[i], code: "duplicateColumn" });
    seen.add(c);
    const m = COMMON_NAME.exec(c);
    if (m) locales.push(m[1]!);
    else if (
      !(REQUIRED_COLUMNS as readonly string[]).includes(c) &&
      !(OPTIONAL_COLUMNS as readonly string[]).includes(c)
    ) {
      problems.push({ line: header.line, column: header.cells[i] || `#${i + 1}`, code: "unknownColumn" });
    }
  });
  for (const required of REQUIRED_COLUMNS) {
    if (!columns.includes(required)) problems.push({ line: header.line, column: required, code: "missingColumn" });
  }
  if (problems.length) return { rows: [], problems, locales };
  if (records.length === 1) return { rows: [], problems: [{ line: header.line + 1, code: "empty" }], locales };

  const at = (cells: string[], name: string) => norm(cells[columns.indexOf(name)] ?? "");
  const rows: SpeciesRow[] = [];
  const firstLineOf = new Map<string, number>();
  for (const rec of records.slice(1)) {
    const before = problems.length;
    if (rec.cells.length !== columns.length) {
      problems.push({
        line: rec.line,
        code: "wrongFieldCount",
        values: { expected: columns.length, found: rec.cells.length },
      });
      continue;
    }
    const scientificName = at(rec.cells, "scientific_name");
    const rank = code(at(rec.cells, "rank"));
    const group = code(at(rec.cells, "taxon_group"));
    const sens = columns.includes("sensitivity") ? code(at(rec.cells, "sensitivity")) : "";
    if (!scientificName) problems.push({ line: rec.line, column: "scientific_name", code: "missingValue" });
    else if (scientificName.length > MAX_NAME_LENGTH)
      problems.push({
        line: rec.line,
        column: "scientific_name",
        code: "tooLong",
        values: { maximum: MAX_NAME_LENGTH },
      });
    if (!rank) problems.push({ line: rec.line, column: "rank", code: "missingValue" });
    else if (!(TAXON_RANKS as readonly string[]).includes(rank))
      problems.push({
        line: rec.line,
        column: "rank",
        code: "unknownRank",
        values: { value: at(rec.cells, "rank"), allowed: TAXON_RANKS.join(", ") },
      });
    if (!group) problems.push({ line: rec.line, column: "taxon_group", code: "missingValue" });
    else if (!(TAXON_GROUPS as readonly string[]).includes(group))
      problems.push({
        line: rec.line,
        column: "taxon_group",
        code: "unknownGroup",
        values: { value: at(rec.cells, "taxon_group"), allowed: TAXON_GROUPS.join(", ") },
      });
    if (sens && !(SENSITIVITIES as readonly string[]).includes(sens))
      problems.push({
        line: rec.line,
        column: "sensitivity",
        code: "unknownSensitivity",
        values: { value: at(rec.cells, "sensitivity"), allowed: SENSITIVITIES.join(", ") },
      });
    const names: Record<string, string> = {};
    for (const l of locales) {
      const v = at(rec.cells, `common_name_${l}`);
      if (v.length > MAX_NAME_LENGTH)
        problems.push({
          line: rec.line,
          column: `common_name_${l}`,
          code: "tooLong",
          values: { maximum: MAX_NAME_LENGTH },
        });
      else if (v) names[l] = v;
    }
    if (scientificName) {
      const key = scientificName.toLowerCase();
      const first = firstLineOf.get(key);
      if (first !== undefined)
        problems.push({
          line: rec.line,
          column: "scientific_name",
          code: "duplicateName",
          values: { name: scientificName, first },
        });
      else firstLineOf.set(key, rec.line);
    }
    if (problems.length === before) {
      rows.push({
        line: rec.line,
        scientificName,
        rank: rank as TaxonRank,
        taxonGroup: group as TaxonGroup,
        sensitivity: (sens || null) as Sensitivity | null,
        names,
      });
    }
  }
  return { rows, problems, locales };
}

/** The distinct line numbers with a problem, in order: what a person fixes. */
export function problemLines(problems: CsvProblem[]): number[] {
  return [...new Set(problems.map((p) => p.line))].sort((a, b) => a - b);
}
