// Public downloads of a report: species list (CSV), GeoJSON, and the occurrence terms the token API
// and the Darwin Core Archive (lib/results/dwc.ts) share.
// Sensitive taxa: "generalised" records are moved to the centre of a 0.1° grid cell (about
// 11 km north–south everywhere; east–west 11 km × cos(latitude), see gridCellKm) with the uncertainty widened to cover the cell; "restricted" records are
// withheld from every located output (design.md: exact locations never reach the public).
import type { Results } from "./compute";
import type { Sensitivity } from "@/lib/domain";

export type PublicOccurrence = {
  id: string;
  observedAt: Date;
  lon: number;
  lat: number;
  accuracyM: number;
  taxonId: string;
  count: number;
  sensitivity: Sensitivity;
  recordedBy: string; // the recorder's chosen published name or an anonymous recorder id, never an e-mail
};

export const GRID_DEGREES = 0.1;
// 111.32 km per degree of latitude (and of longitude at the equator): common practice, spherical Earth.
const KM_PER_DEGREE = 111.32;

/** The grid cell's size in km at a latitude: north–south is the same everywhere, east–west shrinks with cos(latitude). */
export function gridCellKm(lat: number): { northSouth: number; eastWest: number } {
  const northSouth = GRID_DEGREES * KM_PER_DEGREE;
  return { northSouth, eastWest: Math.max(0, northSouth * Math.cos((lat * Math.PI) / 180)) };
}

export type Located = {
  id: string;
  eventDate: string;
  scientificName: string;
  taxonRank: string;
  vernacularName: string;
  individualCount: number;
  lon: number;
  lat: number;
  uncertaintyM: number;
  generalised: boolean;
  recordedBy: string;
};

/** Cell centre and the uncertainty that covers the whole cell (half its diagonal) plus the record's own. */
export function generalise(
  lon: number,
  lat: number,
  accuracyM: number,
): { lon: number; lat: number; uncertaintyM: number } {
  const cLat = Math.round((Math.floor(lat / GRID_DEGREES) + 0.5) * GRID_DEGREES * 1000) / 1000;
  const cLon = Math.round((Math.floor(lon / GRID_DEGREES) + 0.5) * GRID_DEGREES * 1000) / 1000;
  // 111.32 km per degree of latitude (common practice, spherical Earth).
  const dy = GRID_DEGREES * 111_320;
  const dx = GRID_DEGREES * 111_320 * Math.cos((cLat * Math.PI) / 180);
  const half = Math.sqrt(dx * dx + dy * dy) / 2;
  return { lon: cLon, lat: cLat, uncertaintyM: Math.ceil((half + accuracyM) / 100) * 100 };
}

/** Occurrences safe to publish: restricted ones withheld, generalised ones coarsened. */
export function publicOccurrences(
  results: { species: readonly Pick<Results["species"][number], "id" | "scientificName" | "rank" | "names">[] },
  occurrences: readonly PublicOccurrence[],
  locale: string,
): { rows: Located[]; withheld: number } {
  const taxa = new Map(results.species.map((s) => [s.id, s]));
  let withheld = 0;
  const rows: Located[] = [];
  for (const o of occurrences) {
    if (o.sensitivity === "restricted") {
      withheld++;
      continue;
    }
    const t = taxa.get(o.taxonId);
    const g = o.sensitivity === "generalised" ? generalise(o.lon, o.lat, o.accuracyM) : null;
    rows.push({
      id: o.id,
      eventDate: o.observedAt.toISOString(),
      scientificName: t?.scientificName ?? "",
      taxonRank: t?.rank ?? "species",
      vernacularName: t?.names[locale] ?? t?.names.en ?? "",
      individualCount: o.count,
      lon: g ? g.lon : o.lon,
      lat: g ? g.lat : o.lat,
      uncertaintyM: g ? g.uncertaintyM : o.accuracyM,
      generalised: Boolean(g),
      recordedBy: o.recordedBy,
    });
  }
  return { rows, withheld };
}

// Formula injection (CWE-1236): a spreadsheet reads a text cell that starts with one of
// these as a formula. Such text cells get a leading apostrophe (the usual rule, OWASP's
// "CSV Injection" page, from memory); numbers are written as numbers and never changed.
const FORMULA_START = /^[=+\-@\t\r]/;

/** A text cell made safe to open in a spreadsheet; numbers pass through untouched. */
export function spreadsheetSafe(v: string | number): string {
  if (typeof v === "number") return String(v);
  return FORMULA_START.test(v) ? `'${v}` : v;
}

