import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { sql } from "drizzle-orm";
import { drizzle } from "drizzle-orm/node-postgres";
import { migrate } from "drizzle-orm/node-postgres/migrator";
import { Client, Pool } from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { migrationsFolder, runMigrations } from "@/db/migrate";
import { loadEventInputRecords, PACKED_COLUMNS, recordsOfRow, type PackedText } from "@/db/queries/report-inputs";
import { getReport, inReportTransaction } from "@/db/queries/reports";
import { loadInputRecords, loadResultsInput, pendingCounts } from "@/db/queries/results";
import { APP_ROLE } from "@/db/roles";
import * as s from "@/db/schema";
import { canonicalJson, computeResults, NO_ZONE } from "@/lib/results/compute";
import { inputFromRecords, inputHash, type InputRecord } from "@/lib/results/records";
import { checkReport, recheckReport } from "@/server/results/check";
import { currentResults, forgetResults, resultsWithBands } from "@/server/results/current";
import { inputKey, publishReport } from "@/server/results/publish";
import { dropDatabase, recreateEmptyDatabase } from "@/tests/support/test-db";
import { db, makeFixture, refusal, sightingValues } from "./helpers";

// Publishing at scale (issue 18): a report's input records live in report_inputs, one compact
// row per report (db/queries/report-inputs.ts), no longer one JSON array in the report row.

const ownerUrl = process.env.DATABASE_OWNER_URL!;

async function asOwner<T>(url: string, fn: (c: Client) => Promise<T>): Promise<T> {
  const c = new Client({ connectionString: url });
  await c.connect();
  try {
    return await fn(c);
  } finally {
    await c.end();
  }
}

