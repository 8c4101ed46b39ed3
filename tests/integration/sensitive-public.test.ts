import { sql } from "drizzle-orm";
import { strFromU8, unzipSync } from "fflate";
import { beforeAll, describe, expect, it } from "vitest";
import { GET as fileGet } from "@/app/api/reports/[reportId]/[file]/route";
import { FILE_CACHE, REPORT_FILES } from "@/app/api/reports/[reportId]/[file]/schema";
import { GET as reportGet } from "@/app/api/v1/events/[eventId]/reports/[version]/route";
import { GET as resultsGet } from "@/app/api/v1/events/[eventId]/results/route";
import { GET as sightingsGet } from "@/app/api/v1/events/[eventId]/sightings/route";
import { createApiToken } from "@/db/queries/api-tokens";
import { getReport, publicResultsOf } from "@/db/queries/reports";
import { seedDemo } from "@/db/seed/demo";
import { DEMO_EVENT } from "@/db/seed/demo-scenario";
import { generalise } from "@/lib/results/exports";
import { makeApiToken } from "@/server/auth/api-token-secret";
import { currentResults } from "@/server/results/current";
import { publishReport } from "@/server/results/publish";
import { db } from "./helpers";

// Issue 13: a zone is a few hundred metres across, finer than a sensitive taxon's
// generalisation. Every public output is read through its real handler (or, for the report
// page, the loader the page calls) and scanned for any sensitive taxon next to a zone.
let eventId = "";
let organisationId = "";
let organiserId = "";
let reportId = "";
let version = 0;
let secret = "";
let zoneIds: string[] = [];
let zoneNames: string[] = [];
const sensitive: { id: string; name: string; sensitivity: "generalised" | "restricted" }[] = [];

const ctx = (params: Record<string, string>) => ({ params: Promise.resolve(params) }) as never;
const get = (path: string, auth = false) =>
  new Request(`http://localhost:3000${path}`, { headers: auth ? { authorization: `Bearer ${secret}` } : {} });
const file = (name: string) =>
  fileGet(get(`/api/reports/${reportId}/${name}`), ctx({ reportId, file: name })) as Promise<Response>;

beforeAll(async () => {
  await seedDemo(db() as never);
  const [e] = (
    await db().execute<{ id: string; org: string }>(
      sql`SELECT id, organisation_id AS org FROM events WHERE slug = ${DEMO_EVENT.slug}`,
    )
  ).rows;
  eventId = e!.id;
  organisationId = e!.org;
  const [u] = (await db().execute<{ id: string }>(sql`SELECT id FROM users WHERE email = 'organiser@example.org'`))
    .rows;
  organiserId = u!.id;
  const zones = (
    await db().execute<{ id: string; name: string }>(sql`SELECT id, name FROM zones WHERE event_id = ${eventId}`)
  ).rows;
  zoneIds = zones.map((z) => z.id);
  zoneNames = zones.map((z) => z.name);
  const v = await publishReport(eventId, organiserId, { confirmPending: true });
  reportId = v.id;
  version = v.version;
  const report = (await getReport(eventId, version))!;
  for (const s of report.results.species)
    if (s.sensitivity !== "open")
      sensitive.push({ id: s.id, name: s.scientificName, sensitivity: s.sensitivity as "generalised" | "restricted" });
  const t = makeApiToken();
  await createApiToken({
    organisationId,
    eventId,
    name: "sensitive scan",
    prefix: t.prefix,
    tokenHash: t.hash,
    createdBy: organiserId,
    expiresAt: new Date(Date.now() + 86_400_000),
  });
  secret = t.secret;
});

