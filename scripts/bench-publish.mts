// Benchmark of publishing a report of the 1,000,000-sighting event (issue 18, "Publishing at
// scale"): the database and event of scripts/bench-results.mts (run first, and seeded by it when
// missing), migrated to the latest here. Times each step of the publish path once, one after the
// other, in a transaction rolled back (the aggregate tables' input, reading and storing the records,
// results with and without the Hill bands, the records' input, the previous version and what changed,
// the hash, the report row; publishing itself overlaps the records' statement with the results), then
// publishes for real `--runs` times two ways (one more sighting approved before each): cold, nothing
// computed in this process, and after the results page's read and its worker's bands (which
// publishing reuses when the input is the same); checks the last report re-computes to the same
// results and hash, and measures what one report occupies on disk.
//
//   ECOTONE_PG_PORT=… ECOTONE_TEST_SUFFIX=… npx tsx scripts/bench-publish.mts [--runs=N]
//
// The data layer is marked "server-only": the script re-runs itself with scripts/no-server-only.cjs
// (not the react-server condition, whose React build next-intl's translator cannot load).
import { spawnSync } from "node:child_process";
import { fileURLToPath } from "node:url";

const args = process.argv.slice(2);
if (!process.execArgv.some((a) => a.includes("no-server-only"))) {
  const { env } = await import("../lib/env");
  const u = new URL(env().DATABASE_URL);
  u.pathname = `/ecotone_test_bench${process.env.ECOTONE_TEST_SUFFIX ?? ""}`;
  if (process.env.ECOTONE_PG_PORT) u.port = process.env.ECOTONE_PG_PORT;
  const r = spawnSync(
    process.execPath,
    ["--require", "./scripts/no-server-only.cjs", "--import", "tsx", fileURLToPath(import.meta.url), ...args],
    { stdio: "inherit", env: { ...process.env, DATABASE_URL: u.toString() } },
  );
  process.exit(r.status ?? 1);
}

const { sql } = await import("drizzle-orm");
const { getDb } = await import("../db/client");
const { runMigrations } = await import("../db/migrate");
const { APP_ROLE } = await import("../db/roles");
const { testUrls } = await import("../tests/support/test-db");
const { env } = await import("../lib/env");
const { loadEventInputs } = await import("../db/queries/report-inputs");
const { inReportTransaction, insertReport, latestReportInputs } = await import("../db/queries/reports");
const { loadResultsInput, pendingCounts, taxaMeta } = await import("../db/queries/results");
const { canonicalJson, computeResults } = await import("../lib/results/compute");
const { METHOD_NOTES } = await import("../lib/results/methods");
const { diffColumns, inputFromColumns, inputHash, inputHashOfColumns, recordsOfColumns, taxonIdsOf } =
  await import("../lib/results/records");
const { inputKey, publishReport } = await import("../server/results/publish");
const { currentResults, forgetResults, resultsWithBands } = await import("../server/results/current");
const { checkReport } = await import("../server/results/check");
const { reportRows } = await import("./bench-report");

const runs = Number(args.find((a) => a.startsWith("--runs="))?.split("=")[1] ?? 3);
const url = env().DATABASE_URL;

async function million(): Promise<{ id: string; userId: string } | null> {
  try {
    const r = await getDb().execute<{ id: string; n: number; userId: string }>(sql`
      SELECT e.id, (SELECT count(*) FROM sightings s WHERE s.event_id = e.id)::int AS n,
        (SELECT id FROM users ORDER BY email LIMIT 1) AS "userId"
      FROM events e WHERE e.slug = 'bench-million'`);
    const row = r.rows[0];
    return row?.n === 1_000_000 ? { id: row.id, userId: row.userId } : null;
  } catch {
    return null;
  }
}

let event = await million();
if (!event) {
  console.log("the million-sighting event is missing: seeding it with scripts/bench-results.mts …");
  const r = spawnSync("npx", ["tsx", "scripts/bench-results.mts", "--runs=1"], { stdio: "inherit" });
  if (r.status !== 0) process.exit(r.status ?? 1);
  event = await million();
  if (!event) throw new Error("seeding did not leave the million-sighting event");
}
// A database seeded before the latest migrations (report_inputs among them) catches up here.
await runMigrations(testUrls(url).owner, { appRole: APP_ROLE });
const { id, userId } = event;
const db = getDb();
const ms = (t0: number) => performance.now() - t0;

