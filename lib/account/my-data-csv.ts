import type { MyData } from "./my-data";
import { spreadsheetSafe } from "@/lib/results/exports";

// A person's own sightings as CSV (RFC 4180), one row per sighting and review decision: a
// sighting no one has decided on yet has one row with empty decision columns. Text cells
// follow the formula rule of lib/results/exports.ts, so the file opens safely in a spreadsheet.

export const MY_SIGHTINGS_COLUMNS = [
  "sightingId",
  "event",
  "observedAt",
  "scientificName",
  "description",
  "count",
  "countIsEstimate",
  "latitude",
  "longitude",
  "accuracyM",
  "zone",
  "sessionId",
  "notes",
  "photos",
  "reviewState",
  "receivedAt",
  "decidedAt",
  "fromState",
  "toState",
  "fromTaxon",
  "toTaxon",
  "reason",
  "message",
] as const;

function field(v: string | number | boolean | null): string {
  if (v === null) return "";
  const s = spreadsheetSafe(typeof v === "boolean" ? String(v) : v);
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

export function mySightingsCsv(data: Pick<MyData, "sightings">): string {
  const lines: (string | number | boolean | null)[][] = [];
  for (const s of data.sightings) {
    const base = [
      s.id,
      s.event,
      s.observedAt,
      s.scientificName,
      s.description,
      s.count,
      s.countIsEstimate,
      s.latitude,
      s.longitude,
      s.accuracyM,
      s.zone,
      s.sessionId,
      s.notes,
      s.photos.length,
      s.reviewState,
      s.receivedAt,
    ];
    const decisions = s.decisions.length ? s.decisions : [null];
    for (const d of decisions)
      lines.push([
        ...base,
        d?.decidedAt ?? null,
        d?.fromState ?? null,
        d?.toState ?? null,
        d?.fromTaxon ?? null,
        d?.toTaxon ?? null,
        d?.reason ?? null,
        d?.message ?? null,
      ]);
  }
  return [[...MY_SIGHTINGS_COLUMNS], ...lines].map((row) => row.map(field).join(",")).join("\r\n") + "\r\n";
}