describe("a report's input records in report_inputs", () => {
  let f: Awaited<ReturnType<typeof makeFixture>>;
  let reportId = "";
  beforeAll(async () => {
    f = await makeFixture("storage");
    const [other] = await db()
      .insert(s.taxa)
      .values({ scientificName: "Testus storagis", taxonGroup: "insects" })
      .returning();
    const session = (allSpeciesNoted: boolean, zoneId: string | null) => ({
      id: crypto.randomUUID(),
      eventId: f.event.id,
      userId: f.user.id,
      zoneId,
      kind: "timed_count" as const,
      startedAt: new Date("2026-06-20T09:00:00Z"),
      endedAt: new Date("2026-06-20T09:20:00Z"),
      allSpeciesNoted,
    });
    const [complete, empty, loose] = await db()
      .insert(s.countSessions)
      .values([session(true, f.zone.id), session(true, null), session(false, f.zone.id)])
      .returning();
    void empty; // a complete session with nothing approved still counts as a sampling unit
    await db()
      .insert(s.sightings)
      .values([
        sightingValues(f, { count: 4, reviewState: "approved", sessionId: complete!.id }),
        sightingValues(f, { count: 2, reviewState: "approved", sessionId: complete!.id, taxonId: other!.id }),
        sightingValues(f, { count: 1, reviewState: "approved", sessionId: loose!.id }),
        sightingValues(f, {
          count: 7,
          reviewState: "approved",
          zoneId: null,
          location: { longitude: 0.9, latitude: 0.9 },
        }),
        sightingValues(f, { count: 3, reviewState: "pending" }),
        sightingValues(f, { count: 5, reviewState: "rejected" }),
      ]);
    reportId = (await publishReport(f.event.id, f.user.id, { confirmPending: true, notify: false })).id;
  });

  it("are read as the results' own loader reads them, stored once in compact columns, and come back the same", async () => {
    const viaResults = await loadInputRecords(f.event.id);
    const viaReports = await inReportTransaction(f.event.id, (tx) => loadEventInputRecords(f.event.id, tx));
    expect(viaReports).toEqual(viaResults);
    expect(viaResults.length).toBe(4 + 2); // approved sightings, and the two complete sessions
    const [row] = (
      await db().execute<{ n: number; ids: number; words: string[]; inReport: boolean }>(sql`
      SELECT i.record_count AS n, cardinality(i.ids) AS ids, i.words,
             EXISTS (SELECT 1 FROM information_schema.columns WHERE table_name = 'reports' AND column_name = 'input_records') AS "inReport"
      FROM report_inputs i WHERE i.report_id = ${reportId}`)
    ).rows;
    expect(row).toMatchObject({ n: 6, ids: 6, inReport: false });
    // Each repeated string (state, taxon, zone, session) is stored once.
    expect(row!.words.filter((w) => w === "approved")).toHaveLength(1);
    expect(row!.words).toContain(NO_ZONE);

    const report = (await getReport(f.event.id, 1, { withInputs: true }))!;
    expect(report.inputCount).toBe(6);
    expect(report.inputRecords).toEqual(viaResults);
    expect(report.inputHash).toBe(inputHash(viaResults));
    expect((await getReport(f.event.id, 1))!.inputRecords).toEqual([]);
    expect(await checkReport(f.event.id, 1)).toMatchObject({ same: true, hashSame: true });
  });

  it("cannot be changed by the app, and a row changed behind its back no longer verifies", async () => {
    const upd = await refusal(() =>
      db().execute(sql`UPDATE report_inputs SET counts[1] = counts[1] + 1 WHERE report_id = ${reportId}`),
    );
    expect(upd.message).toMatch(/append-only/);
    const del = await refusal(() => db().execute(sql`DELETE FROM report_inputs WHERE report_id = ${reportId}`));
    expect(del.message).toMatch(/append-only/);

    // Someone holding the owner role switches the guard off and raises one count.
    const tamper = (change: string) =>
      asOwner(ownerUrl, async (c) => {
        await c.query("BEGIN");
        await c.query("ALTER TABLE report_inputs DISABLE TRIGGER report_inputs_append_only");
        await c.query(`UPDATE report_inputs SET ${change} WHERE report_id = $1`, [reportId]);
        await c.query("ALTER TABLE report_inputs ENABLE TRIGGER report_inputs_append_only");
        await c.query("COMMIT");
      });
    // The first sighting's count (a session record's count counts for nothing).
    const first = "array_position(states, array_position(words, 'approved'))";
    await tamper(`counts[${first}] = counts[${first}] + 1`);
    expect(await checkReport(f.event.id, 1)).toMatchObject({ same: false, hashSame: false });
    // Put back, it verifies again; a record moved to another zone (one dictionary word) is caught too.
    await tamper(`counts[${first}] = counts[${first}] - 1`);
    expect(await checkReport(f.event.id, 1)).toMatchObject({ same: true, hashSame: true });
    await tamper(
      `zones[1] = CASE WHEN words[zones[1]] = '${NO_ZONE}' THEN array_position(words, '${f.zone.id}') ELSE array_position(words, '${NO_ZONE}') END`,
    );
    const moved = (await checkReport(f.event.id, 1))!;
    expect(moved.hashSame).toBe(false);
  });

  it("publish the results page's own results (bands included) when its input is the same, equal to results computed afresh", async () => {
    // The results page's first read, then its worker's bands.
    forgetResults();
    await currentResults(f.event.id);
    for (let waited = 0; !resultsWithBands(f.event.id) && waited < 60_000; waited += 50)
      await new Promise((r) => setTimeout(r, 50));
    const page = resultsWithBands(f.event.id)!;
    expect(page).not.toBeNull();
    // What publishing compares: the page's input is the one publishing reads now, so its results are reused.
    const now = await inReportTransaction(f.event.id, async (tx) => ({
      ...(await loadResultsInput(f.event.id, { db: tx, pending: false })),
      pending: await pendingCounts(f.event.id, tx),
    }));
    expect(inputKey(page.input)).toBe(inputKey(now));
    const reused = await publishReport(f.event.id, f.user.id, { confirmPending: true, notify: false });
    const report = (await getReport(f.event.id, reused.version, { withInputs: true }))!;
    expect(canonicalJson(report.results)).toBe(canonicalJson(JSON.parse(page.json)));
    expect(report.results.rules.hill.bands).toBe(true);
    // The same numbers as computing from the stored records afresh, and the same hash.
    const afresh = recheckReport(report);
    expect(afresh).toMatchObject({ same: true, hashSame: true });
    expect(canonicalJson(JSON.parse(canonicalJson(afresh.recomputed)))).toBe(canonicalJson(report.results));

    // After a change the page has not seen, publishing computes the results itself, and they verify too.
    await db().execute(
      sql`UPDATE sightings SET review_state = 'approved' WHERE event_id = ${f.event.id} AND review_state = 'pending'`,
    );
    expect(inputKey(resultsWithBands(f.event.id)!.input)).not.toBe(
      inputKey({
        ...(await loadResultsInput(f.event.id, { pending: false })),
        pending: await pendingCounts(f.event.id),
      }),
    );
    const fresh = await publishReport(f.event.id, f.user.id, { notify: false });
    const next = (await getReport(f.event.id, fresh.version, { withInputs: true }))!;
    expect(recheckReport(next)).toMatchObject({ same: true, hashSame: true });
    expect(next.changes).toMatchObject({ previousVersion: reused.version, added: 1, removed: 0, changed: 0 });
    expect(next.results.totals.individuals).toBe(report.results.totals.individuals + 3);
    forgetResults();
  });
});

// ---------------------------------------------------------------- the migration, on a report stored as JSON

type JournalEntry = { idx: number; version: string; when: number; tag: string; breakpoints: boolean };
const journal = JSON.parse(fs.readFileSync(path.join(migrationsFolder, "meta/_journal.json"), "utf8")) as {
  entries: JournalEntry[];
};
// Found by its name: a migration merged beside it may change its number.
const MOVE = journal.entries.find((e) => e.tag.endsWith("_report_inputs_compact"))!.tag;