/** Every object in a JSON value that names `taxon` (by id or scientific name) must name no zone. */
function zoneMentionsNear(value: unknown, taxon: { id: string; name: string }): string[] {
  const found: string[] = [];
  const walk = (v: unknown, path: string) => {
    if (!v || typeof v !== "object") return;
    const text = JSON.stringify(v);
    if (!Array.isArray(v) && (text.includes(taxon.id) || text.includes(`"${taxon.name}"`))) {
      const own = Object.entries(v as Record<string, unknown>);
      const direct = own.some(([, x]) => x === taxon.id || x === taxon.name);
      if (direct) for (const z of zoneIds) if (text.includes(z)) found.push(`${path}: zone ${z} next to ${taxon.name}`);
    }
    for (const [k, x] of Object.entries(v as Record<string, unknown>)) walk(x, `${path}.${k}`);
  };
  walk(value, "$");
  return found;
}

/** The species CSV's cells for one taxon: zone columns must be empty. */
function csvZoneCells(csv: string, name: string): string[] | null {
  const lines = csv.trimEnd().split("\r\n");
  const header = lines[0]!.split(",");
  const row = lines.find((l) => l.startsWith(`${name},`));
  if (!row) return null;
  const cells = row.split(",");
  return header.map((h, i) => (zoneNames.includes(h) ? cells[i]! : null)).filter((c): c is string => c !== null);
}

async function publicOutputs() {
  const report = (await getReport(eventId, version))!;
  const responses = await Promise.all(REPORT_FILES.map(file));
  for (const r of responses) expect(r.status).toBe(200);
  const [csv, zip, geojson] = [
    await responses[0]!.text(),
    unzipSync(new Uint8Array(await responses[1]!.arrayBuffer())),
    await responses[2]!.text(),
  ];
  const apiReport = await (
    await reportGet(
      get(`/api/v1/events/${eventId}/reports/${version}`, true),
      ctx({ eventId, version: String(version) }),
    )
  ).json();
  const apiResults = await (await resultsGet(get(`/api/v1/events/${eventId}/results`, true), ctx({ eventId }))).json();
  const apiSightings = await (
    await sightingsGet(get(`/api/v1/events/${eventId}/sightings?limit=1000`, true), ctx({ eventId }))
  ).json();
  return {
    page: await publicResultsOf(eventId, report.results),
    csv,
    geojson: JSON.parse(geojson) as {
      features: { geometry: { coordinates: [number, number] }; properties: { scientificName: string } }[];
    },
    occurrence: strFromU8(zip["occurrence.txt"]!),
    apiReport,
    apiResults,
    apiSightings,
  };
}

