import { sql } from "drizzle-orm";
import { strFromU8, unzipSync } from "fflate";
import { beforeAll, describe, expect, it } from "vitest";
import { getReport, reportOccurrences } from "@/db/queries/reports";
import { checkReport } from "@/server/results/check";
import { publishReport } from "@/server/results/publish";
import { loadInputRecords, loadResultsInput } from "@/db/queries/results";
import * as s from "@/db/schema";
import { seedDemo } from "@/db/seed/demo";
import { DEMO_EVENT } from "@/db/seed/demo-scenario";
import { SENSITIVE_DEMO_RECORDS } from "@/db/seed/sensitive";
import { canonicalJson, computeResults } from "@/lib/results/compute";
import { GET as fileGet } from "@/app/api/reports/[reportId]/[file]/route";
import { occurrencesGeoJson, publicOccurrences, speciesCsv } from "@/lib/results/exports";
import { inputFromRecords, inputHash } from "@/lib/results/records";
import { resultsKey, taxaMeta } from "@/db/queries/results";
import { currentResults } from "@/server/results/current";
import { db, makeFixture, refusal, sightingValues } from "./helpers";

let eventId = "";
let organiserId = "";

beforeAll(async () => {
  await seedDemo(db());
  const [e] = (await db().execute<{ id: string }>(sql`SELECT id FROM events WHERE slug = ${DEMO_EVENT.slug}`)).rows;
  eventId = e!.id;
  const [u] = (await db().execute<{ id: string }>(sql`SELECT id FROM users WHERE email = 'organiser@example.org'`))
    .rows;
  organiserId = u!.id;
});

async function plainGroupBy(event: string) {
  const r = await db().execute<{ zone: string | null; taxon: string; n: number }>(sql`
    SELECT zone_id AS zone, taxon_id AS taxon, sum(count)::int AS n FROM sightings
    WHERE event_id = ${event} AND review_state = 'approved' AND taxon_id IS NOT NULL GROUP BY 1, 2 ORDER BY 1, 2`);
  return r.rows.map((x) => `${x.zone ?? "00000000-0000-0000-0000-000000000000"}|${x.taxon}|${x.n}`).sort();
}
async function aggregates(event: string) {
  const r = await db().execute<{ zone: string; taxon: string; n: number }>(sql`
    SELECT zone_key AS zone, taxon_id AS taxon, individuals::int AS n FROM result_taxon_counts WHERE event_id = ${event}`);
  return r.rows.map((x) => `${x.zone}|${x.taxon}|${x.n}`).sort();
}

describe("results aggregates (migration 0007 triggers)", () => {
  it("stay equal to a plain GROUP BY over approved sightings through inserts, approvals, re-identification and deletes", async () => {
    const f = await makeFixture("agg");
    const [other] = await db()
      .insert(s.taxa)
      .values({ scientificName: "Testus aggregatus", taxonGroup: "insects" })
      .returning();
    const [session] = await db()
      .insert(s.countSessions)
      .values({
        id: crypto.randomUUID(),
        eventId: f.event.id,
        userId: f.user.id,
        zoneId: f.zone.id,
        kind: "timed_count",
        startedAt: new Date("2026-06-20T09:00:00Z"),
        endedAt: new Date("2026-06-20T09:20:00Z"),
        allSpeciesNoted: true,
      })
      .returning();
    const rows = Array.from({ length: 12 }, (_, i) =>
      sightingValues(f, {
        count: i + 1,
        reviewState: i % 3 === 0 ? "pending" : "approved",
        sessionId: i < 6 ? session!.id : null,
        zoneId: i % 4 === 0 ? null : f.zone.id,
      }),
    );
    await db().insert(s.sightings).values(rows);
    expect(await aggregates(f.event.id)).toEqual(await plainGroupBy(f.event.id));
    await db()
      .update(s.sightings)
      .set({ reviewState: "approved" })
      .where(sql`event_id = ${f.event.id} AND review_state = 'pending'`);
    expect(await aggregates(f.event.id)).toEqual(await plainGroupBy(f.event.id));
    await db()
      .update(s.sightings)
      .set({ taxonId: other!.id })
      .where(sql`id = ${rows[1]!.id}`);
    await db()
      .update(s.sightings)
      .set({ reviewState: "rejected" })
      .where(sql`id = ${rows[2]!.id}`);
    expect(await aggregates(f.event.id)).toEqual(await plainGroupBy(f.event.id));
    await db()
      .delete(s.sightings)
      .where(sql`id = ${rows[3]!.id}`);
    expect(await aggregates(f.event.id)).toEqual(await plainGroupBy(f.event.id));
    const pairs = await db().execute<{ n: number }>(
      sql`SELECT count(*)::int AS n FROM result_session_taxa WHERE event_id = ${f.event.id}`,
    );
    const direct = await db().execute<{ n: number }>(sql`
      SELECT count(DISTINCT (session_id, taxon_id))::int AS n FROM sightings WHERE event_id = ${f.event.id} AND review_state = 'approved' AND session_id IS NOT NULL`);
    expect(pairs.rows[0]!.n).toBe(direct.rows[0]!.n);
    // Nothing left at zero.
    const zero = await db().execute<{ n: number }>(
      sql`SELECT count(*)::int AS n FROM result_taxon_counts WHERE sightings <= 0`,
    );
    expect(zero.rows[0]!.n).toBe(0);
  });

  it("give the same results as the report path that reads every input record", async () => {
    const fromAggregates = computeResults(await loadResultsInput(eventId));
    const records = await loadInputRecords(eventId);
    const input = await loadResultsInput(eventId);
    const meta = await taxaMeta([...new Set(records.map((r) => r[2]))], db(), eventId);
    const fromRecords = computeResults({ ...inputFromRecords(records, input.zones, meta), pending: input.pending });
    expect(canonicalJson(fromAggregates)).toBe(canonicalJson(fromRecords));
    expect(fromAggregates.totals.species).toBeGreaterThan(20);
    expect(fromAggregates.comparison?.sentences.length).toBeGreaterThan(0);
  });
});

