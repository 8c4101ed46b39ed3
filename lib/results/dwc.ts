// The Darwin Core Archive of a published report (issue 16): an Event core (event.txt) with an
// Occurrence extension (occurrence.txt), described by meta.xml, with eml.xml as its metadata.
//
// Rules followed, from the Darwin Core Text Guide (https://dwc.tdwg.org/text/, from memory):
// - the core file has an <id> column; each extension file has a <coreid> column whose values
//   are ids of core rows ("star schema": every extension row belongs to one core row);
// - every <field> names its term by its full URI; the archive's own terms are Darwin Core's
//   (http://rs.tdwg.org/dwc/terms/) and Dublin Core's (http://purl.org/dc/terms/: license,
//   rightsHolder), as listed in the Darwin Core quick reference (https://dwc.tdwg.org/terms/);
// - rowType of the core is http://rs.tdwg.org/dwc/terms/Event, of the extension .../Occurrence.
//
// Events: one core row for the survey event as a whole (its eventID is the event's id) and one
// per count session (parentEventID pointing at the survey event; Darwin Core's parentEventID is
// "an identifier for the broader Event that groups this and potentially other Events"). A sighting
// made outside any count session belongs to the survey but to no protocol with a known effort,
// so its coreid is the survey event's row: the text guide only asks that it name a core row,
// and a made-up one-sighting event per record would claim a sampling event that never happened.
// Its own date and place are in its occurrence row (the Occurrence extension may carry them).
//
// Sensitive taxa (lib/results/exports.ts, lib/results/public.ts): restricted records never reach
// this file; a generalised record's session would tie it to a zone (a few hundred metres), finer
// than its 0.1° cell, so it is attached to the survey event instead, with its date only. Absences
// are stated for open taxa only (an absence of a sensitive taxon in one zone narrows where it is).
import { createHash } from "node:crypto";
import { strToU8, zipSync } from "fflate";
import type { SessionKind } from "@/lib/domain";
import { GRID_DEGREES, spreadsheetSafe, type Located } from "./exports";

import { DATA_LICENSES, type DataLicense } from "./licenses";

export { DATA_LICENSES, type DataLicense } from "./licenses";

const DWC = "http://rs.tdwg.org/dwc/terms/";
const DC = "http://purl.org/dc/terms/";
const DC_TERMS = new Set(["license", "rightsHolder", "type", "modified"]);
/** A term's URI: Dublin Core's for the few record-level terms Darwin Core borrows, else Darwin Core's. */
export const termUri = (term: string) => (DC_TERMS.has(term) ? DC : DWC) + term;

// The columns of event.txt; eventID is the id column (index 0).
export const EVENT_TERMS = [
  "eventID",
  "parentEventID",
  "eventDate",
  "samplingProtocol",
  "samplingEffort",
  "sampleSizeValue",
  "sampleSizeUnit",
  "locationID",
  "locality",
  "license",
  "rightsHolder",
  "institutionCode",
  "datasetName",
] as const;

// The columns of occurrence.txt; eventID is the coreid column (index 0).
export const OCCURRENCE_TERMS = [
  "eventID",
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
  "recordedBy",
  "identifiedBy",
  "identificationVerificationStatus",
  "dataGeneralizations",
  "license",
  "rightsHolder",
  "institutionCode",
  "datasetName",
] as const;

type Row<T extends readonly string[]> = Partial<Record<T[number], string | number>>;

export type DwcSession = {
  id: string;
  kind: SessionKind;
  startedAt: Date;
  endedAt: Date | null;
  complete: boolean;
  distanceM: number | null;
  zoneId: string | null;
  zoneName: string | null;
  recordedBy: string;
};

export type DwcListedTaxon = { id: string; scientificName: string; rank: string; vernacularName: string };

