import Papa from "papaparse";

// A spreadsheet's CSV read row by row with the line number a person sees in their
// spreadsheet or text editor (1 = the header line): a quoted value may span lines, so rows
// and lines are not the same count. Shared by the species list and paper sheets; each
// checks its own columns. Pure: no database, no framework.

export type CsvLine = { line: number; cells: string[] };
export type CsvReadProblem =
  | { line: number; code: "unreadable"; values: { detail: string } }
  | { line: number; code: "tooManyRows"; values: { maximum: number } };

/** Spaces collapsed and trimmed. */
export const norm = (s: string) => s.trim().replace(/\s+/g, " ");
/** A code word: "Vascular plants", "vascular-plants" and "VASCULAR_PLANTS" all read vascular_plants. */
export const code = (s: string) =>
  norm(s)
    .toLowerCase()
    .replace(/[\s-]+/g, "_");

/**
 * The rows of `body` (a byte-order mark already removed), blank lines skipped, and lines
 * starting with "#" too when `comments` is set. More than `maxRows` rows after the header
 * stops the reading with one "tooManyRows" problem on the last line read.
 */
export function readCsvLines(
  body: string,
  options: { maxRows: number; comments?: boolean },
): { records: CsvLine[]; problems: CsvReadProblem[] } {
  const records: CsvLine[] = [];
  const problems: CsvReadProblem[] = [];
  let consumed = 0;
  let line = 1;
  const advance = (to: number) => {
    for (let i = consumed; i < to; i++) if (body[i] === "\n") line++;
    consumed = to;
  };
  let tooMany = false;
  Papa.parse<string[]>(body, {
    skipEmptyLines: "greedy",
    ...(options.comments ? { comments: "#" } : {}),
    delimitersToGuess: [",", ";", "\t"],
    step: (result, parser) => {
      // Skip the blank lines (and note lines) papaparse passed over before this row.
      let start = consumed;
      for (;;) {
        while (start < body.length && /[\n\r \t]/.test(body[start]!)) start++;
        const lineStart = start === 0 || body[start - 1] === "\n";
        if (!options.comments || body[start] !== "#" || !lineStart) break;
        while (start < body.length && body[start] !== "\n") start++;
      }
      advance(start);
      const rowLine = line;
      for (const e of result.errors) {
        if (e.code === "UndetectableDelimiter") continue;
        problems.push({ line: rowLine, code: "unreadable", values: { detail: e.message } });
      }
      records.push({ line: rowLine, cells: result.data.map((c) => String(c ?? "")) });
      advance(result.meta.cursor);
      if (records.length > options.maxRows + 1) {
        tooMany = true;
        parser.abort();
      }
    },
  });
  if (tooMany)
    return {
      records,
      problems: [{ line: records.at(-1)!.line, code: "tooManyRows", values: { maximum: options.maxRows } }],
    };
  return { records, problems };
}
