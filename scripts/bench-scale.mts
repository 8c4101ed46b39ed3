// Benchmark part "scale" (issue 18, past one machine): the million-sighting event's per-event
// figures when the database holds ten such events, 10,000,000 sightings, with sightings and
// the aggregate tables partitioned by event (migration 0025_sightings_partitioned).
//
// Its database, ecotone_test_bench_scale (ECOTONE_TEST_SUFFIX appended), starts as a copy of
// the results part's million-sighting database (ecotone_test_bench…, seeded by
// scripts/bench-results.mts; it must exist and nobody may be connected to it while it is
// copied). Nine more events are then made from the million event in SQL: its zones, count
// sessions and sightings copied with new ids (INSERT … SELECT, the statement-level triggers
// keeping the aggregates as in production). A kept database is reused (--rebuild to start
// again). Then, for the original event: the review queue's first and deep pages and counts,
// the results' first read after a change, and (--publish) publishing, as the results, publish
// and queue parts time them on one event. Figures, not a pass/fail test.
//
//   npx tsx scripts/bench-scale.mts [--rebuild] [--runs=N] [--publish] [--measure-only]
//
// The db layer imports "server-only": the script re-runs itself with scripts/no-server-only.cjs
// (as scripts/bench-publish.mts does; the "react-server" condition would break publishing's
// translator, which needs React's client build).
import { spawnSync } from "node:child_process";
import { fileURLToPath } from "node:url";

const EVENTS = 10;
const PER_EVENT = 1_000_000;

if (!process.execArgv.some((a) => a.includes("no-server-only"))) {
  const { env } = await import("../lib/env");
  const u = new URL(env().DATABASE_URL);
  u.pathname = `/ecotone_test_bench_scale${process.env.ECOTONE_TEST_SUFFIX ?? ""}`;
  if (process.env.ECOTONE_PG_PORT) u.port = process.env.ECOTONE_PG_PORT;
  const r = spawnSync(
    process.execPath,
    [
      "--require",
      "./scripts/no-server-only.cjs",
      "--import",
      "tsx",
      fileURLToPath(import.meta.url),
      ...process.argv.slice(2),
    ],
    { stdio: "inherit", env: { ...process.env, DATABASE_URL: u.toString() } },
  );
  process.exit(r.status ?? 1);
}

const { Client } = await import("pg");
const { sql } = await import("drizzle-orm");
const { getDb } = await import("../db/client");
const { runMigrations } = await import("../db/migrate");
const { APP_ROLE } = await import("../db/roles");
const { testUrls } = await import("../tests/support/test-db");
const { env } = await import("../lib/env");
const { reviewQueue, queueCounts, QUEUE_PAGE_SIZE } = await import("../db/queries/review");
const { queueFilters } = await import("../lib/review/filters");
const { currentResults, forgetResults } = await import("../server/results/current");
const { reportRows } = await import("./bench-report");
type BenchRow = import("./bench-report").BenchRow;

const args = process.argv.slice(2);
const runs = Number(args.find((a) => a.startsWith("--runs="))?.split("=")[1] ?? 5);
const url = env().DATABASE_URL;
const owner = testUrls(url).owner;
const source = new URL(owner);
source.pathname = `/ecotone_test_bench${process.env.ECOTONE_TEST_SUFFIX ?? ""}`;
const admin = new URL(owner);
admin.pathname = "/postgres";
const dbName = new URL(url).pathname.slice(1);
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
const seconds = (t0: number) => ((performance.now() - t0) / 1000).toFixed(1);

async function onAdmin<T>(work: (c: InstanceType<typeof Client>) => Promise<T>): Promise<T> {
  const c = new Client({ connectionString: admin.toString() });
  await c.connect();
  try {
    return await work(c);
  } finally {
    await c.end();
  }
}

/** The events of the scale database with their sightings, or null when it is missing. */
async function eventsHeld(): Promise<{ id: string; slug: string; n: number }[] | null> {
  const exists = await onAdmin((c) => c.query("SELECT 1 FROM pg_database WHERE datname = $1", [dbName]));
  if (!exists.rowCount) return null;
  const r = await getDb().execute<{ id: string; slug: string; n: number }>(sql`
    SELECT e.id, e.slug, (SELECT count(*) FROM sightings s WHERE s.event_id = e.id)::int AS n
    FROM events e WHERE e.slug LIKE 'bench-million%' ORDER BY e.slug`);
  return r.rows;
}

/** Column names of a table, in order. */
async function columns(table: string): Promise<string[]> {
  const r = await getDb().execute<{ c: string }>(sql`
    SELECT attname AS c FROM pg_attribute WHERE attrelid = ${table}::regclass AND attnum > 0 AND NOT attisdropped ORDER BY attnum`);
  return r.rows.map((x) => x.c);
}