/** RFC 4180 field quoting, after the formula rule. */
export function csvField(v: string | number): string {
  const s = spreadsheetSafe(v);
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

/**
 * Species list with counts, whole event and per zone (no locations at all). A sensitive taxon's
 * zone cells are left empty: a zone is finer than its generalisation (lib/results/public.ts).
 */
export function speciesCsv(results: Results, locale: string): string {
  const header = [
    "scientificName",
    "vernacularName",
    "taxonRank",
    "taxonGroup",
    "individualCount",
    ...results.zones.map((z) => z.name),
  ];
  const lines = results.species.map((s) => [
    s.scientificName,
    s.names[locale] ?? s.names.en ?? "",
    s.rank,
    s.group,
    s.individuals,
    ...results.zones.map((z) => (s.sensitivity === "open" ? (s.byZone[z.id] ?? 0) : "")),
  ]);
  return [header, ...lines].map((row) => row.map(csvField).join(",")).join("\r\n") + "\r\n";
}

/** GeoJSON FeatureCollection (RFC 7946: WGS 84 longitude, latitude; no "crs" member). */
export function occurrencesGeoJson(rows: readonly Located[]): string {
  return JSON.stringify({
    type: "FeatureCollection",
    features: rows.map((r) => ({
      type: "Feature",
      id: r.id,
      geometry: { type: "Point", coordinates: [r.lon, r.lat] },
      properties: {
        occurrenceID: `urn:uuid:${r.id}`,
        scientificName: r.scientificName,
        vernacularName: r.vernacularName,
        individualCount: r.individualCount,
        eventDate: r.eventDate,
        coordinateUncertaintyInMeters: r.uncertaintyM,
        generalised: r.generalised,
      },
    })),
  });
}

// Darwin Core terms of occurrence.txt, in column order (Darwin Core Text Guide,
// https://dwc.tdwg.org/text/: a tab-separated core file described by meta.xml; terms from
// the Darwin Core quick reference, https://dwc.tdwg.org/terms/).
export const DWC_TERMS = [
  "occurrenceID",
  "basisOfRecord",
  "eventDate",
  "scientificName",
  "taxonRank",
  "vernacularName",
  "individualCount",
  "occurrenceStatus",
  "decimalLatitude",
  "decimalLongitude",
  "geodeticDatum",
  "coordinateUncertaintyInMeters",
  "identificationVerificationStatus",
  "dataGeneralizations",
  "datasetName",
  "recordedBy",
] as const;
export const DWC_REQUIRED = [
  "occurrenceID",
  "basisOfRecord",
  "eventDate",
  "scientificName",
  "taxonRank",
  "individualCount",
  "decimalLatitude",
  "decimalLongitude",
  "coordinateUncertaintyInMeters",
  "identificationVerificationStatus",
] as const;

// The formula rule first (a leading tab or CR is one of its characters), then no tab or line break inside a field.
const tsv = (s: string | number) => spreadsheetSafe(s).replace(/[\t\r\n]+/g, " ");

export type DwcRecord = Record<(typeof DWC_TERMS)[number], string | number>;

/** One located occurrence as Darwin Core terms (the archive's occurrence.txt and the API use the same). */
export function dwcRecord(r: Located, datasetName: string): DwcRecord {
  return {
    occurrenceID: `urn:uuid:${r.id}`,
    basisOfRecord: "HumanObservation",
    recordedBy: r.recordedBy,
    eventDate: r.eventDate,
    scientificName: r.scientificName,
    taxonRank: r.taxonRank,
    vernacularName: r.vernacularName,
    individualCount: r.individualCount,
    occurrenceStatus: "present",
    decimalLatitude: r.lat,
    decimalLongitude: r.lon,
    geodeticDatum: "EPSG:4326",
    coordinateUncertaintyInMeters: r.uncertaintyM,
    // Approved by an event coordinator: our review state, in the term's free-text sense.
    identificationVerificationStatus: "verified by event coordinator",
    dataGeneralizations: r.generalised
      ? `Coordinates generalised to the centre of a ${GRID_DEGREES}-degree grid cell (sensitive taxon)`
      : "",
    datasetName,
  };
}

export function occurrenceTxt(rows: readonly Located[], datasetName: string): string {
  const lines = rows.map((r) => {
    const v = dwcRecord(r, datasetName);
    return DWC_TERMS.map((t) => tsv(v[t])).join("\t");
  });
  return [DWC_TERMS.join("\t"), ...lines].join("\n") + "\n";
}
