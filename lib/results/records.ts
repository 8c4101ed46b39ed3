// The exact input records of a report and what follows from them: the sha256 that a
// report carries, the ResultsInput they give, and what changed between two versions.
import { createHash } from "node:crypto";
import { NO_ZONE, type ResultsInput, type ResultsTaxon } from "./compute";

/**
 * One approved sighting as results use it:
 * [sighting id, review state, taxon id, count, zone (NO_ZONE if none),
 *  complete count session id or null, that session's zone (NO_ZONE if none) or null].
 * Every complete count session is also one record of its own, so that a session with
 * nothing approved in it still counts as a sampling unit:
 * [session id, "session", "", 0, session's zone, session id, session's zone].
 */
export type InputRecord = [string, string, string, number, string, string | null, string | null];

export const SESSION_RECORD = "session";
export const isSessionRecord = (r: InputRecord) => r[1] === SESSION_RECORD;

const byId = (a: InputRecord, b: InputRecord) => (a[0] < b[0] ? -1 : a[0] > b[0] ? 1 : 0);

/** The records in sighting id order: themselves when already so (as read and as stored), else a sorted copy. */
function sortedById(records: readonly InputRecord[]): readonly InputRecord[] {
  for (let i = 1; i < records.length; i++) if (records[i - 1]![0] > records[i]![0]) return [...records].sort(byId);
  return records;
}

/** sha256 over the records sorted by sighting id, one JSON array per line. */
export function inputHash(records: readonly InputRecord[]): string {
  const h = createHash("sha256");
  // The same bytes as one update per line, written as UTF-8 into a megabyte buffer hashed when
  // full (an update per line cost about a second per million records).
  const buf = Buffer.allocUnsafe(1 << 20);
  let used = 0;
  for (const r of sortedById(records)) {
    const line = `${JSON.stringify(r)}\n`;
    // At most 3 UTF-8 bytes per UTF-16 unit: room is made before writing, a line is never split.
    if (used + line.length * 3 > buf.length) {
      h.update(buf.subarray(0, used));
      used = 0;
    }
    if (line.length * 3 > buf.length) h.update(line);
    else used += buf.write(line, used, "utf8");
  }
  h.update(buf.subarray(0, used));
  return h.digest("hex");
}

/**
 * The results input from the records alone. Taxa are ordered by id and sessions by id,
 * the same canonical order the aggregate queries use, so both paths give identical numbers.
 */
export function inputFromRecords(
  records: readonly InputRecord[],
  zones: ResultsInput["zones"],
  taxaById: ReadonlyMap<string, ResultsTaxon>,
): ResultsInput {
  const ids = [...new Set(records.filter((r) => !isSessionRecord(r)).map((r) => r[2]))].sort();
  const index = new Map(ids.map((id, i) => [id, i]));
  const taxa = ids.map((id) => {
    const t = taxaById.get(id);
    if (!t) throw new Error(`taxon ${id} of an input record is unknown`);
    return t;
  });
  // (zone, taxon) pairs in the order first met, found through one map per zone (no key strings).
  const counts: { zoneId: string; taxon: number; individuals: number }[] = [];
  const byZone = new Map<string, Map<number, { zoneId: string; taxon: number; individuals: number }>>();
  const sessions = new Map<string, { zoneId: string; taxa: Set<number> }>();
  for (const [, state, taxonId, count, zoneKey, sessionId, sessionZone] of records) {
    if (state === SESSION_RECORD) {
      if (sessionId && !sessions.has(sessionId))
        sessions.set(sessionId, { zoneId: sessionZone ?? NO_ZONE, taxa: new Set<number>() });
      continue;
    }
    const taxon = index.get(taxonId)!;
    let zone = byZone.get(zoneKey);
    if (!zone) byZone.set(zoneKey, (zone = new Map()));
    let c = zone.get(taxon);
    if (!c) {
      c = { zoneId: zoneKey, taxon, individuals: 0 };
      zone.set(taxon, c);
      counts.push(c);
    }
    c.individuals += count;
    if (sessionId) {
      const s = sessions.get(sessionId) ?? { zoneId: sessionZone ?? NO_ZONE, taxa: new Set<number>() };
      s.taxa.add(taxon);
      sessions.set(sessionId, s);
    }
  }
  return {
    zones,
    taxa,
    counts,
    sessions: [...sessions.entries()]
      .sort(([a], [b]) => (a < b ? -1 : 1))
      .map(([, s]) => ({ zoneId: s.zoneId, taxa: [...s.taxa].sort((a, b) => a - b) })),
  };
}