export type DwcDataset = {
  reportId: string;
  eventId: string;
  eventName: string;
  organisation: string;
  version: number;
  publishedAt: Date;
  startsAt: Date;
  endsAt: Date;
  timeZone: string;
  license: DataLicense;
  isDemo: boolean;
  withheld: number;
  /** Per sighting: its count session (null outside one) and the coordinator who approved it. */
  sightings: ReadonlyMap<string, { sessionId: string | null; identifiedBy: string }>;
  /** Sessions of the report's sightings and its complete sessions. */
  sessions: readonly DwcSession[];
  /** Absences: stated only when the organiser opts in. */
  publishAbsences: boolean;
  /** The event's species list, open taxa only. */
  listed: readonly DwcListedTaxon[];
  /** Per complete session, every taxon noted in it (any review state but rejected). */
  noted: ReadonlyMap<string, ReadonlySet<string>>;
  /** A withdrawn version's files say so, as its page does. */
  withdrawal?: { withdrawnAt: Date; reason: string } | null;
};

/** The dataset's title; an invented (demo) event says so. */
export function datasetTitle(d: Pick<DwcDataset, "eventName" | "version" | "isDemo">): string {
  const title = `${d.eventName} (report version ${d.version})`;
  return d.isDemo ? `Invented demonstration data, not real observations: ${title}` : title;
}

const PROTOCOL: Record<SessionKind, string> = {
  timed_count: "timed count",
  walk: "transect walk",
  plot_search: "plot search",
};

/** ISO 8601 instant without milliseconds (2026-06-21T09:00:00Z). */
const instant = (d: Date) => d.toISOString().replace(/\.\d{3}Z$/, "Z");
/** ISO 8601 interval start/end, Darwin Core's eventDate for something that lasted. */
export const interval = (a: Date, b: Date | null) => (b ? `${instant(a)}/${instant(b)}` : instant(a));
/** The calendar date in the event's time zone (YYYY-MM-DD). */
const localDate = (d: Date, timeZone: string) => new Intl.DateTimeFormat("en-CA", { timeZone }).format(d);

/** A stable UUID (version 5 layout, SHA-1 of a name), for absences, which have no row of their own. */
export function nameUuid(name: string): string {
  const h = createHash("sha1").update(`ecotone:${name}`).digest();
  h[6] = (h[6]! & 0x0f) | 0x50;
  h[8] = (h[8]! & 0x3f) | 0x80;
  const x = h.subarray(0, 16).toString("hex");
  return `${x.slice(0, 8)}-${x.slice(8, 12)}-${x.slice(12, 16)}-${x.slice(16, 20)}-${x.slice(20)}`;
}

const urn = (id: string) => `urn:uuid:${id}`;

export function sessionEffort(s: DwcSession): {
  samplingEffort: string;
  sampleSizeValue: number | "";
  sampleSizeUnit: string;
} {
  const minutes = s.endedAt ? Math.round((s.endedAt.getTime() - s.startedAt.getTime()) / 60_000) : null;
  const parts = ["1 observer"];
  if (minutes !== null) parts.push(`${minutes} minutes`);
  if (s.kind === "walk" && s.distanceM !== null) parts.push(`${Math.round(s.distanceM)} metres walked`);
  // sampleSizeUnit examples in the Darwin Core term list include "minute" and "metre" (from memory).
  if (s.kind === "walk" && s.distanceM !== null)
    return { samplingEffort: parts.join(", "), sampleSizeValue: Math.round(s.distanceM), sampleSizeUnit: "metre" };
  if (minutes !== null) return { samplingEffort: parts.join(", "), sampleSizeValue: minutes, sampleSizeUnit: "minute" };
  return { samplingEffort: parts.join(", "), sampleSizeValue: "", sampleSizeUnit: "" };
}

