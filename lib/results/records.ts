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
