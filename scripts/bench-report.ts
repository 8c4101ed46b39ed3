// The small protocol between benchmark parts and `npm run bench`: each part prints, as
// its last words, one line "BENCH <json>" with its rows; bench.mts gathers them.
export type BenchRow = { part: string; figure: string; value: string; target?: string; met?: boolean; note?: string };

export function reportRows(rows: BenchRow[]): void {
  console.log(`BENCH ${JSON.stringify(rows)}`);
}
