"use client";

import { Symbols } from "recharts";

// One look for every results chart. Zones are told apart by colour and by marker shape,
// never by dashes (a dashed line means extrapolation on every chart), so a zone has the
// same colour and marker in every chart and the charts read in grey too. Colours at least
// 3:1 against white for lines (WCAG 1.4.11).
export const ZONE_COLOURS = ["#225c41", "#9a5d0f", "#3f62a0", "#8f3f71", "#3d463f", "#b0362a", "#2f7f7a"];
export const ZONE_MARKERS = ["circle", "square", "triangle", "diamond", "cross", "star", "wye"] as const;
export const zoneColour = (i: number) => ZONE_COLOURS[i % ZONE_COLOURS.length]!;
export const zoneMarker = (i: number) => ZONE_MARKERS[i % ZONE_MARKERS.length]!;
// Axis ticks and labels darker than Recharts' default grey so chart text reaches 4.5:1 on the card.
export const TICK = { fill: "#2b3a31" };
export const GRID = "#d5e8dc";

/** A series' point marker (Recharts' own symbols), in its zone's colour and shape. */
export function zoneDot(i: number) {
  function Dot(props: { cx?: number; cy?: number; index?: number }) {
    const { cx, cy } = props;
    if (cx === undefined || cy === undefined || !Number.isFinite(cx) || !Number.isFinite(cy)) return null;
    return <Symbols key={props.index} cx={cx} cy={cy} type={zoneMarker(i)} size={60} fill={zoneColour(i)} />;
  }
  return Dot;
}

/** The numbers behind a chart, as its text alternative: a folded table under the chart. */
export function ChartDataTable({
  id,
  summary,
  headers,
  rows,
}: {
  id?: string;
  summary: string;
  headers: string[];
  /** Cells already in words; the first cell of a row may name its series (rowHeader). */
  rows: { key: string; cells: string[]; rowHeader?: boolean }[];
}) {
  return (
    <details className="mt-2 text-sm">
      <summary className="cursor-pointer text-reed-800 underline">{summary}</summary>
      <div className="max-h-64 overflow-auto">
        <table id={id} className="w-full text-start tabular-nums">
          <thead>
            <tr className="border-b border-reed-300">
              {headers.map((h) => (
                <th key={h} scope="col">
                  {h}
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => (
              <tr key={r.key} className="border-b border-reed-100">
                {r.cells.map((c, j) =>
                  j === 0 && r.rowHeader ? (
                    <th key={j} scope="row" className="font-normal">
                      {c}
                    </th>
                  ) : (
                    <td key={j}>{c}</td>
                  ),
                )}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </details>
  );
}