export type ReportChanges = {
  previousVersion: number;
  added: number;
  removed: number;
  changed: number;
  speciesBefore: number;
  speciesAfter: number;
  individualsBefore: number;
  individualsAfter: number;
  newTaxa: string[];
  lostTaxa: string[];
};

/** What a new version changes against the previous one, record by record. */
export function diffRecords(
  previousVersion: number,
  beforeAll: readonly InputRecord[],
  afterAll: readonly InputRecord[],
  nameOf: (taxonId: string) => string,
): ReportChanges {
  // Sightings only: complete sessions are inputs too, but "records" here means sightings.
  const before = sortedById(beforeAll.filter((r) => !isSessionRecord(r)));
  const after = sortedById(afterAll.filter((r) => !isSessionRecord(r)));
  // One walk through both lists in id order (a sighting id is in a version at most once).
  let added = 0;
  let changed = 0;
  let removed = 0;
  let i = 0;
  let j = 0;
  while (i < before.length || j < after.length) {
    const o = before[i];
    const r = after[j];
    if (!r || (o && o[0] < r[0])) {
      removed++;
      i++;
    } else if (!o || r[0] < o[0]) {
      added++;
      j++;
    } else {
      if (o.length !== r.length || o.some((v, k) => v !== r[k])) changed++;
      i++;
      j++;
    }
  }
  const taxaBefore = new Set(before.map((r) => r[2]));
  const taxaAfter = new Set(after.map((r) => r[2]));
  const sum = (rs: readonly InputRecord[]) => rs.reduce((s, r) => s + r[3], 0);
  return {
    previousVersion,
    added,
    removed,
    changed,
    speciesBefore: taxaBefore.size,
    speciesAfter: taxaAfter.size,
    individualsBefore: sum(before),
    individualsAfter: sum(after),
    newTaxa: [...taxaAfter]
      .filter((t) => !taxaBefore.has(t))
      .map(nameOf)
      .sort(),
    lostTaxa: [...taxaBefore]
      .filter((t) => !taxaAfter.has(t))
      .map(nameOf)
      .sort(),
  };
}

/**
 * A version's input records column by column, as report_inputs stores them (db/queries/report-inputs.ts):
 * `ids` the uuids' 16 bytes each, every other string a 1-based place in `words` (0: null). Publishing
 * works on this form throughout (hash, results input, what changed): a million records as arrays of
 * strings cost seconds to build and to walk.
 */
export type InputColumns = {
  n: number;
  ids: Buffer;
  words: string[];
  states: Int32Array;
  taxa: Int32Array;
  counts: Int32Array;
  zones: Int32Array;
  sessions: Int32Array;
  sessionZones: Int32Array;
};

const HEX_PAIRS = Array.from({ length: 256 }, (_, i) => i.toString(16).padStart(2, "0"));

/** The i-th id of the columns as text (lowercase, as PostgreSQL prints a uuid). */
export function idAt(c: InputColumns, i: number): string {
  const b = c.ids;
  let s = "";
  for (let k = 0, at = 16 * i; k < 16; k++) {
    if (k === 4 || k === 6 || k === 8 || k === 10) s += "-";
    s += HEX_PAIRS[b[at + k]!]!;
  }
  return s;
}