/** The two files' rows (before writing): core events and occurrences, absences included when asked. */
export function dwcRows(rows: readonly Located[], d: DwcDataset) {
  const license = DATA_LICENSES[d.license].uri;
  const common = {
    license,
    rightsHolder: d.organisation,
    institutionCode: d.organisation,
    datasetName: datasetTitle(d),
  };
  const surveyId = urn(d.eventId);
  const events: Row<typeof EVENT_TERMS>[] = [
    {
      eventID: surveyId,
      parentEventID: "",
      eventDate: interval(d.startsAt, d.endsAt),
      samplingProtocol: "volunteer survey event: count sessions and incidental sightings",
      ...common,
    },
  ];
  const occurrences: Row<typeof OCCURRENCE_TERMS>[] = [];
  const sessions = new Map(d.sessions.map((s) => [s.id, s]));
  const used = new Set<string>();
  for (const r of rows) {
    const info = d.sightings.get(r.id);
    const session = !r.generalised && info?.sessionId ? sessions.get(info.sessionId) : undefined;
    if (session) used.add(session.id);
    occurrences.push({
      eventID: session ? urn(session.id) : surveyId,
      occurrenceID: urn(r.id),
      basisOfRecord: "HumanObservation",
      // A generalised record keeps its day only: its exact time and recorder would find its session.
      eventDate: r.generalised ? localDate(new Date(r.eventDate), d.timeZone) : instant(new Date(r.eventDate)),
      scientificName: r.scientificName,
      taxonRank: r.taxonRank,
      vernacularName: r.vernacularName,
      individualCount: r.individualCount,
      occurrenceStatus: "present",
      decimalLatitude: r.lat,
      decimalLongitude: r.lon,
      geodeticDatum: "EPSG:4326",
      coordinateUncertaintyInMeters: r.uncertaintyM,
      recordedBy: r.recordedBy,
      identifiedBy: info?.identifiedBy ?? "",
      identificationVerificationStatus: "verified by event coordinator",
      dataGeneralizations: r.generalised
        ? `Sensitive taxon: coordinates generalised to the centre of a ${GRID_DEGREES}-degree grid cell, date kept, time and count session left out`
        : "",
      ...common,
    });
  }
  for (const s of d.sessions) {
    if (s.complete && d.publishAbsences) {
      const noted = d.noted.get(s.id) ?? new Set<string>();
      for (const t of d.listed) {
        if (noted.has(t.id)) continue;
        used.add(s.id);
        occurrences.push({
          eventID: urn(s.id),
          occurrenceID: urn(nameUuid(`absence:${s.id}:${t.id}`)),
          basisOfRecord: "HumanObservation",
          eventDate: interval(s.startedAt, s.endedAt),
          scientificName: t.scientificName,
          taxonRank: t.rank,
          vernacularName: t.vernacularName,
          individualCount: 0,
          occurrenceStatus: "absent",
          recordedBy: s.recordedBy,
          identificationVerificationStatus: "absence in a complete count session (all species seen were recorded)",
          ...common,
        });
      }
    }
    if (!s.complete && !used.has(s.id)) continue;
    events.push({
      eventID: urn(s.id),
      parentEventID: surveyId,
      eventDate: interval(s.startedAt, s.endedAt),
      samplingProtocol: `${PROTOCOL[s.kind]}${s.complete ? "; complete list: every species seen was recorded" : ""}`,
      ...sessionEffort(s),
      locationID: s.zoneId ? urn(s.zoneId) : "",
      locality: s.zoneName ?? "",
      ...common,
    });
  }
  return { events, occurrences };
}

// The formula rule first (a leading tab or CR is one of its characters), then no tab or line break inside a field.
const tsv = (v: string | number | undefined) => spreadsheetSafe(v ?? "").replace(/[\t\r\n]+/g, " ");
function table<T extends readonly string[]>(terms: T, rows: readonly Row<T>[]): string {
  const lines = rows.map((r) => terms.map((t) => tsv(r[t as T[number]])).join("\t"));
  return [terms.join("\t"), ...lines].join("\n") + "\n";
}

const xml = (s: string) => s.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;");

function fileXml(kind: "core" | "extension", rowType: string, file: string, terms: readonly string[]): string {
  const fields = terms.map((t, i) => `    <field index="${i}" term="${termUri(t)}"/>`).join("\n");
  const key = kind === "core" ? `<id index="0"/>` : `<coreid index="0"/>`;
  return `  <${kind} encoding="UTF-8" fieldsTerminatedBy="\\t" linesTerminatedBy="\\n" fieldsEnclosedBy="" ignoreHeaderLines="1" rowType="${DWC}${rowType}">
    <files>
      <location>${file}</location>
    </files>
    ${key}
${fields}
  </${kind}>`;
}