describe("current results cache", () => {
  it("is reused while nothing changed and recomputed after an approval or a session's complete flag changes", async () => {
    const f = await makeFixture("cache");
    const [session] = await db()
      .insert(s.countSessions)
      .values({
        id: crypto.randomUUID(),
        eventId: f.event.id,
        userId: f.user.id,
        zoneId: f.zone.id,
        kind: "plot_search",
        startedAt: new Date("2026-06-20T09:00:00Z"),
        endedAt: new Date("2026-06-20T09:30:00Z"),
        allSpeciesNoted: false,
      })
      .returning();
    const rows = [
      sightingValues(f, { count: 3, reviewState: "approved", sessionId: session!.id }),
      sightingValues(f, { count: 2, sessionId: session!.id }),
    ];
    await db().insert(s.sightings).values(rows);
    const first = await currentResults(f.event.id);
    expect(await currentResults(f.event.id)).toBe(first);
    expect(first.results.totals.individuals).toBe(3);
    await db()
      .update(s.sightings)
      .set({ reviewState: "approved" })
      .where(sql`id = ${rows[1]!.id}`);
    const second = await currentResults(f.event.id);
    expect(second.results.totals.individuals).toBe(5);
    const key = await resultsKey(f.event.id);
    await db()
      .update(s.countSessions)
      .set({ allSpeciesNoted: true })
      .where(sql`id = ${session!.id}`);
    expect(await resultsKey(f.event.id)).not.toBe(key);
    expect((await currentResults(f.event.id)).results.totals.completeSessions).toBe(1);
  });
});