/** INSERT … SELECT of `table`'s rows from `from` matching `where`, each column as is unless `replace` names it. */
async function copyRows(
  tx: { execute: (q: ReturnType<typeof sql.raw>) => Promise<unknown> },
  table: string,
  alias: string,
  from: string,
  where: string,
  replace: Record<string, string>,
) {
  const cols = await columns(table);
  const list = cols.map((c) => `"${c}"`).join(", ");
  const select = cols.map((c) => replace[c] ?? `${alias}."${c}"`).join(", ");
  await tx.execute(sql.raw(`INSERT INTO ${table} (${list}) SELECT ${select} FROM ${from} WHERE ${where}`));
}

async function build(): Promise<void> {
  const t0 = performance.now();
  console.log(`[bench scale] copying ${source.pathname.slice(1)} to ${dbName} …`);
  const g = globalThis as { ecotonePool?: { end: () => Promise<void> }; ecotoneDb?: unknown };
  await g.ecotonePool?.end();
  g.ecotonePool = undefined;
  g.ecotoneDb = undefined;
  await onAdmin(async (c) => {
    await c.query(`DROP DATABASE IF EXISTS "${dbName}" WITH (FORCE)`);
    await c.query(`CREATE DATABASE "${dbName}" TEMPLATE "${source.pathname.slice(1)}" OWNER ecotone`);
  });
  // The copy takes the partitioning migration (and any later one) if its source had not.
  await runMigrations(owner, { appRole: APP_ROLE });
  console.log(`[bench scale] copied and migrated (${seconds(t0)} s)`);
  const db = getDb();
  const src = (await db.execute<{ id: string }>(sql`SELECT id FROM events WHERE slug = 'bench-million'`)).rows[0];
  if (!src) throw new Error("the million-sighting event is missing: run scripts/bench-results.mts first");
  for (let k = 2; k <= EVENTS; k++) {
    const t1 = performance.now();
    const ev = crypto.randomUUID();
    await db.transaction(async (tx) => {
      await tx.execute(sql`CREATE TEMP TABLE zmap ON COMMIT DROP AS
        SELECT id AS old, gen_random_uuid() AS new FROM zones WHERE event_id = ${src.id}`);
      await tx.execute(sql`CREATE TEMP TABLE smap ON COMMIT DROP AS
        SELECT id AS old, gen_random_uuid() AS new FROM count_sessions WHERE event_id = ${src.id}`);
      await tx.execute(sql`ALTER TABLE smap ADD PRIMARY KEY (old)`);
      await tx.execute(sql`ANALYZE smap`);
      const q = (s: string) => `'${s}'`;
      const copy = (table: string, alias: string, from: string, where: string, replace: Record<string, string>) =>
        copyRows(tx, table, alias, from, where, replace);
      await copy("events", "e", "events e", `e.id = ${q(src.id)}`, {
        id: q(ev),
        slug: q(`bench-million-${String(k).padStart(2, "0")}`),
        name: q(`Bench million ${k}`),
      });
      await copy("zones", "z", "zones z JOIN zmap m ON m.old = z.id", "true", { id: "m.new", event_id: q(ev) });
      await copy(
        "count_sessions",
        "c",
        "count_sessions c JOIN smap m ON m.old = c.id LEFT JOIN zmap zm ON zm.old = c.zone_id",
        "true",
        { id: "m.new", event_id: q(ev), zone_id: "zm.new" },
      );
      await copy(
        "sightings",
        "s",
        "sightings s LEFT JOIN smap sm ON sm.old = s.session_id LEFT JOIN zmap zm ON zm.old = s.zone_id",
        `s.event_id = ${q(src.id)}`,
        { id: "gen_random_uuid()", event_id: q(ev), session_id: "sm.new", zone_id: "zm.new" },
      );
    });
    console.log(
      `[bench scale] event ${k} of ${EVENTS}: ${PER_EVENT.toLocaleString("en")} sightings copied (${seconds(t1)} s)`,
    );
  }
  await db.execute(sql`ANALYZE`);
  console.log(`[bench scale] built in ${seconds(t0)} s`);
}

let held = args.includes("--rebuild") ? null : await eventsHeld().catch(() => null);
// --measure-only: time whatever the database holds now (e.g. while a build is still adding events).
if (args.includes("--measure-only") && held?.length) {
  console.log(`[bench scale] measuring as it stands: ${held.length} events`);
} else if (!held || held.length !== EVENTS || held.some((e) => e.n !== PER_EVENT)) {
  await build();
  held = await eventsHeld();
} else {
  await runMigrations(owner, { appRole: APP_ROLE });
}
const db = getDb();
const total = (await db.execute<{ n: number }>(sql`SELECT count(*)::int AS n FROM sightings`)).rows[0]!.n;
const id = held!.find((e) => e.slug === "bench-million")!.id;
const parts = await db.execute<{ part: string; n: number }>(sql`
  SELECT tableoid::regclass::text AS part, count(DISTINCT event_id)::int AS n FROM sightings GROUP BY 1 ORDER BY 1`);
