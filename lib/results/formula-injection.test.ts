import { describe, expect, it } from "vitest";
import { computeResults, type ResultsTaxon } from "./compute";
import { occurrenceTxt, speciesCsv, type Located } from "./exports";
import { inputFromRecords, type InputRecord } from "./records";

// Every character a spreadsheet takes as the start of a formula (issue 13).
const LEADING = ["=", "+", "-", "@", "\t", "\r"];
const payload = (c: string) => `${c}HYPERLINK("http://evil.example","x")`;

describe("formula injection in the published CSV and TSV files", () => {
  for (const c of LEADING) {
    const label = JSON.stringify(c);

    it(`species.csv neutralises text cells beginning with ${label} and leaves numbers alone`, () => {
      const taxa: ResultsTaxon[] = [
        {
          id: "t1",
          scientificName: payload(c),
          rank: "species",
          group: "insects",
          sensitivity: "open",
          names: { en: payload(c) },
        },
      ];
      const zones = [{ id: "z1", name: payload(c), habitat: "edge" }];
      const records: InputRecord[] = [["00000000-0000-0000-0000-000000000001", "approved", "t1", 3, "z1", null, null]];
      const csv = speciesCsv(
        computeResults(inputFromRecords(records, zones, new Map(taxa.map((t) => [t.id, t])))),
        "en",
      );
      const cells = csv
        .split("\r\n")
        .flatMap((line) => line.split(/,(?=(?:[^"]*"[^"]*")*[^"]*$)/))
        .map((cell) => cell.replace(/^"/, ""));
      // No cell (quoted or not) starts with a formula character any more.
      for (const cell of cells) expect(cell).not.toMatch(/^[=+\-@\t\r]/);
      expect(csv).toContain(`'${c}HYPERLINK`);
      // The count stays a number: the data line ends with the two counts, unquoted, unprefixed.
      expect(csv.split("\r\n")[1]).toMatch(/,3,3$/);
    });

    it(`occurrence.txt neutralises text cells beginning with ${label}; negative coordinates stay numbers`, () => {
      const row: Located = {
        id: "00000000-0000-0000-0000-000000000001",
        eventDate: "2026-06-20T10:00:00.000Z",
        scientificName: payload(c),
        taxonRank: "species",
        vernacularName: payload(c),
        individualCount: 2,
        lon: -1.25,
        lat: 52.5,
        uncertaintyM: 10,
        generalised: false,
        recordedBy: payload(c),
      };
      const txt = occurrenceTxt([row], payload(c));
      const fields = txt.split("\n")[1]!.split("\t");
      expect(fields).toHaveLength(16);
      for (const f of fields) expect(f).not.toMatch(/^[=+@\t\r]|^-(?!\d)/);
      expect(fields[3]).toMatch(/^'/); // scientificName
      expect(fields[5]).toMatch(/^'/); // vernacularName
      expect(fields[14]).toMatch(/^'/); // datasetName
      expect(fields[15]).toMatch(/^'/); // recordedBy, a name the volunteer chose
      expect(fields[9]).toBe("-1.25"); // decimalLongitude, a number
      expect(fields[6]).toBe("2");
    });
  }

  it("leaves ordinary text as it was", () => {
    const row: Located = {
      id: "00000000-0000-0000-0000-000000000002",
      eventDate: "2026-06-20T10:00:00.000Z",
      scientificName: "Orchis mascula",
      taxonRank: "species",
      vernacularName: "Early-purple orchid",
      individualCount: 1,
      lon: 0.5,
      lat: 52.5,
      uncertaintyM: 10,
      generalised: false,
      recordedBy: "Sam",
    };
    expect(occurrenceTxt([row], "Count").split("\n")[1]).toContain(
      "\tOrchis mascula\tspecies\tEarly-purple orchid\t1\t",
    );
  });
});
