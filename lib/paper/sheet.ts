import { code, norm, readCsvLines } from "@/lib/csv/lines";
import { SESSION_KINDS, type SessionKind } from "@/lib/domain";

// Paper data sheets, typed into one CSV file: each line is a count session or a sighting.
// Sightings name their session by the sheet's own label (`session_ref`), so a paper full
// list arrives with its records and counts as a complete unit. Parsed with papaparse in
// the style of lib/species/csv.ts: every problem carries the line number a person sees in
// their spreadsheet (1 = the header line); lines starting with "#" are notes (the
// template's list of allowed values) and are skipped. Pure: no database, no framework;
// names of zones, taxa and observers are checked against the event by
// db/queries/paper-sheets.ts.

export const SHEET_COLUMNS = [
  "line_type",
  "session_ref",
  "observer_email",
  "zone",
  "session_kind",
  "start",
  "end",
  "full_list",
  "distance_m",
  "taxon",
  "description",
  "count",
  "count_is_estimate",
  "observed_at",
  "latitude",
  "longitude",
  "accuracy_m",
  "notes",
] as const;
export type SheetColumn = (typeof SHEET_COLUMNS)[number];
export const LINE_TYPES = ["count_session", "sighting"] as const;
export const MAX_SHEET_ROWS = 5000;
export const MAX_TEXT = 2000;
export const MAX_COUNT = 1_000_000;

export type SheetProblemCode =
  | "empty"
  | "tooManyRows"
  | "unreadable"
  | "missingColumn"
  | "unknownColumn"
  | "duplicateColumn"
  | "wrongFieldCount"
  | "missingValue"
  | "unknownLineType"
  | "unknownSessionKind"
  | "notYesNo"
  | "notDateTime"
  | "endBeforeStart"
  | "fullListNeedsEnd"
  | "notNumber"
  | "countRange"
  | "latitudeRange"
  | "longitudeRange"
  | "coordinatesPair"
  | "noPlace"
  | "noTime"
  | "tooLong"
  | "duplicateSessionRef"
  | "unknownSessionRef"
  | "notForSighting"
  | "notForSession"
  // Against the event (db/queries/paper-sheets.ts):
  | "unknownZone"
  | "unknownTaxon"
  | "ambiguousTaxon"
  | "unknownObserver"
  | "sessionKindNotUsed";

export type SheetProblem = {
  line: number;
  column?: string;
  code: SheetProblemCode;
  values?: Record<string, string | number>;
};

/** A wall-clock time in the event's time zone, as "YYYY-MM-DDTHH:mm". */
export type LocalTime = string;

export type SheetSession = {
  type: "count_session";
  line: number;
  ref: string;
  observerEmail: string | null;
  zone: string | null;
  kind: SessionKind;
  start: LocalTime;
  end: LocalTime | null;
  fullList: boolean;
  distanceM: number | null;
  notes: string;
};

export type SheetSighting = {
  type: "sighting";
  line: number;
  ref: string | null;
  observerEmail: string | null;
  zone: string | null;
  taxon: string | null;
  description: string;
  count: number;
  countIsEstimate: boolean;
  /** null: the session's start. */
  observedAt: LocalTime | null;
  point: { latitude: number; longitude: number; accuracyM: number | null } | null;
  notes: string;
};

export type ParsedSheet = { sessions: SheetSession[]; sightings: SheetSighting[]; problems: SheetProblem[] };

const YES = new Set(["yes", "y", "true", "1", "sí", "si", "oui"]);
const NO = new Set(["no", "n", "false", "0", "non", ""]);
const DATE_TIME = /^(\d{4})-(\d{2})-(\d{2})[ T](\d{2}):(\d{2})$/;

/** "2026-06-20 09:15" (or with a T) → "2026-06-20T09:15", or null when it is not a real date and time. */
export function localTime(value: string): LocalTime | null {
  const m = DATE_TIME.exec(norm(value));
  if (!m) return null;
  const [y, mo, d, h, mi] = [+m[1]!, +m[2]!, +m[3]!, +m[4]!, +m[5]!];
  const date = new Date(Date.UTC(y, mo - 1, d, h, mi));
  if (date.getUTCFullYear() !== y || date.getUTCMonth() !== mo - 1 || date.getUTCDate() !== d || h > 23 || mi > 59)
    return null;
  return `${m[1]}-${m[2]}-${m[3]}T${m[4]}:${m[5]}`;
}

