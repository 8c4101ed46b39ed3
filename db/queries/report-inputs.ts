import "server-only";
import { sql } from "drizzle-orm";
import type { Tx } from "../client";
import { NO_ZONE } from "@/lib/results/compute";
import { SESSION_RECORD, type InputRecord } from "@/lib/results/records";
import { sessionZonesSql } from "./results";

/**
 * A report's input records (lib/results/records.ts) as they are stored (table report_inputs,
 * migration 0021): one row per report, one array per field, every record at the same position
 * of each. Ids are a uuid[] (16 bytes each); every other string (review state, taxon, zone,
 * session, session's zone) is a position in `words` (1-based; 0 for null), so the int4 arrays
 * hold small repeating numbers that PostgreSQL's TOAST compression packs well. Records keep
 * their order; unpacking gives back exactly the records packed, so the input hash (which is
 * computed from the records, not from this form) means what it meant.
 */
export type PackedInputs = {
  ids: string[];
  words: string[];
  states: number[];
  taxa: number[];
  counts: number[];
  zones: number[];
  sessions: number[];
  sessionZones: number[];
};

export function packInputs(records: readonly InputRecord[]): PackedInputs {
  const index = new Map<string, number>();
  const words: string[] = [];
  const word = (w: string | null): number => {
    if (w === null) return 0;
    let i = index.get(w);
    if (i === undefined) {
      words.push(w);
      i = words.length;
      index.set(w, i);
    }
    return i;
  };
  const n = records.length;
  const p: PackedInputs = {
    ids: new Array<string>(n),
    words,
    states: new Array<number>(n),
    taxa: new Array<number>(n),
    counts: new Array<number>(n),
    zones: new Array<number>(n),
    sessions: new Array<number>(n),
    sessionZones: new Array<number>(n),
  };
  for (let i = 0; i < n; i++) {
    const [id, state, taxon, count, zone, session, sessionZone] = records[i]!;
    if (!Number.isInteger(count)) throw new Error(`input record ${id}: count ${count} is not an integer`);
    p.ids[i] = id;
    p.states[i] = word(state);
    p.taxa[i] = word(taxon);
    p.counts[i] = count;
    p.zones[i] = word(zone);
    p.sessions[i] = word(session);
    p.sessionZones[i] = word(sessionZone);
  }
  return p;
}

export function unpackInputs(p: PackedInputs): InputRecord[] {
  const n = p.ids.length;
  for (const k of ["states", "taxa", "counts", "zones", "sessions", "sessionZones"] as const)
    if (p[k].length !== n) throw new Error(`stored input records: ${k} holds ${p[k].length} values for ${n} ids`);
  const word = (i: number, nullable: boolean): string | null => {
    if (i === 0 && nullable) return null;
    const w = p.words[i - 1];
    if (w === undefined) throw new Error(`stored input records: word ${i} is not in the dictionary`);
    return w;
  };
  const out = new Array<InputRecord>(n);
  for (let i = 0; i < n; i++)
    out[i] = [
      p.ids[i]!,
      word(p.states[i]!, false)!,
      word(p.taxa[i]!, false)!,
      p.counts[i]!,
      word(p.zones[i]!, false)!,
      word(p.sessions[i]!, true),
      word(p.sessionZones[i]!, true),
    ];
  return out;
}

// Arrays cross the wire as one comma-joined text each (split and joined in C on the database's
// side, String.split on ours): far quicker than an array literal parsed element by element.
const joined = (xs: readonly (string | number)[]) => xs.join(",");
const split = (s: string | null): string[] => (s ? s.split(",") : []);
const numbers = (s: string | null): number[] => split(s).map(Number);

/** Stores the inputs of the report `reportId` is about to be (reports.id references this row). */
export async function insertReportInputs(reportId: string, records: readonly InputRecord[], tx: Tx): Promise<void> {
  const p = packInputs(records);
  const ints = (xs: number[]) => sql`string_to_array(${joined(xs)}, ',')::int4[]`;
  await tx.execute(sql`
    INSERT INTO report_inputs (report_id, record_count, ids, words, states, taxa, counts, zones, sessions, session_zones)
    VALUES (${reportId}, ${p.ids.length}, string_to_array(${joined(p.ids)}, ',')::uuid[],
      ARRAY(SELECT json_array_elements_text(${JSON.stringify(p.words)}::json)),
      ${ints(p.states)}, ${ints(p.taxa)}, ${ints(p.counts)}, ${ints(p.zones)}, ${ints(p.sessions)}, ${ints(p.sessionZones)})`);
}

/** The columns that read a report's stored inputs back (alias `i` for report_inputs). */
export const PACKED_COLUMNS = sql`array_to_string(i.ids, ',') AS "ids", to_json(i.words)::text AS "words",
  array_to_string(i.states, ',') AS "states", array_to_string(i.taxa, ',') AS "taxa",
  array_to_string(i.counts, ',') AS "counts", array_to_string(i.zones, ',') AS "zones",
  array_to_string(i.sessions, ',') AS "sessions", array_to_string(i.session_zones, ',') AS "sessionZones"`;

export type PackedText = Record<Exclude<keyof PackedInputs, never>, string | null>;

/** The records of a row read with PACKED_COLUMNS. */
export function recordsOfRow(row: PackedText): InputRecord[] {
  return unpackInputs({
    ids: split(row.ids),
    words: row.words ? (JSON.parse(row.words) as string[]) : [],
    states: numbers(row.states),
    taxa: numbers(row.taxa),
    counts: numbers(row.counts),
    zones: numbers(row.zones),
    sessions: numbers(row.sessions),
    sessionZones: numbers(row.sessionZones),
  });
}

/**
 * The records a report of the event would freeze now (the same as db/queries/results.ts
 * loadInputRecords: every approved, identified sighting and one record per complete count
 * session, by id), read as one comma-joined line per record: a quarter of the time of one
 * JSON array per row for a million-sighting event (scripts/bench-notes.md, "Publishing at scale").
 */
export async function loadEventInputRecords(eventId: string, tx: Tx): Promise<InputRecord[]> {
  const r = await tx.execute<{ l: string }>(sql`
    WITH sz AS (${sessionZonesSql(eventId)})
    SELECT x.id || ',' || x.state || ',' || x.taxon || ',' || x.n || ',' || x.zone || ',' ||
           coalesce(x.session::text, '') || ',' || coalesce(x.session_zone::text, '') AS l
    FROM (
      SELECT s.id, s.review_state::text AS state, s.taxon_id::text AS taxon, s.count AS n, coalesce(s.zone_id, ${NO_ZONE}::uuid) AS zone,
             sz.id AS session, CASE WHEN sz.id IS NOT NULL THEN coalesce(sz.zone_id, ${NO_ZONE}::uuid) END AS session_zone
      FROM sightings s LEFT JOIN sz ON sz.id = s.session_id
      WHERE s.event_id = ${eventId} AND s.review_state = 'approved' AND s.taxon_id IS NOT NULL
      UNION ALL
      SELECT sz.id, ${SESSION_RECORD}::text, '', 0, coalesce(sz.zone_id, ${NO_ZONE}::uuid), sz.id, coalesce(sz.zone_id, ${NO_ZONE}::uuid)
      FROM sz
    ) x ORDER BY x.id`);
  const out = new Array<InputRecord>(r.rows.length);
  for (let i = 0; i < out.length; i++) {
    // Every field is a uuid, a review state, "" or a number: none holds a comma.
    const f = r.rows[i]!.l.split(",");
    out[i] = [f[0]!, f[1]!, f[2]!, Number(f[3]), f[4]!, f[5] || null, f[6] || null];
  }
  return out;
}
