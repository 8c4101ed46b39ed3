import { createHash } from "node:crypto";
import { describe, expect, it } from "vitest";
import { NO_ZONE } from "@/lib/results/compute";
import { inputHash, type InputRecord } from "@/lib/results/records";
import { packInputs, recordsOfRow, unpackInputs } from "./report-inputs";

const id = (n: number) => `00000000-0000-4000-8000-${String(n).padStart(12, "0")}`;
const records: InputRecord[] = [
  [id(1), "approved", id(100), 3, id(200), id(300), id(200)],
  [id(2), "approved", id(101), 1, NO_ZONE, null, null],
  [id(3), "approved", id(100), 12, id(201), id(300), id(200)],
  [id(300), "session", "", 0, id(200), id(300), id(200)],
];

describe("report inputs in their stored form", () => {
  it("give back exactly the records packed, so the input hash is the same", () => {
    const p = packInputs(records);
    expect(p.ids).toEqual(records.map((r) => r[0]));
    // Every repeated string is stored once.
    expect(p.words).toEqual(["approved", id(100), id(200), id(300), id(101), NO_ZONE, id(201), "session", ""]);
    expect(p.sessions).toEqual([4, 0, 4, 4]);
    const back = unpackInputs(p);
    expect(back).toEqual(records);
    expect(inputHash(back)).toBe(inputHash(records));
  });

  it("read back from the comma-joined text the database sends", () => {
    const p = packInputs(records);
    const row = {
      ids: p.ids.join(","),
      words: JSON.stringify(p.words),
      states: p.states.join(","),
      taxa: p.taxa.join(","),
      counts: p.counts.join(","),
      zones: p.zones.join(","),
      sessions: p.sessions.join(","),
      sessionZones: p.sessionZones.join(","),
    };
    expect(recordsOfRow(row)).toEqual(records);
    expect(
      recordsOfRow({ ...row, ids: "", states: "", taxa: "", counts: "", zones: "", sessions: "", sessionZones: "" }),
    ).toEqual([]);
  });

  it("hash as one JSON.stringify line per record in id order (the meaning reports were published with)", () => {
    const reference = (rs: InputRecord[]) => {
      const h = createHash("sha256");
      for (const r of [...rs].sort((a, b) => (a[0] < b[0] ? -1 : a[0] > b[0] ? 1 : 0)))
        h.update(`${JSON.stringify(r)}\n`);
      return h.digest("hex");
    };
    const odd: InputRecord[] = [
      ...records,
      ['x"y', "appr\u00e9ved", 'a"b\\c', -0, "zone\n", null, "é"],
      [id(0), "approved", id(100), 2.5, NO_ZONE, null, null],
    ];
    expect(inputHash(odd)).toBe(reference(odd));
    expect(inputHash([...records].reverse())).toBe(reference(records));
    expect(inputHash([])).toBe(reference([]));
    const many = Array.from({ length: 30_000 }, (_, i): InputRecord => [
      id(i),
      "approved",
      id(100 + (i % 7)),
      i % 13,
      NO_ZONE,
      null,
      null,
    ]);
    expect(inputHash(many)).toBe(reference(many));
    // A record longer than the hashing buffer keeps its place among the others.
    const long: InputRecord[] = [
      ...records,
      [`${id(2)}a`, "x".repeat(600_000), "ü".repeat(300_000), 1, NO_ZONE, null, null],
    ];
    expect(inputHash(long)).toBe(reference(long));
  });

  it("refuse a stored form whose arrays disagree or point outside the dictionary", () => {
    const p = packInputs(records);
    expect(() => unpackInputs({ ...p, counts: p.counts.slice(1) })).toThrow(/counts/);
    expect(() => unpackInputs({ ...p, taxa: [99, ...p.taxa.slice(1)] })).toThrow(/dictionary/);
    expect(() => packInputs([[id(1), "approved", id(100), 1.5, NO_ZONE, null, null]])).toThrow(/integer/);
  });
});