export function parseSheetCsv(text: string): ParsedSheet {
  const body = text.replace(/^\uFEFF/, "");
  const none = (problems: SheetProblem[]): ParsedSheet => ({ sessions: [], sightings: [], problems });
  if (!body.trim()) return none([{ line: 1, code: "empty" }]);
  const read = readCsvLines(body, { maxRows: MAX_SHEET_ROWS, comments: true });
  const records = read.records;
  const problems: SheetProblem[] = [...read.problems];
  if (problems.some((p) => p.code === "tooManyRows")) return none(problems);
  if (!records.length) return none([{ line: 1, code: "empty" }]);

  const header = records[0]!;
  const columns = header.cells.map(code);
  const seen = new Set<string>();
  columns.forEach((c, i) => {
    if (seen.has(c)) problems.push({ line: header.line, column: header.cells[i], code: "duplicateColumn" });
    seen.add(c);
    if (!(SHEET_COLUMNS as readonly string[]).includes(c))
      problems.push({ line: header.line, column: header.cells[i] || `#${i + 1}`, code: "unknownColumn" });
  });
  for (const required of ["line_type", "count"] as const)
    if (!columns.includes(required)) problems.push({ line: header.line, column: required, code: "missingColumn" });
  if (problems.length) return none(problems);
  if (records.length === 1) return none([{ line: header.line + 1, code: "empty" }]);

  const sessions: SheetSession[] = [];
  const sightings: SheetSighting[] = [];
  const refs = new Map<string, number>(); // session_ref (lower case) → its line
  const cellsOf = (cells: string[]) => (name: SheetColumn) => norm(cells[columns.indexOf(name)] ?? "");

  for (const rec of records.slice(1)) {
    const before = problems.length;
    const problem = (column: SheetColumn | undefined, c: SheetProblemCode, values?: SheetProblem["values"]) =>
      problems.push({ line: rec.line, ...(column ? { column } : {}), code: c, ...(values ? { values } : {}) });
    if (rec.cells.length !== columns.length) {
      problem(undefined, "wrongFieldCount", { expected: columns.length, found: rec.cells.length });
      continue;
    }
    const at = cellsOf(rec.cells);
    for (const c of SHEET_COLUMNS) if (at(c).length > MAX_TEXT) problem(c, "tooLong", { maximum: MAX_TEXT });
    if (problems.length > before) continue;

    const yesNo = (column: SheetColumn): boolean | null => {
      const v = at(column).toLowerCase();
      if (YES.has(v)) return true;
      if (NO.has(v)) return false;
      problem(column, "notYesNo", { value: at(column) });
      return null;
    };
    const number = (column: SheetColumn): number | null => {
      const v = at(column).replace(",", ".");
      if (!v) return null;
      const n = Number(v);
      if (!Number.isFinite(n)) {
        problem(column, "notNumber", { value: at(column) });
        return null;
      }
      return n;
    };
    const time = (column: SheetColumn, required: boolean): LocalTime | null => {
      const v = at(column);
      if (!v) {
        if (required) problem(column, "missingValue");
        return null;
      }
      const t = localTime(v);
      if (!t) problem(column, "notDateTime", { value: v });
      return t;
    };
    const email = at("observer_email").toLowerCase() || null;
    const zone = at("zone") || null;
    const ref = at("session_ref") || null;
    const notes = at("notes");
    const type = code(at("line_type"));

    if (type === "count_session") {
      for (const c of ["taxon", "description", "count", "count_is_estimate", "observed_at"] as const)
        if (at(c)) problem(c, "notForSession");
      if (!ref) problem("session_ref", "missingValue");
      else if (refs.has(ref.toLowerCase()))
        problem("session_ref", "duplicateSessionRef", { ref, first: refs.get(ref.toLowerCase())! });
      else refs.set(ref.toLowerCase(), rec.line);
      const kind = code(at("session_kind"));
      if (!kind) problem("session_kind", "missingValue");
      else if (!(SESSION_KINDS as readonly string[]).includes(kind))
        problem("session_kind", "unknownSessionKind", { value: at("session_kind"), allowed: SESSION_KINDS.join(", ") });
      const start = time("start", true);
      const end = time("end", false);
      if (start && end && end <= start) problem("end", "endBeforeStart");
      const fullList = yesNo("full_list");
      if (fullList && !at("end")) problem("full_list", "fullListNeedsEnd");
      const distanceM = number("distance_m");
      if (distanceM !== null && distanceM < 0) problem("distance_m", "notNumber", { value: at("distance_m") });
      if (problems.length === before)
        sessions.push({
          type: "count_session",
          line: rec.line,
          ref: ref!,
          observerEmail: email,
          zone,
          kind: kind as SessionKind,
          start: start!,
          end,
          fullList: fullList!,
          distanceM,
          notes,
        });
    } else if (type === "sighting") {
      for (const c of ["session_kind", "start", "end", "full_list", "distance_m"] as const)
        if (at(c)) problem(c, "notForSighting");
      if (ref && !refs.has(ref.toLowerCase())) problem("session_ref", "unknownSessionRef", { ref });
      const taxon = at("taxon") || null;
      const description = at("description");
      if (!taxon && !description) problem("taxon", "missingValue");
      const countText = at("count");
      let count = 0;
      if (!countText) problem("count", "missingValue");
      else {
        const n = Number(countText);
        if (!Number.isInteger(n)) problem("count", "notNumber", { value: countText });
        else if (n < 1 || n > MAX_COUNT) problem("count", "countRange", { maximum: MAX_COUNT });
        else count = n;
      }
      const estimate = yesNo("count_is_estimate");
      const observedAt = time("observed_at", false);
      if (!at("observed_at") && !ref) problem("observed_at", "noTime");
      const lat = number("latitude");
      const lon = number("longitude");
      const acc = number("accuracy_m");
      if (lat !== null && (lat < -90 || lat > 90)) problem("latitude", "latitudeRange");
      if (lon !== null && (lon < -180 || lon > 180)) problem("longitude", "longitudeRange");
      if ((lat === null) !== (lon === null) && at("latitude") !== at("longitude"))
        problem(lat === null ? "latitude" : "longitude", "coordinatesPair");
      if (acc !== null && acc < 0) problem("accuracy_m", "notNumber", { value: at("accuracy_m") });
      if (lat === null && lon === null && !zone && !ref) problem("zone", "noPlace");
      if (problems.length === before)
        sightings.push({
          type: "sighting",
          line: rec.line,
          ref,
          observerEmail: email,
          zone,
          taxon,
          description,
          count,
          countIsEstimate: estimate!,
          observedAt,
          point: lat !== null && lon !== null ? { latitude: lat, longitude: lon, accuracyM: acc } : null,
          notes,
        });
    } else if (!type) problem("line_type", "missingValue");
    else problem("line_type", "unknownLineType", { value: at("line_type"), allowed: LINE_TYPES.join(", ") });
  }
  return problems.length ? { sessions: [], sightings: [], problems } : { sessions, sightings, problems };
}

/** The template: notes with the allowed values (lines starting with "#"), then the header line. */
export function sheetTemplate(allowed: {
  event: string;
  timeZone: string;
  zones: string[];
  taxa: string[];
  sessionKinds: string[];
  notes: { intro: string; zones: string; taxa: string; kinds: string; times: string; lines: string };
}): string {
  const q = (s: string) => (/[",\n;]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s);
  const lines = [
    `# ${allowed.notes.intro}: ${allowed.event}`,
    `# ${allowed.notes.lines}: ${LINE_TYPES.join(" | ")}`,
    `# ${allowed.notes.times} (${allowed.timeZone}): YYYY-MM-DD HH:MM`,
    `# ${allowed.notes.kinds}: ${allowed.sessionKinds.join(" | ")}`,
    `# ${allowed.notes.zones}:`,
    ...allowed.zones.map((z) => `#   ${q(z)}`),
    `# ${allowed.notes.taxa}:`,
    ...allowed.taxa.map((t) => `#   ${q(t)}`),
    SHEET_COLUMNS.join(","),
  ];
  return lines.join("\r\n") + "\r\n";
}