describe(`migration ${MOVE}`, () => {
  const u = new URL(ownerUrl);
  u.pathname = `${u.pathname}_json_reports`;
  const url = u.toString();
  afterAll(() => dropDatabase(url));

  it("moves a report stored as JSON into report_inputs, where it still verifies with its old hash", async () => {
    // A database at the migration before (drizzle's migrator over a journal that ends there).
    await recreateEmptyDatabase(url);
    const upTo = journal.entries.findIndex((e) => e.tag === MOVE);
    expect(upTo).toBeGreaterThan(0);
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), "ecotone-migrations-"));
    fs.cpSync(migrationsFolder, dir, { recursive: true });
    fs.writeFileSync(
      path.join(dir, "meta/_journal.json"),
      JSON.stringify({ ...journal, entries: journal.entries.slice(0, upTo) }),
    );
    const pool = new Pool({ connectionString: url, max: 1 });
    try {
      await migrate(drizzle(pool), { migrationsFolder: dir });
    } finally {
      await pool.end();
      fs.rmSync(dir, { recursive: true, force: true });
    }

    // An event, and two reports published the old way: one with records, one with none.
    const id = (n: number) => `5e0e1f00-0000-4000-8000-${String(n).padStart(12, "0")}`;
    const [org, user, event, zone, wren, oak, session] = [1, 2, 3, 4, 5, 6, 7].map(id);
    const records: InputRecord[] = [
      [id(11), "approved", wren!, 3, zone!, session!, zone!],
      [id(12), "approved", oak!, 1, NO_ZONE, null, null],
      [id(13), "approved", wren!, 2, zone!, session!, zone!],
      [session!, "session", "", 0, zone!, session!, zone!],
      [id(14), "approved", oak!, 5, zone!, null, null],
    ];
    const taxon = (tid: string, scientificName: string) => ({
      id: tid,
      scientificName,
      rank: "species" as const,
      group: "birds" as const,
      sensitivity: "open" as const,
      names: {},
      countUnit: "individuals" as const,
    });
    const meta = new Map([
      [wren!, taxon(wren!, "Troglodytes troglodytes")],
      [oak!, taxon(oak!, "Quercus robur")],
    ]);
    const results = computeResults(
      inputFromRecords(records, [{ id: zone!, name: "Meadow", habitat: "grassland" }], meta),
    );
    const stored = JSON.parse(canonicalJson(results));
    const hash = inputHash(records);
    await asOwner(url, async (c) => {
      await c.query("INSERT INTO organisations (id, slug, name) VALUES ($1, 'json-trust', 'JSON Trust')", [org]);
      await c.query("INSERT INTO users (id, name, email) VALUES ($1, 'Ada', 'ada-json@example.org')", [user]);
      await c.query(
        `INSERT INTO events (id, organisation_id, slug, name, status, starts_at, ends_at, time_zone)
         VALUES ($1, $2, 'json-day', 'JSON day', 'open', '2026-05-01T06:00Z', '2026-05-02T18:00Z', 'Europe/London')`,
        [event, org],
      );
      const report = `INSERT INTO reports (event_id, version, published_by, engine_version, input_hash, input_records, results, method_notes)
        VALUES ($1, $2, $3, 'test', $4, $5::jsonb, $6::jsonb, '{}'::jsonb)`;
      await c.query(report, [
        event,
        1,
        user,
        inputHash([]),
        "[]",
        JSON.stringify(computeResults(inputFromRecords([], [], new Map()))),
      ]);
      await c.query(report, [event, 2, user, hash, JSON.stringify(records), JSON.stringify(stored)]);
    });

    await runMigrations(url, { appRole: APP_ROLE });

    const moved = drizzle(new Pool({ connectionString: url, max: 1 }));
    try {
      const rows = (
        await moved.execute<PackedText & { version: number; inputHash: string; results: typeof stored; n: number }>(sql`
        SELECT r.version, r.input_hash AS "inputHash", r.results, i.record_count AS n, ${PACKED_COLUMNS}
        FROM reports r JOIN report_inputs i ON i.report_id = r.id ORDER BY r.version`)
      ).rows;
      expect(rows.map((r) => [r.version, r.n])).toEqual([
        [1, 0],
        [2, records.length],
      ]);
      const v2 = rows[1]!;
      const back = recordsOfRow(v2);
      expect(back).toEqual(records);
      expect(v2.inputHash).toBe(hash);
      expect(recheckReport({ results: v2.results, inputHash: v2.inputHash, inputRecords: back })).toMatchObject({
        same: true,
        hashSame: true,
      });
      expect(recordsOfRow(rows[0]!)).toEqual([]);
      // The JSON column is gone, and the moved rows are as unchangeable as the reports.
      const gone = await moved.execute(
        sql`SELECT 1 FROM information_schema.columns WHERE table_name = 'reports' AND column_name = 'input_records'`,
      );
      expect(gone.rows).toEqual([]);
      const change = await moved.execute(sql`UPDATE report_inputs SET record_count = record_count`).catch((e) => e);
      expect(String(change.cause?.message ?? change.message)).toMatch(/append-only/);
    } finally {
      await (moved.$client as Pool).end();
    }
  });
});