/** The 16 bytes of a uuid written as text. */
export function uuidBytes(id: string, out: Buffer, at: number): void {
  const hex = id.replace(/-/g, "");
  if (!/^[0-9a-f]{32}$/i.test(hex)) throw new Error(`input record id ${id} is not a uuid`);
  out.write(hex, at, 16, "hex");
}

/** Whether the ids are in increasing order (as read and as stored: then the records are in hash order). */
function idsSorted(c: InputColumns): boolean {
  for (let i = 1; i < c.n; i++) if (c.ids.compare(c.ids, 16 * i, 16 * i + 16, 16 * (i - 1), 16 * i) >= 0) return false;
  return true;
}

function wordOf(c: InputColumns, i: number, nullable: boolean): string | null {
  if (i === 0 && nullable) return null;
  const w = c.words[i - 1];
  if (w === undefined) throw new Error(`stored input records: word ${i} is not in the dictionary`);
  return w;
}

/**
 * Each place of `words` mapped to the first place holding the same string (a dictionary may
 * repeat a string: places are compared through this), and which places hold "session".
 */
function places(c: InputColumns): { canon: Int32Array; session: Uint8Array } {
  const first = new Map<string, number>();
  const canon = new Int32Array(c.words.length + 1);
  const session = new Uint8Array(c.words.length + 1);
  c.words.forEach((w, k) => {
    if (!first.has(w)) first.set(w, k + 1);
    canon[k + 1] = first.get(w)!;
    session[k + 1] = w === SESSION_RECORD ? 1 : 0;
  });
  return { canon, session };
}

/** The records themselves (for pages that list them, and the tests). */
export function recordsOfColumns(c: InputColumns): InputRecord[] {
  const out = new Array<InputRecord>(c.n);
  for (let i = 0; i < c.n; i++)
    out[i] = [
      idAt(c, i),
      wordOf(c, c.states[i]!, false)!,
      wordOf(c, c.taxa[i]!, false)!,
      c.counts[i]!,
      wordOf(c, c.zones[i]!, false)!,
      wordOf(c, c.sessions[i]!, true),
      wordOf(c, c.sessionZones[i]!, true),
    ];
  return out;
}

/** inputHash of the records of `c`, without building them: the same bytes, written straight into the hashing buffer. */
export function inputHashOfColumns(c: InputColumns): string {
  if (!idsSorted(c)) return inputHash(recordsOfColumns(c));
  // Each word's JSON form once (index 0: null), and each byte's two hex digits.
  const json = [Buffer.from("null"), ...c.words.map((w) => Buffer.from(JSON.stringify(w), "utf8"))];
  const word = (i: number, nullable: boolean): Buffer => {
    if ((i === 0 && !nullable) || i < 0 || i >= json.length)
      throw new Error(`stored input records: word ${i} is not in the dictionary`);
    return json[i]!;
  };
  const hex = Buffer.from(HEX_PAIRS.join(""), "latin1");
  const h = createHash("sha256");
  const buf = Buffer.allocUnsafe(1 << 20);
  let used = 0;
  const room = (k: number) => {
    if (k > buf.length - used) {
      h.update(buf.subarray(0, used));
      used = 0;
    }
  };
  // A word, then room again for the separators after it.
  const put = (b: Buffer) => {
    room(b.length);
    if (b.length > buf.length) h.update(b);
    else used += b.copy(buf, used);
    room(16);
  };
  for (let i = 0; i < c.n; i++) {
    const count = c.counts[i]!;
    if (!Number.isInteger(count)) throw new Error(`input record ${idAt(c, i)}: count ${count} is not an integer`);
    const [state, taxon, zone, session, sessionZone] = [
      word(c.states[i]!, false),
      word(c.taxa[i]!, false),
      word(c.zones[i]!, false),
      word(c.sessions[i]!, true),
      word(c.sessionZones[i]!, true),
    ];
    // Room for the fixed parts of a line (brackets, commas, quotes, the id and the count: at most 58
    // bytes); a word is copied with room made for it. The hash is of the bytes in order, wherever they are cut.
    room(64);
    buf[used++] = 91; // [
    buf[used++] = 34; // "
    for (let k = 0, at = 16 * i; k < 16; k++) {
      if (k === 4 || k === 6 || k === 8 || k === 10) buf[used++] = 45; // -
      const b = c.ids[at + k]!;
      buf[used++] = hex[2 * b]!;
      buf[used++] = hex[2 * b + 1]!;
    }
    buf[used++] = 34;
    buf[used++] = 44; // ,
    put(state);
    buf[used++] = 44;
    put(taxon);
    buf[used++] = 44;
    used += buf.write(String(count), used, "latin1");
    buf[used++] = 44;
    put(zone);
    buf[used++] = 44;
    put(session);
    buf[used++] = 44;
    put(sessionZone);
    buf[used++] = 93; // ]
    buf[used++] = 10; // \n
  }
  h.update(buf.subarray(0, used));
  return h.digest("hex");
}