const own = (
  await db.execute<{ part: string }>(
    sql`SELECT tableoid::regclass::text AS part FROM sightings WHERE event_id = ${id} LIMIT 1`,
  )
).rows[0]!.part;
console.log(
  `[bench scale] ${total.toLocaleString("en")} sightings in ${held!.length} events; partitions holding events: ${parts.rows.map((p) => `${p.part} (${p.n})`).join(", ")}; the measured event is in ${own}`,
);

// ---- the review queue of the million event (the queue part's figures, on 1,000,000 sightings)
const time = async (fn: () => Promise<unknown>, n = 15) => {
  await fn();
  const ms: number[] = [];
  for (let r = 0; r < n; r++) {
    const s = performance.now();
    await fn();
    ms.push(performance.now() - s);
  }
  return median(ms);
};
const scope = { eventId: id, taxonGroups: [], locale: "en" };
const pendingNewest = queueFilters.parse({ state: "pending" });
const deepPages = 200;
let cursor: string | null = null;
for (let p = 0; p < deepPages; p++) cursor = (await reviewQueue(scope, pendingNewest, cursor)).nextCursor;
const deep = cursor;
const first = await time(() => reviewQueue(scope, pendingNewest, null));
const deepMs = await time(() => reviewQueue(scope, pendingNewest, deep));
const counts = await time(() => queueCounts(scope, pendingNewest), 5);
const plan = await db.execute<{ "QUERY PLAN": string }>(sql`
  EXPLAIN (ANALYZE, COSTS OFF, TIMING OFF, SUMMARY OFF)
  SELECT s.id FROM sightings s WHERE s.event_id = ${id} AND s.review_state = 'pending'
  ORDER BY s.observed_at DESC, s.id DESC LIMIT ${QUEUE_PAGE_SIZE + 1}`);
console.log(
  `[bench scale] queue first page's sightings scan:\n${plan.rows.map((r) => `  ${r["QUERY PLAN"]}`).join("\n")}`,
);

// ---- the results' first read after a change (the results part's figure)
const afterChange: number[] = [];
forgetResults();
await currentResults(id);
for (let i = 0; i < runs; i++) {
  await db.execute(sql`UPDATE sightings SET review_state = 'approved' WHERE event_id = ${id} AND id = (
    SELECT id FROM sightings WHERE event_id = ${id} AND review_state = 'pending' ORDER BY id LIMIT 1)`);
  forgetResults();
  const t0 = performance.now();
  await currentResults(id);
  afterChange.push(performance.now() - t0);
  console.log(
    `[bench scale] results first read after one approval, run ${i + 1}: ${afterChange.at(-1)!.toFixed(0)} ms`,
  );
}
forgetResults();

const rows: BenchRow[] = [
  {
    part: "scale",
    figure: `sightings in the database (${held!.length} events of ${PER_EVENT.toLocaleString("en")} each, 16 hash partitions by event)`,
    value: total.toLocaleString("en"),
  },
  {
    part: "scale",
    figure: `queue first page, ${QUEUE_PAGE_SIZE} pending, newest first, one event of 1,000,000 (median of 15)`,
    value: `${first.toFixed(1)} ms`,
    target: "< 100 ms",
    met: first < 100,
  },
  {
    part: "scale",
    figure: `queue deep page (page ${deepPages + 1}, by cursor)`,
    value: `${deepMs.toFixed(1)} ms`,
    target: "< 100 ms",
    met: deepMs < 100,
  },
  {
    part: "scale",
    figure: "queue counts per state (whole event of 1,000,000; median of 5)",
    value: `${counts.toFixed(1)} ms`,
    target: "< 250 ms",
    met: counts < 250,
  },
  {
    part: "scale",
    figure: `results first read after a change, one event of 1,000,000 (median of ${runs})`,
    value: `${median(afterChange).toFixed(0)} ms`,
    target: "< 1000 ms",
    met: median(afterChange) < 1000,
  },
];

if (args.includes("--publish")) {
  const { publishReport } = await import("../server/results/publish");
  const userId = (await db.execute<{ id: string }>(sql`SELECT id FROM users ORDER BY email LIMIT 1`)).rows[0]!.id;
  const t0 = performance.now();
  await publishReport(id, userId, { confirmPending: true });
  const s = (performance.now() - t0) / 1000;
  console.log(`[bench scale] publish: ${s.toFixed(1)} s`);
  rows.push({
    part: "scale",
    figure: "publish a report of one event of 1,000,000 (one run)",
    value: `${s.toFixed(1)} s`,
    target: "< 5 s",
    met: s < 5,
  });
}

for (const r of rows) console.log(`  ${r.figure}: ${r.value}`);
reportRows(rows);
const g = globalThis as { ecotonePool?: { end: () => Promise<void> } };
await g.ecotonePool?.end();
