"use client";

import { useState } from "react";

// The table is put in the page when its fold is opened: a report's charts have thousands of
// table cells, and every element in the page is work for the browser when the page starts
// (hydration; issue 18). The chart's figure points to the fold (aria-describedby).
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
  const [open, setOpen] = useState(false);
  return (
    <details id={id} className="mt-2 text-sm" onToggle={(e) => setOpen(e.currentTarget.open)}>
      <summary className="cursor-pointer text-reed-800 underline">{summary}</summary>
      {open ? (
        <div className="max-h-64 overflow-auto">
          <table className="w-full text-start tabular-nums">
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
      ) : null}
    </details>
  );
}
