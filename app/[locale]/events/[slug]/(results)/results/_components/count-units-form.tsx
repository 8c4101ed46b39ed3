"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";

export type CountUnitsLabels = {
  title: string;
  intro: string;
  group: string;
  unit: string;
  saved: string;
  failed: string;
  default: string;
};

/** The organiser says what a count means for each taxon group; saved on change. */
export function CountUnitsForm({
  eventId,
  rows,
  groups,
  units,
  labels,
}: {
  eventId: string;
  rows: { group: string; unit: string; chosen: boolean }[];
  groups: Record<string, string>;
  units: Record<string, string>;
  labels: CountUnitsLabels;
}) {
  const router = useRouter();
  const [message, setMessage] = useState("");
  async function save(group: string, unit: string) {
    setMessage("");
    const res = await fetch(`/api/events/${eventId}/count-units`, {
      method: "PUT",
      headers: { "content-type": "application/json" },
      body: JSON.stringify({ group, unit }),
    });
    setMessage(res.ok ? labels.saved : labels.failed);
    if (res.ok) router.refresh();
  }
  return (
    <section aria-labelledby="count-units-title" className="space-y-2">
      <h2 id="count-units-title" className="text-2xl font-bold text-reed-900">
        {labels.title}
      </h2>
      <p className="max-w-prose">{labels.intro}</p>
      <table className="text-left text-sm">
        <thead>
          <tr>
            <th scope="col" className="pr-4">
              {labels.group}
            </th>
            <th scope="col">{labels.unit}</th>
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => (
            <tr key={r.group}>
              <th scope="row" className="pr-4 font-normal">
                {groups[r.group] ?? r.group}
              </th>
              <td>
                <select
                  aria-label={`${labels.unit}: ${groups[r.group] ?? r.group}`}
                  defaultValue={r.unit}
                  onChange={(e) => save(r.group, e.target.value)}
                  className="min-h-touch rounded border border-reed-300 px-2"
                >
                  {Object.entries(units).map(([value, label]) => (
                    <option key={value} value={value}>
                      {label}
                    </option>
                  ))}
                </select>
                {r.chosen ? null : <span className="ml-2 text-ink-soft">{labels.default}</span>}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      <p role="status" aria-live="polite">
        {message}
      </p>
    </section>
  );
}
