import { describe, expect, it } from "vitest";
import { code, readCsvLines } from "./lines";

// Hand-made files: the line numbers are those a text editor shows.
describe("CSV rows with the lines a person sees", () => {
  it("numbers rows by their first line, across blank lines and a quoted value spanning two lines", () => {
    const body = 'a,b\n\n1,"two\nlines"\n\n  \n3,4\n';
    const { records, problems } = readCsvLines(body, { maxRows: 10 });
    expect(problems).toEqual([]);
    expect(records.map((r) => r.line)).toEqual([1, 3, 7]);
    expect(records[1]!.cells).toEqual(["1", "two\nlines"]);
  });

  it("skips note lines starting with # only when asked, and keeps counting them as lines", () => {
    const body = "a;b\n# a note from the field\n1;2\n";
    expect(readCsvLines(body, { maxRows: 10, comments: true }).records.map((r) => [r.line, r.cells])).toEqual([
      [1, ["a", "b"]],
      [3, ["1", "2"]],
    ]);
    expect(readCsvLines(body, { maxRows: 10 }).records).toHaveLength(3);
  });

  it("stops after too many rows with one problem naming the limit", () => {
    const body = ["h", ...Array.from({ length: 6 }, (_, i) => String(i))].join("\n");
    const { problems } = readCsvLines(body, { maxRows: 4 });
    expect(problems).toEqual([{ line: 6, code: "tooManyRows", values: { maximum: 4 } }]);
  });

  it("reads code words whatever their case, spaces or dashes", () => {
    expect(["Vascular plants", "vascular-plants", " VASCULAR_PLANTS "].map(code)).toEqual([
      "vascular_plants",
      "vascular_plants",
      "vascular_plants",
    ]);
  });
});
