import { describe, expect, it } from "vitest";
import { NO_ZONE, type ResultsTaxon } from "./compute";
import {
  diffColumns,
  diffRecords,
  inputFromColumns,
  inputFromRecords,
  inputHash,
  inputHashOfColumns,
  recordsOfColumns,
  uuidBytes,
  type InputColumns,
  type InputRecord,
} from "./records";

// A seeded generator (mulberry32, common practice) so a failure can be replayed.
function random(seed: number) {
  let a = seed;
  return () => {
    a = (a + 0x6d2b79f5) | 0;
    let t = Math.imul(a ^ (a >>> 15), 1 | a);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
const uuid = (n: number) =>
  `${n.toString(16).padStart(8, "0")}-0000-4000-8000-${(n * 7919).toString(16).padStart(12, "0")}`;

/** Records of a made-up event: sightings (some in complete sessions) and one record per complete session. */
function event(seed: number, size: number): InputRecord[] {
  const r = random(seed);
  const pick = <T>(xs: readonly T[]) => xs[Math.floor(r() * xs.length)]!;
  const zones = [NO_ZONE, uuid(9001), uuid(9002)];
  const taxa = Array.from({ length: 12 }, (_, i) => uuid(8000 + i));
  const sessions = Array.from({ length: 6 }, (_, i) => [uuid(7000 + i), pick(zones)] as const);
  const out: InputRecord[] = sessions.map(([s, z]) => [s, "session", "", 0, z, s, z]);
  const used = new Set<number>();
  while (out.length < size) {
    const n = Math.floor(r() * 1e6);
    if (used.has(n)) continue;
    used.add(n);
    const s = r() < 0.6 ? pick(sessions) : null;
    out.push([uuid(n), "approved", pick(taxa), Math.floor(r() * 9), pick(zones), s?.[0] ?? null, s?.[1] ?? null]);
  }
  return out.sort((a, b) => (a[0] < b[0] ? -1 : 1));
}

/** Columns of records; `repeat`: every word twice in the dictionary, records pointing at either place. */
function columns(records: readonly InputRecord[], repeat = false): InputColumns {
  const words: string[] = [];
  const place = new Map<string, number[]>();
  const word = (w: string | null, i: number) => {
    if (w === null) return 0;
    if (!place.has(w)) {
      words.push(w);
      const ps = [words.length];
      if (repeat) ps.push(words.push(w));
      place.set(w, ps);
    }
    const ps = place.get(w)!;
    return ps[i % ps.length]!;
  };
  const n = records.length;
  const c: InputColumns = {
    n,
    ids: Buffer.alloc(16 * n),
    words,
    states: new Int32Array(n),
    taxa: new Int32Array(n),
    counts: new Int32Array(n),
    zones: new Int32Array(n),
    sessions: new Int32Array(n),
    sessionZones: new Int32Array(n),
  };
  records.forEach(([id, state, taxon, count, zone, session, sessionZone], i) => {
    uuidBytes(id, c.ids, 16 * i);
    c.states[i] = word(state, i);
    c.taxa[i] = word(taxon, i);
    c.counts[i] = count;
    c.zones[i] = word(zone, i);
    c.sessions[i] = word(session, i);
    c.sessionZones[i] = word(sessionZone, i);
  });
  return c;
}

const meta = new Map<string, ResultsTaxon>(
  Array.from({ length: 12 }, (_, i) => {
    const id = uuid(8000 + i);
    return [id, { id, scientificName: `Taxon ${i}`, rank: "species", group: "birds", sensitivity: "open", names: {} }];
  }),
);
const zones = [
  { id: uuid(9001), name: "A", habitat: "meadow" },
  { id: uuid(9002), name: "B", habitat: "wood" },
];

describe("a version's input records column by column (publishing's form)", () => {
  it("give back the records, and the same hash, results input and changes as the records themselves", () => {
    for (const seed of [1, 2, 3]) {
      const before = event(seed, 3000);
      // The next version: some removed, some changed, some added.
      const r = random(seed + 100);
      const after = event(seed + 50, 400)
        .filter((x) => x[1] !== "session")
        .concat(
          before
            .filter(() => r() > 0.1)
            .map((x): InputRecord =>
              x[1] !== "session" && r() < 0.05 ? [x[0], x[1], x[2], x[3] + 1, x[4], x[5], x[6]] : x,
            ),
        )
        .sort((a, b) => (a[0] < b[0] ? -1 : 1));
      for (const repeat of [false, true]) {
        const cb = columns(before, repeat);
        const ca = columns(after, repeat);
        expect(recordsOfColumns(ca)).toEqual(after);
        expect(inputHashOfColumns(ca)).toBe(inputHash(after));
        expect(inputFromColumns(ca, zones, meta)).toEqual(inputFromRecords(after, zones, meta));
        expect(diffColumns(4, cb, ca, (id) => id.slice(0, 8))).toEqual(
          diffRecords(4, before, after, (id) => id.slice(0, 8)),
        );
      }
    }
  });

  it("hash records out of id order as sorted, and words that need JSON escapes as JSON writes them", () => {
    const records: InputRecord[] = [
      [uuid(5), 'appr"oved\u00e9\n', uuid(8000), -3, NO_ZONE, null, null],
      [uuid(2), "approved", "x".repeat(2_000_000), 2, uuid(9001), uuid(7000), uuid(9001)],
      [uuid(7000), "session", "", 0, uuid(9001), uuid(7000), uuid(9001)],
    ];
    expect(inputHashOfColumns(columns(records))).toBe(inputHash(records));
    expect(inputHashOfColumns(columns([]))).toBe(inputHash([]));
    const many = event(9, 40_000);
    expect(inputHashOfColumns(columns(many))).toBe(inputHash(many));
  });

  it("refuse a place outside the dictionary", () => {
    const records = event(4, 20);
    const c = columns(records);
    c.taxa[records.findIndex((r) => r[1] !== "session")] = 999;
    expect(() => inputHashOfColumns(c)).toThrow(/dictionary/);
    expect(() => inputFromColumns(c, zones, meta)).toThrow(/dictionary/);
  });
});