describe("reports", () => {
  it("publish numbered versions that the database refuses to change, list what changed, and re-compute to the same numbers", async () => {
    const v1 = await publishReport(eventId, organiserId, { confirmPending: true });
    const r1 = await getReport(eventId, v1.version, { withInputs: true });
    expect(r1!.inputHash).toBe(inputHash(r1!.inputRecords));

    // A published report never changes: enforced by PostgreSQL itself.
    const upd = await refusal(() => db().execute(sql`UPDATE reports SET results = '{}'::jsonb WHERE id = ${v1.id}`));
    expect(upd.message).toMatch(/append-only/);
    const del = await refusal(() => db().execute(sql`DELETE FROM reports WHERE id = ${v1.id}`));
    expect(del.message).toMatch(/append-only/);

    // Re-computing from the recorded inputs alone gives every number again.
    const check = await checkReport(eventId, v1.version);
    expect(check).toMatchObject({ same: true, hashSame: true });

    // One more approval, then version 2 says what changed.
    const [pending] = (
      await db().execute<{ id: string }>(sql`
      SELECT id FROM sightings WHERE event_id = ${eventId} AND review_state = 'pending' AND taxon_id IS NOT NULL ORDER BY id LIMIT 1`)
    ).rows;
    // Approved as the review desk records it: the state and an append-only review row.
    await db()
      .update(s.sightings)
      .set({ reviewState: "approved" })
      .where(sql`id = ${pending!.id}`);
    await db()
      .insert(s.reviews)
      .values({ sightingId: pending!.id, eventId, reviewerId: organiserId, fromState: "pending", toState: "approved" });
    const v2 = await publishReport(eventId, organiserId, { confirmPending: true });
    expect(v2.version).toBe(v1.version + 1);
    const r2 = await getReport(eventId, v2.version);
    expect(r2!.changes).toMatchObject({ previousVersion: v1.version, added: 1, removed: 0, changed: 0 });
    expect(r2!.inputHash).not.toBe(r1!.inputHash);
    const again = await getReport(eventId, v1.version);
    expect(canonicalJson(again!.results)).toBe(canonicalJson(r1!.results));
    expect(again!.latestVersion).toBe(v2.version);
    expect((await checkReport(eventId, v2.version))!.same).toBe(true);

    // Every participant is told, in their language.
    const mails = await db().execute<{ to: string; locale: string; subject: string }>(sql`
      SELECT to_address AS to, locale, subject FROM email_outbox WHERE kind = 'report_published' AND subject LIKE ${`%${v2.version}%`}`);
    expect(mails.rows.length).toBeGreaterThanOrEqual(9);
    expect(mails.rows.find((m) => m.to === "coordinator@example.org")!.subject).toMatch(/publicada/);
  });

  it("no public output holds the exact coordinates of a sensitive taxon", async () => {
    const v = await publishReport(eventId, organiserId, { confirmPending: true });
    const report = (await getReport(eventId, v.version, { withInputs: true }))!;
    const occurrences = await reportOccurrences(report);
    expect(occurrences.filter((o) => o.sensitivity !== "open").length).toBe(SENSITIVE_DEMO_RECORDS.length);
    const { rows, withheld } = publicOccurrences(report.results, occurrences, "es");
    expect(withheld).toBe(2);
    // The archive as its public handler serves it (Event core, lib/results/dwc.ts).
    const response = await fileGet(new Request(`http://localhost:3000/api/reports/${v.id}/darwin-core-archive.zip`), {
      params: Promise.resolve({ reportId: v.id, file: "darwin-core-archive.zip" }),
    } as never);
    const zip = unzipSync(new Uint8Array(await response.arrayBuffer()));
    const outputs = {
      csv: speciesCsv(report.results, "es"),
      geojson: occurrencesGeoJson(rows),
      occurrence: strFromU8(zip["occurrence.txt"]!),
      events: strFromU8(zip["event.txt"]!),
      eml: strFromU8(zip["eml.xml"]!),
      resultsJson: JSON.stringify(report.results),
    };
    for (const rec of SENSITIVE_DEMO_RECORDS) {
      // The exact value as any program prints it, not followed by more digits (other records' coordinates may share a prefix).
      for (const v of [rec.lon, rec.lat]) {
        const needle = new RegExp(`${String(v).replace(".", "\\.")}(?!\\d)`);
        for (const [name, text] of Object.entries(outputs)) expect(needle.test(text), `${v} in ${name}`).toBe(false);
      }
    }
    // The generalised badgers are there, at a grid cell centre with a wide uncertainty; restricted taxa are not.
    const geo = JSON.parse(outputs.geojson) as {
      features: {
        geometry: { coordinates: [number, number] };
        properties: { scientificName: string; coordinateUncertaintyInMeters: number; generalised: boolean };
      }[];
    };
    const badgers = geo.features.filter((f) => f.properties.scientificName === "Meles meles");
    expect(badgers.length).toBe(2);
    for (const b of badgers) {
      expect(b.properties.generalised).toBe(true);
      expect(b.properties.coordinateUncertaintyInMeters).toBeGreaterThanOrEqual(6500);
      expect(b.geometry.coordinates).toEqual([-1.85, 52.15]);
    }
    expect(geo.features.some((f) => /Accipiter|Cypripedium/.test(f.properties.scientificName))).toBe(false);
    expect(outputs.occurrence).toContain("generalised");
  });
});
