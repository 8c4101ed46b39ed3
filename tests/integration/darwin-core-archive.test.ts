import { sql } from "drizzle-orm";
import { strFromU8, unzipSync } from "fflate";
import { beforeAll, describe, expect, it } from "vitest";
import { GET as fileGet } from "@/app/api/reports/[reportId]/[file]/route";
import * as s from "@/db/schema";
import { seedDemo } from "@/db/seed/demo";
import { DEMO_EVENT } from "@/db/seed/demo-scenario";
import { DATA_LICENSES } from "@/lib/results/dwc";
import { publishReport } from "@/server/results/publish";
import { db, lonLat, makeFixture, sightingValues } from "./helpers";

// Issue 16: the report's Darwin Core Archive is an Event core with an Occurrence extension. The
// rules checked here are the Darwin Core Text Guide's (https://dwc.tdwg.org/text/, from memory):
// meta.xml names the core file with an <id> column and each extension file with a <coreid>
// column; every extension row's coreid is an id of the core; every field names its term by URI.
// Valid term names: the Darwin Core quick reference (https://dwc.tdwg.org/terms/, from memory),
// the classes this archive draws on (record-level, Occurrence, Event, Location, Identification, Taxon).
const DWC_TERMS = new Set(
  (
    "institutionCode collectionCode datasetName datasetID basisOfRecord informationWithheld dataGeneralizations " +
    "dynamicProperties ownerInstitutionCode occurrenceID catalogNumber recordNumber recordedBy recordedByID " +
    "individualCount organismQuantity organismQuantityType sex lifeStage behavior occurrenceStatus occurrenceRemarks " +
    "eventID parentEventID eventType fieldNumber eventDate eventTime startDayOfYear endDayOfYear year month day " +
    "verbatimEventDate habitat samplingProtocol sampleSizeValue sampleSizeUnit samplingEffort fieldNotes eventRemarks " +
    "locationID locality verbatimLocality countryCode decimalLatitude decimalLongitude geodeticDatum " +
    "coordinateUncertaintyInMeters footprintWKT identificationID identifiedBy identifiedByID dateIdentified " +
    "identificationVerificationStatus identificationRemarks taxonID scientificName taxonRank vernacularName kingdom"
  ).split(" "),
);
const DC_TERMS = new Set(["type", "modified", "language", "license", "rightsHolder", "accessRights", "references"]);

type Archive = {
  meta: string;
  eml: string;
  core: Record<string, string>[];
  ext: Record<string, string>[];
  files: string[];
};

/** The archive through its public handler, each file read by the columns meta.xml declares. */
async function archive(reportId: string): Promise<Archive> {
  const response = await fileGet(new Request(`http://localhost:3000/api/reports/${reportId}/darwin-core-archive.zip`), {
    params: Promise.resolve({ reportId, file: "darwin-core-archive.zip" }),
  } as never);
  expect(response.status).toBe(200);
  const zip = unzipSync(new Uint8Array(await response.arrayBuffer()));
  const meta = strFromU8(zip["meta.xml"]!);
  const read = (kind: "core" | "extension") => {
    const block = meta.match(new RegExp(`<${kind} [^>]*>([\\s\\S]*?)</${kind}>`))![0];
    const location = block.match(/<location>([^<]+)<\/location>/)![1]!;
    const fields = [...block.matchAll(/<field index="(\d+)" term="([^"]+)"\/>/g)].map((m) => [Number(m[1]), m[2]!]);
    const lines = strFromU8(zip[location]!).trimEnd().split("\n");
    const header = lines[0]!.split("\t");
    // The header line (ignoreHeaderLines="1") repeats the terms' names in the order meta.xml gives.
    expect(fields.map(([i, uri]) => `${i}:${String(uri).replace(/^.*\//, "")}`)).toEqual(
      header.map((h, i) => `${i}:${h}`),
    );
    return {
      block,
      location,
      fields,
      rows: lines.slice(1).map((l) => {
        const cells = l.split("\t");
        expect(cells.length).toBe(header.length);
        return Object.fromEntries(header.map((h, i) => [h, cells[i]!]));
      }),
    };
  };
  const core = read("core");
  const ext = read("extension");
  // A core with an id column, an extension with a coreid column, Event and Occurrence row types.
  expect(core.block).toMatch(/rowType="http:\/\/rs\.tdwg\.org\/dwc\/terms\/Event"/);
  expect(core.block).toMatch(/<id index="0"\/>/);
  expect(ext.block).toMatch(/rowType="http:\/\/rs\.tdwg\.org\/dwc\/terms\/Occurrence"/);
  expect(ext.block).toMatch(/<coreid index="0"\/>/);
  expect(meta).toMatch(/<archive xmlns="http:\/\/rs\.tdwg\.org\/dwc\/text\/" metadata="eml\.xml">/);
  // Every term a Darwin Core or Dublin Core term URI, of a term that exists.
  for (const [, uri] of [...core.fields, ...ext.fields]) {
    const m = String(uri).match(/^http:\/\/(rs\.tdwg\.org\/dwc\/terms|purl\.org\/dc\/terms)\/(\w+)$/);
    expect(m, String(uri)).not.toBeNull();
    expect((m![1] === "purl.org/dc/terms" ? DC_TERMS : DWC_TERMS).has(m![2]!), String(uri)).toBe(true);
  }
  return {
    meta,
    eml: strFromU8(zip["eml.xml"]!),
    core: core.rows,
    ext: ext.rows,
    files: Object.keys(zip).sort(),
  };
}