describe("sensitive taxa in public outputs", () => {
  it("are never listed by zone in any public output; the organiser's own results still have them by zone", async () => {
    expect(sensitive.map((s) => s.sensitivity).sort()).toEqual(["generalised", "restricted", "restricted"]);
    const out = await publicOutputs();
    for (const taxon of sensitive) {
      // Report page data, token API report and current results: listed at event level, nothing by zone.
      for (const [name, json] of Object.entries({
        page: out.page,
        apiReport: out.apiReport,
        apiResults: out.apiResults,
      })) {
        expect(zoneMentionsNear(json, taxon), name).toEqual([]);
        const species = (name === "apiReport" ? json.results : json).species as { id: string; byZone: object }[];
        const row = species.find((s) => s.id === taxon.id);
        expect(row, `${taxon.name} listed at event level in ${name}`).toBeDefined();
        expect(row!.byZone).toEqual({});
      }
      // species.csv: the event total, every zone cell empty.
      const cells = csvZoneCells(out.csv, taxon.name);
      expect(cells, taxon.name).not.toBeNull();
      expect(cells!.length).toBe(zoneNames.length);
      expect(cells!.every((c) => c === "")).toBe(true);
      // Located outputs: restricted taxa absent; generalised ones only at a 0.1° cell centre.
      const features = out.geojson.features.filter((f) => f.properties.scientificName === taxon.name);
      const dwc = out.occurrence.split("\n").filter((l) => l.includes(`\t${taxon.name}\t`));
      const api = (out.apiSightings.records as { scientificName: string; decimalLongitude: number }[]).filter(
        (r) => r.scientificName === taxon.name,
      );
      if (taxon.sensitivity === "restricted") {
        expect([features.length, dwc.length, api.length]).toEqual([0, 0, 0]);
      } else {
        expect(features.length).toBeGreaterThan(0);
        expect(dwc.length).toBe(features.length);
        expect(api.length).toBe(features.length);
        for (const f of features) {
          const [lon, lat] = f.geometry.coordinates;
          const cell = generalise(lon, lat, 0);
          expect([lon, lat]).toEqual([cell.lon, cell.lat]);
        }
      }
    }
    // Open taxa keep their zone counts, and so does the organiser's own results page.
    expect(out.page.species.some((s) => s.sensitivity === "open" && Object.keys(s.byZone).length > 0)).toBe(true);
    const own = (await currentResults(eventId)).results;
    for (const taxon of sensitive)
      expect(Object.keys(own.species.find((s) => s.id === taxon.id)!.byZone).length).toBeGreaterThan(0);
  });

  it("leaves restricted taxa out altogether when the organiser chooses so, and applies a raised sensitivity to past reports", async () => {
    await db().execute(sql`UPDATE events SET public_restricted = 'hidden' WHERE id = ${eventId}`);
    const open = (await getReport(eventId, version))!.results.species.find(
      (s) => s.sensitivity === "open" && Object.keys(s.byZone).length > 1,
    )!;
    await db().execute(sql`UPDATE taxa SET sensitivity = 'generalised' WHERE id = ${open.id}`);
    try {
      const out = await publicOutputs();
      const everything = JSON.stringify({ ...out, geojson: out.geojson });
      for (const taxon of sensitive.filter((s) => s.sensitivity === "restricted")) {
        expect(everything.includes(taxon.id), taxon.name).toBe(false);
        expect(everything.includes(taxon.name), taxon.name).toBe(false);
        expect(out.csv.includes(taxon.name)).toBe(false);
      }
      const badger = sensitive.find((s) => s.sensitivity === "generalised")!;
      expect(csvZoneCells(out.csv, badger.name)!.every((c) => c === "")).toBe(true);
      // The taxon raised after publication: its zone counts are gone from the old report's outputs.
      expect(csvZoneCells(out.csv, open.scientificName)!.every((c) => c === "")).toBe(true);
      expect(zoneMentionsNear(out.page, { id: open.id, name: open.scientificName })).toEqual([]);
      expect(zoneMentionsNear(out.apiReport, { id: open.id, name: open.scientificName })).toEqual([]);
    } finally {
      await db().execute(sql`UPDATE events SET public_restricted = 'event' WHERE id = ${eventId}`);
      await db().execute(sql`UPDATE taxa SET sensitivity = 'open' WHERE id = ${open.id}`);
    }
  });

  it("the database refuses any other choice for restricted taxa", async () => {
    await expect(
      db().execute(sql`UPDATE events SET public_restricted = 'zone' WHERE id = ${eventId}`),
    ).rejects.toThrow();
  });
});

describe("a report's files follow their page", () => {
  it("answer 404 while the event is back in draft, and are cached briefly, revalidated", async () => {
    for (const name of REPORT_FILES) {
      const res = await file(name);
      expect(res.status, name).toBe(200);
      expect(res.headers.get("cache-control")).toBe(FILE_CACHE);
      expect(FILE_CACHE).toMatch(/max-age=300\b/);
      expect(FILE_CACHE).toMatch(/must-revalidate/);
      expect(FILE_CACHE).not.toMatch(/immutable/);
    }
    const [{ status }] = (await db().execute<{ status: string }>(sql`SELECT status FROM events WHERE id = ${eventId}`))
      .rows as [{ status: string }];
    await db().execute(sql`UPDATE events SET status = 'draft' WHERE id = ${eventId}`);
    try {
      for (const name of REPORT_FILES) expect((await file(name)).status, name).toBe(404);
    } finally {
      await db().execute(sql`UPDATE events SET status = ${status} WHERE id = ${eventId}`);
    }
    expect((await file("species.csv")).status).toBe(200);
  });
});