// ---- where the time goes: each step of server/results/publish.ts once, one after the other (publishing
// overlaps the first two), rolled back at the end
class RolledBack extends Error {}
const steps: Record<string, number> = {};
let records = 0;
let hashesAgree = false;
await inReportTransaction(id, async (tx) => {
  let t = performance.now();
  const pending = await pendingCounts(id, tx);
  const fromAggregates = { ...(await loadResultsInput(id, { db: tx, pending: false })), pending };
  steps["pending counts and the aggregate tables' input"] = ms(t);
  t = performance.now();
  const reportId = crypto.randomUUID();
  const inputs = await loadEventInputs(id, tx, { storeFor: reportId });
  steps["read and store the input records"] = ms(t);
  records = inputs.n;
  t = performance.now();
  computeResults(fromAggregates, { bands: false });
  steps["results without the Hill bands"] = ms(t);
  t = performance.now();
  const results = computeResults(fromAggregates);
  steps["results with the Hill bands (as published)"] = ms(t);
  t = performance.now();
  const meta = await taxaMeta(taxonIdsOf(inputs), tx, id);
  const input = { ...inputFromColumns(inputs, fromAggregates.zones, meta), pending };
  if (inputKey(input) !== inputKey(fromAggregates))
    throw new Error("the records' input differs from the aggregate tables'");
  steps["the records' input, compared with the aggregates'"] = ms(t);
  t = performance.now();
  const prev = await latestReportInputs(id, tx);
  steps["read the previous version"] = ms(t);
  t = performance.now();
  const changes = prev ? diffColumns(prev.version, prev.inputs, inputs, (x) => x) : {};
  steps["what changed since it"] = ms(t);
  t = performance.now();
  const hash = inputHashOfColumns(inputs);
  steps["input hash"] = ms(t);
  t = performance.now();
  await insertReport(
    {
      id: reportId,
      eventId: id,
      version: (prev?.version ?? 0) + 1,
      publishedBy: userId,
      engineVersion: results.engineVersion,
      inputHash: hash,
      results: JSON.parse(canonicalJson(results)),
      methodNotes: METHOD_NOTES,
      changes,
      note: "",
      besideEarlier: null,
    },
    tx,
  );
  steps["write the report row"] = ms(t);
  // The hash of the records as arrays (the meaning reports were published with) is the same.
  hashesAgree = inputHash(recordsOfColumns(inputs)) === hash;
  throw new RolledBack();
}).catch((e) => {
  if (!(e instanceof RolledBack)) throw e;
});
console.log(
  `publish path, ${records.toLocaleString("en")} input records (one run, rolled back; hash as records agrees: ${hashesAgree}):`,
);
for (const [k, v] of Object.entries(steps)) console.log(`  ${k.padEnd(44)} ${v.toFixed(0).padStart(6)} ms`);

// ---- publishing for real
const size = async () =>
  Number(
    (
      await db.execute<{ n: string }>(
        sql`SELECT (pg_total_relation_size('reports') + pg_total_relation_size('report_inputs'))::bigint AS n`,
      )
    ).rows[0]!.n,
  );
const times: number[] = [];
const coldTimes: number[] = [];
const grew: number[] = [];
let rowBytes = 0;
let verified = false;
const approveOne = () =>
  db.execute(sql`UPDATE sightings SET review_state = 'approved' WHERE id = (
    SELECT id FROM sightings WHERE event_id = ${id} AND review_state = 'pending' AND taxon_id IS NOT NULL ORDER BY id LIMIT 1)`);
for (let i = 0; i < runs; i++) {
  // Cold: nothing computed in this process (as after a restart), the results with their bands are computed while publishing.
  await approveOne();
  forgetResults();
  let t = performance.now();
  const cold = await publishReport(id, userId, { confirmPending: true, notify: false });
  coldTimes.push(ms(t));
  // As an organiser publishes: the results page read after the last change, its worker's bands arrived.
  await approveOne();
  await currentResults(id);
  for (let waited = 0; !resultsWithBands(id) && waited < 300_000; waited += 100)
    await new Promise((r) => setTimeout(r, 100));
  const before = await size();
  t = performance.now();
  const r = await publishReport(id, userId, { confirmPending: true, notify: false });
  times.push(ms(t));
  grew.push((await size()) - before);
  const [row] = (
    await db.execute<{ n: string }>(sql`
    SELECT (pg_column_size(r.*) + pg_column_size(i.*))::bigint AS n FROM reports r JOIN report_inputs i ON i.report_id = r.id WHERE r.id = ${r.id}`)
  ).rows;
  rowBytes = Number(row!.n);
  console.log(
    `publish ${i + 1}: version ${cold.version} in ${(coldTimes.at(-1)! / 1000).toFixed(1)} s cold; version ${r.version} in ${(times.at(-1)! / 1000).toFixed(1)} s after the results page; tables grew ${(grew.at(-1)! / 2 ** 20).toFixed(1)} MiB (the rows: ${(rowBytes / 2 ** 20).toFixed(1)} MiB)`,
  );
  // The re-computation check of the last report (results and hash from its stored inputs alone).
  if (i === runs - 1) {
    const check = await checkReport(id, r.version);
    verified = !!check?.same && check.hashSame;
    console.log(
      `version ${r.version} re-computed from its stored inputs: same results ${check?.same}, same hash ${check?.hashSame}`,
    );
  }
}
forgetResults();
const g = globalThis as { ecotonePool?: { end: () => Promise<void> } };
await g.ecotonePool?.end();

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
const t = median(times);
const tCold = median(coldTimes);
// What the two rows occupy (TOAST included): the tables' growth says the same, except when a
// publish fills space an earlier rolled-back one left free.
const stored = rowBytes;
const perRecord = stored / records;
const share = (k: string) => `${(steps[k]! / 1000).toFixed(1)} s`;
reportRows([
  {
    part: "publish",
    figure: `publish a report of the 1,000,000-sighting event (${records.toLocaleString("en")} input records, with what changed since the previous version; the results page read before, its bands reused; median of ${runs})`,
    value: `${(t / 1000).toFixed(1)} s`,
    target: "< 5 s",
    met: t < 5000 && verified,
    note: `cold (nothing computed before, as after a restart) ${(tCold / 1000).toFixed(1)} s; the last report re-computes to the same results and hash: ${verified}; one profiled run (steps one after the other): results with the Hill bands ${share("results with the Hill bands (as published)")} (without ${share("results without the Hill bands")}), reading and storing the records ${share("read and store the input records")}, the rest ${((Object.values(steps).reduce((a, b) => a + b, 0) - steps["results with the Hill bands (as published)"]! - steps["results without the Hill bands"]! - steps["read and store the input records"]!) / 1000).toFixed(1)} s`,
  },
  {
    part: "publish",
    figure: "stored size of one report (its reports row and report_inputs row, TOAST included)",
    value: `${(stored / 2 ** 20).toFixed(1)} MiB (${perRecord.toFixed(0)} bytes per input record)`,
    target: "≤ 32 bytes per input record",
    met: perRecord <= 32,
  },
]);