/** The distinct taxon strings of the records of `c` (a session record's "" among them). */
export function taxonIdsOf(c: InputColumns): string[] {
  const seen = new Set<number>();
  for (let i = 0; i < c.n; i++) seen.add(c.taxa[i]!);
  return [...new Set([...seen].map((p) => wordOf(c, p, false)!))];
}

/** inputFromRecords of the records of `c`, without building them (word places stand for their strings). */
export function inputFromColumns(
  c: InputColumns,
  zones: ResultsInput["zones"],
  taxaById: ReadonlyMap<string, ResultsTaxon>,
): ResultsInput {
  const word = (i: number) => wordOf(c, i, false)!;
  const { canon, session } = places(c);
  const at = (p: number) => (p > 0 && p < canon.length ? canon[p]! : (word(p), p));
  const isSession = (i: number) => session[c.states[i]!] === 1;
  // Taxa, zones and sessions by the place of their word.
  const taxonPlaces = new Set<number>();
  for (let i = 0; i < c.n; i++) if (!isSession(i)) taxonPlaces.add(at(c.taxa[i]!));
  const ids = [...new Set([...taxonPlaces].map(word))].sort();
  const index = new Map(ids.map((id, i) => [id, i]));
  const taxonOfPlace = new Map([...taxonPlaces].map((p) => [p, index.get(word(p))!]));
  const taxa = ids.map((id) => {
    const t = taxaById.get(id);
    if (!t) throw new Error(`taxon ${id} of an input record is unknown`);
    return t;
  });
  const counts: { zoneId: string; taxon: number; individuals: number }[] = [];
  const byZone = new Map<number, Map<number, { zoneId: string; taxon: number; individuals: number }>>();
  const sessions = new Map<number, { zoneId: string; taxa: Set<number> }>();
  const sessionZoneOf = (i: number) => wordOf(c, c.sessionZones[i]!, true) ?? NO_ZONE;
  for (let i = 0; i < c.n; i++) {
    const sessionPlace = c.sessions[i]! && at(c.sessions[i]!);
    if (isSession(i)) {
      if (sessionPlace && !sessions.has(sessionPlace))
        sessions.set(sessionPlace, { zoneId: sessionZoneOf(i), taxa: new Set<number>() });
      continue;
    }
    const taxon = taxonOfPlace.get(at(c.taxa[i]!))!;
    const zonePlace = at(c.zones[i]!);
    let zone = byZone.get(zonePlace);
    if (!zone) byZone.set(zonePlace, (zone = new Map()));
    let n = zone.get(taxon);
    if (!n) {
      n = { zoneId: word(zonePlace), taxon, individuals: 0 };
      zone.set(taxon, n);
      counts.push(n);
    }
    n.individuals += c.counts[i]!;
    if (sessionPlace) {
      let s = sessions.get(sessionPlace);
      if (!s) sessions.set(sessionPlace, (s = { zoneId: sessionZoneOf(i), taxa: new Set<number>() }));
      s.taxa.add(taxon);
    }
  }
  return {
    zones,
    taxa,
    counts,
    sessions: [...sessions.entries()]
      .map(([p, s]) => [word(p), s] as const)
      .sort(([a], [b]) => (a < b ? -1 : 1))
      .map(([, s]) => ({ zoneId: s.zoneId, taxa: [...s.taxa].sort((a, b) => a - b) })),
  };
}