export function eventCoreMetaXml(): string {
  return `<?xml version="1.0" encoding="UTF-8"?>
<archive xmlns="http://rs.tdwg.org/dwc/text/" metadata="eml.xml">
${fileXml("core", "Event", "event.txt", EVENT_TERMS)}
${fileXml("extension", "Occurrence", "occurrence.txt", OCCURRENCE_TERMS)}
</archive>
`;
}

/** The dataset's abstract: what it holds, what was withheld, and for a demo that it is invented. */
export function datasetAbstract(d: DwcDataset, absences: number): string[] {
  const paras = [
    `Approved sightings of the volunteer survey "${d.eventName}" by ${d.organisation}, published as report version ${d.version}. Each count session is an event (sampling protocol, effort and zone); each sighting an occurrence of its session, or of the survey event when made outside a count session.`,
    `Records of restricted sensitive taxa withheld: ${d.withheld}. Records of generalised sensitive taxa have coordinates moved to the centre of a ${GRID_DEGREES}-degree grid cell and are attached to the survey event, not their count session.`,
    d.publishAbsences
      ? `Absences (${absences}) are stated for open species of the event's species list not recorded in a complete count session.`
      : "No absences are stated.",
  ];
  if (d.withdrawal)
    paras.unshift(
      `This report version was withdrawn on ${d.withdrawal.withdrawnAt.toISOString().slice(0, 10)}: ${d.withdrawal.reason}. Do not use it as the event's current results.`,
    );
  if (d.isDemo)
    paras.unshift(
      "These data are invented for a demonstration: the people, places and sightings are not real (only the species names are). Do not use them as observations.",
    );
  return paras;
}

/** Dataset metadata in Ecological Metadata Language 2.1.1 (the profile the text guide names). */
export function eventCoreEmlXml(d: DwcDataset, absences: number): string {
  const license = DATA_LICENSES[d.license];
  return `<?xml version="1.0" encoding="UTF-8"?>
<eml:eml xmlns:eml="eml://ecoinformatics.org/eml-2.1.1" packageId="urn:uuid:${d.reportId}" system="ecotone" scope="system" xml:lang="en">
  <dataset>
    <title>${xml(datasetTitle(d))}</title>
    <creator><organizationName>${xml(d.organisation)}</organizationName></creator>
    <pubDate>${d.publishedAt.toISOString().slice(0, 10)}</pubDate>
    <abstract>${datasetAbstract(d, absences)
      .map((p) => `<para>${xml(p)}</para>`)
      .join("")}</abstract>
    <intellectualRights><para>${xml(`${license.name}: ${license.uri}`)}</para></intellectualRights>
    <coverage><temporalCoverage><rangeOfDates><beginDate><calendarDate>${d.startsAt.toISOString().slice(0, 10)}</calendarDate></beginDate><endDate><calendarDate>${d.endsAt.toISOString().slice(0, 10)}</calendarDate></endDate></rangeOfDates></temporalCoverage></coverage>
    <contact><organizationName>${xml(d.organisation)}</organizationName></contact>
  </dataset>
</eml:eml>
`;
}

/** The archive (zip): event.txt (core), occurrence.txt (extension), meta.xml, eml.xml. */
export function eventCoreArchive(rows: readonly Located[], d: DwcDataset): Uint8Array {
  const { events, occurrences } = dwcRows(rows, d);
  const absences = occurrences.filter((o) => o.occurrenceStatus === "absent").length;
  return zipSync(
    {
      "event.txt": strToU8(table(EVENT_TERMS, events)),
      "occurrence.txt": strToU8(table(OCCURRENCE_TERMS, occurrences)),
      "meta.xml": strToU8(eventCoreMetaXml()),
      "eml.xml": strToU8(eventCoreEmlXml(d, absences)),
    },
    { level: 6, mtime: d.publishedAt },
  );
}