/** The text guide's star schema: unique core ids, every coreid and parentEventID naming a core row. */
function expectStar(a: Archive) {
  const ids = a.core.map((r) => r.eventID!);
  expect(ids.every((id) => id.length > 0)).toBe(true);
  expect(new Set(ids).size).toBe(ids.length);
  for (const r of a.ext) expect(ids, r.occurrenceID).toContain(r.eventID);
  for (const r of a.core) if (r.parentEventID) expect(ids).toContain(r.parentEventID);
  const occurrenceIds = a.ext.map((r) => r.occurrenceID);
  expect(new Set(occurrenceIds).size).toBe(occurrenceIds.length);
}

// ISO 8601 instant (UTC) or interval of two instants, or a calendar date.
const ISO_INSTANT = "\\d{4}-\\d\\d-\\d\\dT\\d\\d:\\d\\d:\\d\\dZ";
const EVENT_DATE = new RegExp(`^(${ISO_INSTANT}(/${ISO_INSTANT})?|\\d{4}-\\d\\d-\\d\\d)$`);

describe("Darwin Core Archive of a report (Event core, Occurrence extension)", () => {
  let demoEventId = "";
  let organiserId = "";
  beforeAll(async () => {
    await seedDemo(db());
    demoEventId = (await db().execute<{ id: string }>(sql`SELECT id FROM events WHERE slug = ${DEMO_EVENT.slug}`))
      .rows[0]!.id;
    organiserId = (await db().execute<{ id: string }>(sql`SELECT id FROM users WHERE email = 'organiser@example.org'`))
      .rows[0]!.id;
  });

  it("the demo's archive follows the text guide's rules, carries the required terms and says its data are invented", async () => {
    const v = await publishReport(demoEventId, organiserId, { confirmPending: true });
    const a = await archive(v.id);
    expect(a.files).toEqual(["eml.xml", "event.txt", "meta.xml", "occurrence.txt"]);
    expectStar(a);
    const sessions = a.core.filter((r) => r.parentEventID);
    expect(sessions.length).toBeGreaterThan(10);
    for (const e of a.core) {
      expect(e.eventDate, e.eventID).toMatch(EVENT_DATE);
      expect(e.samplingProtocol).not.toBe("");
      expect(e.license).toBe(DATA_LICENSES["cc-by-4.0"].uri);
      expect(e.rightsHolder).toBe("Friends of Harrowmere Vale");
      expect(e.institutionCode).toBe("Friends of Harrowmere Vale");
      expect(e.datasetName).toMatch(/^Invented demonstration data/);
    }
    for (const e of sessions) {
      expect(e.eventDate).toMatch(new RegExp(`^${ISO_INSTANT}/${ISO_INSTANT}$`));
      expect(e.samplingEffort).toMatch(/^1 observer/);
      expect(Number(e.sampleSizeValue)).toBeGreaterThan(0);
      expect(["minute", "metre"]).toContain(e.sampleSizeUnit);
      expect(e.locationID).toMatch(/^urn:uuid:/);
      expect(e.locality).not.toBe("");
    }
    // The demo's zones are the localities.
    expect(new Set(sessions.map((e) => e.locality))).toEqual(
      new Set(["Harrowmere Meadow", "Alder Fringe", "Millpond Margin", "Beechwood Heart"]),
    );
    expect(a.ext.length).toBeGreaterThan(100);
    for (const o of a.ext) {
      for (const term of ["occurrenceID", "basisOfRecord", "eventDate", "scientificName", "recordedBy", "license"])
        expect(o[term], `${term} of ${o.occurrenceID}`).not.toBe("");
      expect(o.occurrenceStatus).toBe("present");
      expect(o.eventDate).toMatch(EVENT_DATE);
      expect(o.recordedBy).not.toContain("@");
      expect(o.identifiedBy).not.toContain("@");
    }
    // Approved by a coordinator: identifiedBy names them (published name or pseudonym).
    expect(a.ext.filter((o) => o.identifiedBy !== "").length).toBeGreaterThan(0);
    // Absences are opt-in: none by default.
    expect(a.eml).toContain("No absences are stated.");
    expect(a.eml).toMatch(/<title>Invented demonstration data, not real observations: /);
    expect(a.eml).toMatch(/<para>These data are invented for a demonstration/);
  });

  it("sessions are events, a sighting outside one belongs to the survey event, sensitive ones lose their session, absences on opt-in", async () => {
    const f = await makeFixture("dwc-core");
    const coordinator = (
      await db()
        .insert(s.users)
        .values({ email: "dwc-coordinator@example.org", name: "Real Name", publishedName: "C. Decider" })
        .returning()
    )[0]!;
    await db()
      .update(s.users)
      .set({ publishedName: "V. Recorder" })
      .where(sql`id = ${f.user.id}`);
    await db()
      .update(s.events)
      .set({ dataLicense: "cc0-1.0", publishAbsences: true })
      .where(sql`id = ${f.event.id}`);
    const taxon = async (name: string, sensitivity: "open" | "generalised" = "open") =>
      (await db().insert(s.taxa).values({ scientificName: name, taxonGroup: "birds", sensitivity }).returning())[0]!;
    const absentOne = await taxon("Archivus absentus");
    const secret = await taxon("Testus secretus", "generalised");
    await db()
      .insert(s.eventSpecies)
      .values([f.taxon, absentOne, secret].map((t) => ({ eventId: f.event.id, taxonId: t.id })));
    const session = (id: string, over: Partial<typeof s.countSessions.$inferInsert>) => ({
      id,
      eventId: f.event.id,
      userId: f.user.id,
      zoneId: f.zone.id,
      kind: "timed_count" as const,
      startedAt: new Date("2026-06-20T09:00:00Z"),
      endedAt: new Date("2026-06-20T09:45:00Z"),
      ...over,
    });
    const complete = crypto.randomUUID();
    const walk = crypto.randomUUID();
    await db()
      .insert(s.countSessions)
      .values([
        session(complete, { allSpeciesNoted: true }),
        session(walk, {
          kind: "walk",
          distanceM: 1200,
          startedAt: new Date("2026-06-21T07:00:00Z"),
          endedAt: new Date("2026-06-21T08:00:00Z"),
        }),
      ]);
    const inComplete = sightingValues(f, { sessionId: complete, reviewState: "approved", count: 3 });
    const onWalk = sightingValues(f, {
      sessionId: walk,
      reviewState: "approved",
      observedAt: new Date("2026-06-21T07:30:00Z"),
    });
    const outside = sightingValues(f, { sessionId: null, reviewState: "approved" });
    const sensitive = sightingValues(f, {
      sessionId: complete,
      taxonId: secret.id,
      reviewState: "approved",
      observedAt: new Date("2026-06-20T09:10:00Z"),
      location: lonLat(0.2345, 0.2345),
    });
    await db().insert(s.sightings).values([inComplete, onWalk, outside, sensitive]);
    await db()
      .insert(s.reviews)
      .values(
        [inComplete, onWalk, outside, sensitive].map((x) => ({
          sightingId: x.id,
          eventId: f.event.id,
          reviewerId: coordinator.id,
          fromState: "pending" as const,
          toState: "approved" as const,
        })),
      );

    const v = await publishReport(f.event.id, f.user.id);
    const a = await archive(v.id);
    expectStar(a);
    const survey = `urn:uuid:${f.event.id}`;
    const byId = (id: string) => a.ext.find((o) => o.occurrenceID === `urn:uuid:${id}`)!;
    // Each count session an event, under the survey event, with protocol, effort and zone.
    const completeRow = a.core.find((e) => e.eventID === `urn:uuid:${complete}`)!;
    expect(completeRow).toMatchObject({
      parentEventID: survey,
      eventDate: "2026-06-20T09:00:00Z/2026-06-20T09:45:00Z",
      samplingProtocol: "timed count; complete list: every species seen was recorded",
      samplingEffort: "1 observer, 45 minutes",
      sampleSizeValue: "45",
      sampleSizeUnit: "minute",
      locationID: `urn:uuid:${f.zone.id}`,
      locality: "Zone A",
      license: DATA_LICENSES["cc0-1.0"].uri,
      rightsHolder: "Org dwc-core",
    });
    expect(a.core.find((e) => e.eventID === `urn:uuid:${walk}`)).toMatchObject({
      samplingProtocol: "transect walk",
      samplingEffort: "1 observer, 60 minutes, 1200 metres walked",
      sampleSizeValue: "1200",
      sampleSizeUnit: "metre",
    });
    expect(a.core.find((e) => e.eventID === survey)).toMatchObject({
      parentEventID: "",
      eventDate: "2026-06-20T05:00:00Z/2026-06-22T05:00:00Z",
    });
    // Each sighting an occurrence of its session, or of the survey event outside one.
    expect(byId(inComplete.id)).toMatchObject({
      eventID: `urn:uuid:${complete}`,
      occurrenceStatus: "present",
      individualCount: "3",
      recordedBy: "V. Recorder",
      identifiedBy: "C. Decider",
      license: DATA_LICENSES["cc0-1.0"].uri,
      institutionCode: "Org dwc-core",
      datasetName: "Event dwc-core (report version 1)",
    });
    expect(byId(onWalk.id).eventID).toBe(`urn:uuid:${walk}`);
    expect(byId(outside.id)).toMatchObject({ eventID: survey, eventDate: "2026-06-20T09:00:00Z" });
    // A generalised taxon: its cell, its day, the survey event (a session would place it in its zone).
    const g = byId(sensitive.id);
    expect(g).toMatchObject({ eventID: survey, eventDate: "2026-06-20" });
    expect(g.dataGeneralizations).toMatch(/generalised/);
    expect(a.ext.map((o) => `${o.decimalLongitude},${o.decimalLatitude}`)).not.toContain("0.2345,0.2345");
    // Absences: open listed taxa not noted in the complete session, never in the walk, never sensitive ones.
    const absences = a.ext.filter((o) => o.occurrenceStatus === "absent");
    expect(absences.map((o) => [o.eventID, o.scientificName, o.individualCount])).toEqual([
      [`urn:uuid:${complete}`, "Archivus absentus", "0"],
    ]);
    expect(absences[0]!.recordedBy).toBe("V. Recorder");
    // Not a demo: nothing says invented; the licence is named in the metadata.
    expect(a.eml).not.toMatch(/invented/i);
    expect(a.eml).toContain(DATA_LICENSES["cc0-1.0"].uri);
    expect(a.eml).toContain("Absences (1)");

    // Without the opt-in the archive states no absence.
    await db()
      .update(s.events)
      .set({ publishAbsences: false })
      .where(sql`id = ${f.event.id}`);
    const b = await archive(v.id);
    expect(b.ext.filter((o) => o.occurrenceStatus === "absent")).toEqual([]);
  });
});