/** diffRecords of two versions' columns, without building their records. */
export function diffColumns(
  previousVersion: number,
  before: InputColumns,
  after: InputColumns,
  nameOf: (taxonId: string) => string,
): ReportChanges {
  if (!idsSorted(before) || !idsSorted(after))
    return diffRecords(previousVersion, recordsOfColumns(before), recordsOfColumns(after), nameOf);
  const pb = places(before);
  const pa = places(after);
  const sb = pb.session;
  const sa = pa.session;
  const skip = (c: InputColumns, s: Uint8Array, i: number) => s[c.states[i]!] === 1;
  // The same string has its own place in each version's words: each place of the earlier version's
  // words mapped to the later one's (first) place of that string, -1 when it has none; 0 stays 0 (null).
  const placeAfter = new Map<string, number>();
  after.words.forEach((w, k) => placeAfter.has(w) || placeAfter.set(w, k + 1));
  const remap = new Int32Array(before.words.length + 1);
  before.words.forEach((w, k) => (remap[k + 1] = placeAfter.get(w) ?? -1));
  const mapped = (p: number) => (p >= 0 && p < remap.length ? remap[p]! : -2);
  const canonAfter = (p: number) => (p >= 0 && p < pa.canon.length ? pa.canon[p]! : -3);
  const same = (k: "states" | "taxa" | "zones" | "sessions" | "sessionZones", i: number, j: number) =>
    mapped(before[k][i]!) === canonAfter(after[k][j]!);
  let added = 0;
  let changed = 0;
  let removed = 0;
  let i = 0;
  let j = 0;
  const taxaBefore = new Set<number>();
  const taxaAfter = new Set<number>();
  let individualsBefore = 0;
  let individualsAfter = 0;
  for (;;) {
    while (i < before.n && skip(before, sb, i)) i++;
    while (j < after.n && skip(after, sa, j)) j++;
    if (i >= before.n && j >= after.n) break;
    const order =
      i >= before.n ? 1 : j >= after.n ? -1 : before.ids.compare(after.ids, 16 * j, 16 * j + 16, 16 * i, 16 * i + 16);
    if (order < 0) {
      removed++;
    } else if (order > 0) {
      added++;
    } else if (
      before.counts[i] !== after.counts[j] ||
      !same("states", i, j) ||
      !same("taxa", i, j) ||
      !same("zones", i, j) ||
      !same("sessions", i, j) ||
      !same("sessionZones", i, j)
    )
      changed++;
    if (order <= 0) {
      taxaBefore.add(before.taxa[i]!);
      individualsBefore += before.counts[i]!;
      i++;
    }
    if (order >= 0) {
      taxaAfter.add(after.taxa[j]!);
      individualsAfter += after.counts[j]!;
      j++;
    }
  }
  const namesBefore = new Set([...taxaBefore].map((p) => wordOf(before, p, false)!));
  const namesAfter = new Set([...taxaAfter].map((p) => wordOf(after, p, false)!));
  return {
    previousVersion,
    added,
    removed,
    changed,
    speciesBefore: namesBefore.size,
    speciesAfter: namesAfter.size,
    individualsBefore,
    individualsAfter,
    newTaxa: [...namesAfter]
      .filter((t) => !namesBefore.has(t))
      .map(nameOf)
      .sort(),
    lostTaxa: [...namesBefore]
      .filter((t) => !namesAfter.has(t))
      .map(nameOf)
      .sort(),
  };
}
