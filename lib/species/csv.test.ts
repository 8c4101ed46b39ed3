import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { parseSpeciesCsv, problemLines } from "./csv";

describe("species CSV", () => {
  it("reads the example file: groups written as words, quoted values, names per language", () => {
    const { rows, problems, locales } = parseSpeciesCsv(readFileSync("tests/fixtures/setup/species.csv", "utf8"));
    expect(problems).toEqual([]);
    expect(locales).toEqual(["en", "es", "fr"]);
    expect(rows).toHaveLength(6);
    expect(rows[3]).toMatchObject({
      line: 5,
      scientificName: "Hericium erinaceus",
      sensitivity: "restricted",
      names: { es: "Melena de león" },
    });
    expect(rows[5]).toMatchObject({
      line: 7,
      scientificName: "Ulex europaeus",
      taxonGroup: "vascular_plants",
      sensitivity: null,
    });
  });

  it("names exactly the three bad lines of the bad example: unknown group, missing rank, duplicate", () => {
    const { rows, problems } = parseSpeciesCsv(readFileSync("tests/fixtures/setup/species-bad.csv", "utf8"));
    expect(problemLines(problems)).toEqual([3, 5, 7]);
    expect(problems.map((p) => [p.line, p.column, p.code])).toEqual([
      [3, "taxon_group", "unknownGroup"],
      [5, "rank", "missingValue"],
      [7, "scientific_name", "duplicateName"],
    ]);
    expect(problems[2]!.values).toMatchObject({ first: 2 });
    expect(rows.map((r) => r.line)).toEqual([2, 4, 6, 8]);
  });

  it("counts lines as a text editor does, across blank lines, CRLF and a value spanning two lines", () => {
    const text =
      'scientific_name,rank,taxon_group\r\n\r\nAmanita muscaria,species,fungi\r\n"Boletus\nedulis",species,fungi\r\nRussula emetica,species,fungus\r\n';
    const { problems } = parseSpeciesCsv(text);
    expect(problems.map((p) => p.line)).toEqual([6]);
  });

  it("accepts semicolons and a byte-order mark, as spreadsheets export them", () => {
    const { rows, problems } = parseSpeciesCsv(
      "\uFEFFscientific_name;rank;taxon_group;common_name_fr\nCalluna vulgaris;species;vascular_plants;Callune\n",
    );
    expect(problems).toEqual([]);
    expect(rows[0]).toMatchObject({ scientificName: "Calluna vulgaris", names: { fr: "Callune" } });
  });

  it("refuses a header without a required column, and unknown columns, before reading any line", () => {
    const { problems } = parseSpeciesCsv("scientific_name,taxon_group,colour\nAmanita muscaria,fungi,red\n");
    expect(problems).toEqual([
      { line: 1, column: "colour", code: "unknownColumn" },
      { line: 1, column: "rank", code: "missingColumn" },
    ]);
  });

  it("reports an empty file and a line with the wrong number of values", () => {
    expect(parseSpeciesCsv("  \n").problems[0]!.code).toBe("empty");
    expect(parseSpeciesCsv("scientific_name,rank,taxon_group\nAmanita muscaria,species\n").problems[0]).toMatchObject({
      line: 2,
      code: "wrongFieldCount",
    });
  });
});
