import "server-only";
import { sql } from "drizzle-orm";
import type { Tx } from "../client";
import { NO_ZONE } from "@/lib/results/compute";
import {
  recordsOfColumns,
  SESSION_RECORD,
  uuidBytes,
  type InputColumns,
  type InputRecord,
} from "@/lib/results/records";
import { sessionZonesSql } from "./results";

/**
 * A report's input records (lib/results/records.ts) as they are stored (table report_inputs,
 * migration …_report_inputs_compact): one row per report, one array per field, every record
 * at the same position of each. Ids are a uuid[] (16 bytes each); every other string (review state, taxon, zone,
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

// Numbers cross the wire as one comma-joined text per array (joined and split in C on the
// database's side, String.split on ours): far quicker than an array literal parsed element by
// element, and a third of the bytes of their binary form (which travels as hex).
const joined = (xs: readonly (string | number)[]) => xs.join(",");
const split = (s: Buffer | string | null): string[] => (typeof s === "string" && s ? s.split(",") : []);
const numbers = (s: string | null): number[] => split(s).map(Number);

/**
 * The columns that read a report's stored inputs back (alias `i` for report_inputs). Ids leave
 * the database in binary form (array_send): printing a million uuids as text costs it seconds.
 */
export const PACKED_COLUMNS = sql`array_send(i.ids) AS "ids", to_json(i.words)::text AS "words",
  array_to_string(i.states, ',') AS "states", array_to_string(i.taxa, ',') AS "taxa",
  array_to_string(i.counts, ',') AS "counts", array_to_string(i.zones, ',') AS "zones",
  array_to_string(i.sessions, ',') AS "sessions", array_to_string(i.session_zones, ',') AS "sessionZones"`;

/** A row read with PACKED_COLUMNS (ids in binary form or comma-joined, words as a JSON array). */
export type PackedText = Record<Exclude<keyof PackedInputs, "ids">, string | null> & { ids: Buffer | string | null };

/** Where the elements of a one-dimensional binary array start, and how many there are. */
function arrayStart(b: Buffer): { n: number; at: number } {
  const dims = b.readInt32BE(0);
  if (dims === 0) return { n: 0, at: 12 };
  if (dims !== 1) throw new Error(`stored input records: an array has ${dims} dimensions`);
  return { n: b.readInt32BE(12), at: 20 };
}

const HEX = Array.from({ length: 256 }, (_, i) => i.toString(16).padStart(2, "0"));

/**
 * The uuids of a uuid[] in PostgreSQL's binary array form (array_send): its text form costs
 * seconds per million uuids on the database's side, this a fraction of one on ours.
 */
function uuidsOfArray(b: Buffer): string[] {
  const { n, at: start } = arrayStart(b);
  // Every uuid's 36 characters written into one ASCII buffer, then read out one string each.
  const text = Buffer.allocUnsafe(36 * n);
  let at = start;
  let w = 0;
  for (let i = 0; i < n; i++) {
    if (b.readInt32BE(at) !== 16) throw new Error("stored input records: an id is not a uuid");
    at += 4;
    for (let k = 0; k < 16; k++) {
      if (k === 4 || k === 6 || k === 8 || k === 10) text[w++] = 45; // "-"
      const h = HEX[b[at + k]!]!;
      text[w++] = h.charCodeAt(0);
      text[w++] = h.charCodeAt(1);
    }
    at += 16;
  }
  const out = new Array<string>(n);
  for (let i = 0; i < n; i++) out[i] = text.toString("latin1", 36 * i, 36 * i + 36);
  return out;
}

/** Comma-joined integers as an Int32Array, read in one pass (no string per number). */
function int32s(s: string | null): Int32Array {
  if (!s) return new Int32Array(0);
  let n = 1;
  for (let i = 0; i < s.length; i++) if (s.charCodeAt(i) === 44) n++;
  const out = new Int32Array(n);
  let k = 0;
  let v = 0;
  let sign = 1;
  let digits = 0;
  for (let i = 0; i <= s.length; i++) {
    const ch = i < s.length ? s.charCodeAt(i) : 44;
    if (ch === 44) {
      if (!digits) throw new Error("stored input records: an empty number");
      out[k++] = sign * v;
      v = 0;
      sign = 1;
      digits = 0;
    } else if (ch === 45 && !digits && sign === 1) sign = -1;
    else if (ch >= 48 && ch <= 57) {
      v = v * 10 + (ch - 48);
      digits++;
    } else throw new Error(`stored input records: "${s[i]}" in a number`);
  }
  return out;
}

