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

  it("refuse a stored form whose arrays disagree or point outside the dictionary", () => {
    const p = packInputs(records);
    expect(() => unpackInputs({ ...p, counts: p.counts.slice(1) })).toThrow(/counts/);
    expect(() => unpackInputs({ ...p, taxa: [99, ...p.taxa.slice(1)] })).toThrow(/dictionary/);
    expect(() => packInputs([[id(1), "approved", id(100), 1.5, NO_ZONE, null, null]])).toThrow(/integer/);
  });
});