/** The uuids of a binary uuid[] (array_send), their 16 bytes each, one after the other. */
function uuidBytesOfArray(b: Buffer): Buffer {
  const { n, at: start } = arrayStart(b);
  const out = Buffer.allocUnsafe(16 * n);
  for (let i = 0, at = start; i < n; i++, at += 20) {
    if (b.readInt32BE(at) !== 16) throw new Error("stored input records: an id is not a uuid");
    b.copy(out, 16 * i, at + 4, at + 20);
  }
  return out;
}

/** A row read with PACKED_COLUMNS, column by column (lib/results/records.ts InputColumns). */
export function columnsOfRow(row: PackedText): InputColumns {
  let ids: Buffer;
  if (Buffer.isBuffer(row.ids)) ids = uuidBytesOfArray(row.ids);
  else {
    const text = split(row.ids);
    ids = Buffer.allocUnsafe(16 * text.length);
    text.forEach((id, i) => uuidBytes(id, ids, 16 * i));
  }
  const c: InputColumns = {
    n: ids.length / 16,
    ids,
    words: row.words ? (JSON.parse(row.words) as string[]) : [],
    states: int32s(row.states),
    taxa: int32s(row.taxa),
    counts: int32s(row.counts),
    zones: int32s(row.zones),
    sessions: int32s(row.sessions),
    sessionZones: int32s(row.sessionZones),
  };
  for (const k of ["states", "taxa", "counts", "zones", "sessions", "sessionZones"] as const)
    if (c[k].length !== c.n) throw new Error(`stored input records: ${k} holds ${c[k].length} values for ${c.n} ids`);
  return c;
}

/** The records of a row read with PACKED_COLUMNS. */
export function recordsOfRow(row: PackedText): InputRecord[] {
  return unpackInputs({
    ids: Buffer.isBuffer(row.ids) ? uuidsOfArray(row.ids) : split(row.ids),
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
 * The records a report of the event would freeze now, packed by PostgreSQL itself: every
 * approved, identified sighting and one record per complete count session, by id (the same
 * records as db/queries/results.ts loadInputRecords), as one row of report_inputs' columns.
 * Words: "approved" (every sighting's state: only approved ones are read), "session" (a session
 * record's state), "" (its taxon), then the taxa, the zones and the complete sessions, each
 * numbered in id order. Each record's places are found by hash joins with these few hundred
 * words; the records are sorted once, by id (a plan that sorted them by zone and joined by merge,
 * chosen on a wrong estimate, took twice as long).
 */
export function packedEventInputsSql(eventId: string) {
  return sql`
    WITH sz AS (${sessionZonesSql(eventId)}),
    szn AS MATERIALIZED (
      SELECT id, coalesce(zone_id, ${NO_ZONE}::uuid) AS zone, row_number() OVER (ORDER BY id)::int AS k FROM sz
    ),
    rec AS MATERIALIZED (
      SELECT s.id, 1 AS state, s.taxon_id AS taxon, s.count AS n, coalesce(s.zone_id, ${NO_ZONE}::uuid) AS zone,
             z.k AS session, z.zone AS session_zone
      FROM sightings s LEFT JOIN szn z ON z.id = s.session_id
      WHERE s.event_id = ${eventId} AND s.review_state = 'approved' AND s.taxon_id IS NOT NULL
      UNION ALL
      SELECT z.id, 2, NULL::uuid, 0, z.zone, z.k, z.zone FROM szn z
    ),
    tx AS MATERIALIZED (
      SELECT taxon, row_number() OVER (ORDER BY taxon)::int AS k FROM (SELECT DISTINCT taxon FROM rec WHERE taxon IS NOT NULL) d
    ),
    -- A session's zone is also its own record's zone: the records' zones are all the zones.
    zn AS MATERIALIZED (SELECT zone, row_number() OVER (ORDER BY zone)::int AS k FROM (SELECT DISTINCT zone FROM rec) d),
    o AS (SELECT 3 + (SELECT count(*) FROM tx)::int AS zones, 3 + (SELECT count(*) FROM tx)::int + (SELECT count(*) FROM zn)::int AS sessions),
    x AS (
      SELECT r.id, r.state, 3 + coalesce(t.k, 0) AS taxon, r.n, o.zones + zn.k AS zone,
             coalesce(o.sessions + r.session, 0) AS session, coalesce(o.zones + zs.k, 0) AS session_zone
      FROM rec r CROSS JOIN o LEFT JOIN tx t ON t.taxon = r.taxon JOIN zn ON zn.zone = r.zone LEFT JOIN zn zs ON zs.zone = r.session_zone
      ORDER BY r.id
    )
    SELECT count(x.id)::int AS record_count, coalesce(array_agg(x.id), '{}') AS ids,
      ARRAY['approved', ${SESSION_RECORD}::text, '']
        || ARRAY(SELECT taxon::text FROM tx ORDER BY k) || ARRAY(SELECT zone::text FROM zn ORDER BY k)
        || ARRAY(SELECT id::text FROM szn ORDER BY k) AS words,
      coalesce(array_agg(x.state), '{}') AS states, coalesce(array_agg(x.taxon), '{}') AS taxa,
      coalesce(array_agg(x.n), '{}') AS counts, coalesce(array_agg(x.zone), '{}') AS zones,
      coalesce(array_agg(x.session), '{}') AS sessions, coalesce(array_agg(x.session_zone), '{}') AS session_zones
    FROM x`;
}

/**
 * The event's input records as a report would freeze them now, column by column. With `storeFor`,
 * PostgreSQL also stores them, packed, as the inputs of the report of that id (written next, it
 * references them): one statement, one snapshot, and no record crosses the wire twice.
 */
export async function loadEventInputs(
  eventId: string,
  tx: Tx,
  options: { storeFor?: string } = {},
): Promise<InputColumns> {
  const packed = packedEventInputsSql(eventId);
  const r = options.storeFor
    ? await tx.execute<PackedText>(sql`
      INSERT INTO report_inputs AS i (report_id, record_count, ids, words, states, taxa, counts, zones, sessions, session_zones)
      SELECT ${options.storeFor}::uuid, p.* FROM (${packed}) p
      RETURNING ${PACKED_COLUMNS}`)
    : await tx.execute<PackedText>(sql`SELECT ${PACKED_COLUMNS} FROM (${packed}) i`);
  return columnsOfRow(r.rows[0]!);
}

/** The event's input records as a report would freeze them now (loadEventInputs), as records. */
export async function loadEventInputRecords(
  eventId: string,
  tx: Tx,
  options: { storeFor?: string } = {},
): Promise<InputRecord[]> {
  return recordsOfColumns(await loadEventInputs(eventId, tx, options));
}

/** Stores inputs the database did not pack itself (the bench and tests), for the report `reportId` is about to be. */
export async function insertReportInputs(reportId: string, records: readonly InputRecord[], tx: Tx): Promise<void> {
  const p = packInputs(records);
  const ints = (xs: number[]) => sql`string_to_array(${joined(xs)}, ',')::int4[]`;
  await tx.execute(sql`
    INSERT INTO report_inputs (report_id, record_count, ids, words, states, taxa, counts, zones, sessions, session_zones)
    VALUES (${reportId}, ${p.ids.length}, string_to_array(${joined(p.ids)}, ',')::uuid[],
      ARRAY(SELECT json_array_elements_text(${JSON.stringify(p.words)}::json)),
      ${ints(p.states)}, ${ints(p.taxa)}, ${ints(p.counts)}, ${ints(p.zones)}, ${ints(p.sessions)}, ${ints(p.sessionZones)})`);
}
