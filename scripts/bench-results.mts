// Benchmark of the results handler path on an event of 1,000,000 sightings: seeds that
// event (once; --reseed to start again; a kept database takes the migrations added since)
// in its own database on the local cluster (ecotone_test_bench, with ECOTONE_TEST_SUFFIX
// appended when set), then
// times what GET /api/events/:id/results does: the aggregate queries (migration 0007)
// plus lib/diversity, and the JSON answer. For comparison it also times the plain GROUP
// BY over every approved sighting that the aggregate tables replace.
//
//   npx tsx scripts/bench-results.mts [--reseed] [--runs=N]
//
// The db layer imports "server-only", which only resolves outside React Server Components
// under the "react-server" export condition: the script re-runs itself with it.
import { spawnSync } from "node:child_process";
import { fileURLToPath } from "node:url";

if (!process.execArgv.some((a) => a.includes("react-server"))) {
  const { env } = await import("../lib/env");
  const u = new URL(env().DATABASE_URL);
  // ECOTONE_TEST_SUFFIX keeps two checkouts' databases apart, as in the other parts.
  u.pathname = `/ecotone_test_bench${process.env.ECOTONE_TEST_SUFFIX ?? ""}`;
  // ECOTONE_PG_PORT moves the cluster, as for the other parts of the bench.
  if (process.env.ECOTONE_PG_PORT) u.port = process.env.ECOTONE_PG_PORT;
  const r = spawnSync(
    process.execPath,
    ["--conditions=react-server", "--import", "tsx", fileURLToPath(import.meta.url), ...process.argv.slice(2)],
    {
      stdio: "inherit",
      env: { ...process.env, DATABASE_URL: u.toString() },
    },
  );
  process.exit(r.status ?? 1);
}

const { sql } = await import("drizzle-orm");
const { getDb } = await import("../db/client");
const { currentResults, forgetResults } = await import("../server/results/current");
const { env } = await import("../lib/env");
const { recreateDatabase } = await import("../tests/support/test-db");
const { reportRows } = await import("./bench-report");

const SIGHTINGS = 1_000_000;
const PER_SESSION = 25;
const TAXA = 300;
const VOLUNTEERS = 2000;
const args = process.argv.slice(2);
const runs = Number(args.find((a) => a.startsWith("--runs="))?.split("=")[1] ?? 5);
const url = env().DATABASE_URL;

/** Ends db/client.ts's pool (kept on globalThis), so the next getDb() opens a new one. */
async function closePool(): Promise<void> {
  const g = globalThis as { ecotonePool?: { end: () => Promise<void> }; ecotoneDb?: unknown };
  await g.ecotonePool?.end();
  g.ecotonePool = undefined;
  g.ecotoneDb = undefined;
}

async function eventId(): Promise<string | null> {
  try {
    const r = await getDb().execute<{ id: string; n: number }>(sql`
      SELECT e.id, (SELECT count(*) FROM sightings s WHERE s.event_id = e.id)::int AS n FROM events e WHERE e.slug = 'bench-million'`);
    const current = await getDb().execute<{ t: string | null }>(sql`SELECT to_regclass('result_stamps')::text AS t`);
    return r.rows[0]?.n === SIGHTINGS && current.rows[0]?.t ? r.rows[0].id : null;
  } catch {
    return null;
  }
}

async function seed(): Promise<string> {
  console.log(`seeding ${SIGHTINGS.toLocaleString("en")} sightings into ${url.replace(/:[^:@/]+@/, ":***@")} …`);
  await closePool();
  await recreateDatabase(url);
  const db = getDb();
  const t0 = Date.now();
  await db.execute(sql`INSERT INTO organisations (slug, name) VALUES ('bench', 'Bench Trust')`);
  await db.execute(
    sql`INSERT INTO users (email, name) SELECT 'bench' || g || '@example.org', 'Bench ' || g FROM generate_series(1, ${VOLUNTEERS}::int) g`,
  );
  const [ev] = (
    await db.execute<{ id: string }>(sql`
    INSERT INTO events (organisation_id, slug, name, status, starts_at, ends_at, time_zone)
    SELECT id, 'bench-million', 'Bench million', 'open', '2026-04-01T00:00:00Z', '2026-10-01T00:00:00Z', 'Europe/London' FROM organisations RETURNING id`)
  ).rows;
  const id = ev!.id;
  await db.execute(sql`
    INSERT INTO zones (event_id, name, habitat, geom)
    SELECT ${id}, 'Zone ' || g, (ARRAY['interior','edge','interior','edge'])[g]::habitat_kind,
      ST_SetSRID(ST_MakeEnvelope(-1.82 + g * 0.005, 52.10, -1.815 + g * 0.005, 52.11), 4326) FROM generate_series(1, 4) g`);
  await db.execute(sql`
    INSERT INTO taxa (scientific_name, taxon_group) SELECT 'Benchus species' || g, 'insects' FROM generate_series(1, ${TAXA}::int) g`);
  // Sessions: 25 sightings each, four in five "all species noted", spread over the zones and volunteers.
  await db.execute(sql`
    INSERT INTO count_sessions (id, event_id, user_id, zone_id, kind, started_at, ended_at, all_species_noted)
    SELECT gen_random_uuid(), ${id}, (SELECT id FROM users ORDER BY email OFFSET (g % ${VOLUNTEERS}::int) LIMIT 1),
      (SELECT id FROM zones WHERE event_id = ${id} ORDER BY name OFFSET (g % 4) LIMIT 1), 'timed_count',
      '2026-04-01T06:00:00Z'::timestamptz + g * interval '6 minutes', '2026-04-01T06:20:00Z'::timestamptz + g * interval '6 minutes', g % 5 <> 0
    FROM generate_series(0, ${SIGHTINGS / PER_SESSION - 1}::int) g`);
  await db.execute(
    sql`CREATE TEMP TABLE bench_sessions AS SELECT row_number() OVER (ORDER BY started_at) - 1 AS k, id, user_id, zone_id, started_at FROM count_sessions`,
  );
  await db.execute(
    sql`CREATE TEMP TABLE bench_taxa AS SELECT row_number() OVER (ORDER BY scientific_name) - 1 AS k, id FROM taxa`,
  );
  // Sightings in batches of 100,000: a skewed (cubed uniform) choice of taxon, 70% approved.
  for (let start = 0; start < SIGHTINGS; start += 100_000) {
    await db.execute(sql`
      INSERT INTO sightings (id, event_id, user_id, session_id, taxon_id, count, observed_at, location, accuracy_m, zone_id, review_state)
      SELECT gen_random_uuid(), ${id}, s.user_id, s.id, t.id, 1 + floor(random() * random() * 12)::int, s.started_at + random() * interval '20 minutes',
        ST_SetSRID(ST_MakePoint(-1.82 + random() * 0.02, 52.10 + random() * 0.01), 4326), 10, s.zone_id,
        (CASE WHEN random() < 0.7 THEN 'approved' WHEN random() < 0.6 THEN 'pending' ELSE 'rejected' END)::review_state
      FROM (SELECT g, floor(${TAXA}::int * power(random(), 3))::int AS tk FROM generate_series(${start}::int, ${start + 99_999}::int) g OFFSET 0) x
      JOIN bench_sessions s ON s.k = x.g / ${PER_SESSION}::int
      JOIN bench_taxa t ON t.k = x.tk`);
    process.stdout.write(
      `  ${(start + 100_000).toLocaleString("en")} sightings (${Math.round((Date.now() - t0) / 1000)} s)\n`,
    );
  }
  await db.execute(sql`ANALYZE`);
  return id;
}

/** A kept database takes the migrations added since it was seeded (only those; its data stay). */
async function migrateKept(found: string): Promise<string> {
  const { runMigrations } = await import("../db/migrate");
  const { APP_ROLE } = await import("../db/roles");
  const { testUrls } = await import("../tests/support/test-db");
  await runMigrations(testUrls(url).owner, { appRole: APP_ROLE });
  return found;
}

const kept = args.includes("--reseed") ? null : await eventId();
const id = kept ? await migrateKept(kept) : await seed();
const db = getDb();
const [facts] = (
  await db.execute<{ sightings: number; approved: number; pairs: number; complete: number }>(sql`
  SELECT (SELECT count(*) FROM sightings WHERE event_id = ${id})::int AS sightings,
         (SELECT count(*) FROM sightings WHERE event_id = ${id} AND review_state = 'approved')::int AS approved,
         (SELECT count(*) FROM result_session_taxa WHERE event_id = ${id})::int AS pairs,
         (SELECT count(*) FROM count_sessions WHERE event_id = ${id} AND all_species_noted)::int AS complete`)
).rows;
console.log(
  `event: ${facts!.sightings} sightings, ${facts!.approved} approved, ${facts!.complete} complete count sessions, ${facts!.pairs} (session, taxon) presences`,
);

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
// The handler's work: currentResults() then the JSON answer (already serialised with the results).
async function handlerPath(): Promise<{ ms: number; bytes: number }> {
  const t0 = performance.now();
  const { json } = await currentResults(id);
  return { ms: performance.now() - t0, bytes: json.length };
}
const cold: number[] = [];
const warm: number[] = [];
const afterChange: number[] = [];
let bytes = 0;
forgetResults();
await handlerPath(); // warm-up of the pool and the JIT
for (let i = 0; i < runs; i++) {
  forgetResults();
  const c = await handlerPath();
  const w = await handlerPath();
  cold.push(c.ms);
  warm.push(w.ms);
  bytes = c.bytes;
  // A coordinator approves one more sighting: the next read computes again.
  await db.execute(sql`UPDATE sightings SET review_state = 'approved' WHERE id = (
    SELECT id FROM sightings WHERE event_id = ${id} AND review_state = 'pending' ORDER BY id LIMIT 1)`);
  const a = await handlerPath();
  afterChange.push(a.ms);
  console.log(
    `run ${i + 1}: cold ${c.ms.toFixed(0)} ms, unchanged since last read ${w.ms.toFixed(0)} ms, after one approval ${a.ms.toFixed(0)} ms`,
  );
}
// Where the first read's time goes: the aggregate queries, then lib/diversity (without the
// bootstraps the worker adds later), each timed alone.
{
  const { loadResultsInput, pendingCounts, sessionZonesSql } = await import("../db/queries/results");
  const { computeResults } = await import("../lib/results/compute");
  const { forgetBootstraps } = await import("../lib/results/compare");
  forgetResults(); // no worker from the runs above competes for the cores
  const load: number[] = [];
  const compute: number[] = [];
  const zonesOfSessions: number[] = [];
  const pendingQuery: number[] = [];
  for (let i = 0; i < 3; i++) {
    const z0 = performance.now();
    await db.execute(sql`WITH sz AS (${sessionZonesSql(id)}) SELECT count(zone_id) FROM sz`);
    zonesOfSessions.push(performance.now() - z0);
    const p0 = performance.now();
    await pendingCounts(id);
    pendingQuery.push(performance.now() - p0);
    const l0 = performance.now();
    const input = await loadResultsInput(id);
    load.push(performance.now() - l0);
    forgetBootstraps(); // no replicates kept from the run before: each computation is a first one
    const c0 = performance.now();
    computeResults(input, { bands: false });
    compute.push(performance.now() - c0);
  }
  console.log(
    `first read, in parts (median of 3): aggregate queries ${median(load).toFixed(0)} ms (run in parallel; alone: the zone of each complete session ${median(zonesOfSessions).toFixed(0)} ms, pending counts ${median(pendingQuery).toFixed(0)} ms), computeResults without the deferred bootstraps ${median(compute).toFixed(0)} ms`,
  );
}
const g0 = performance.now();
await db.execute(
  sql`SELECT zone_id, taxon_id, sum(count) FROM sightings WHERE event_id = ${id} AND review_state = 'approved' AND taxon_id IS NOT NULL GROUP BY 1, 2`,
);
const groupBy = performance.now() - g0;
console.log(
  `plain GROUP BY over the approved sightings (replaced by the aggregates): ${groupBy.toFixed(0)} ms; answer ${(bytes / 1024).toFixed(0)} KiB`,
);
await closePool();

const w = median(warm);
const c = median(cold);
reportRows([
  {
    part: "results",
    figure: `results handler path, ${facts!.sightings.toLocaleString("en")} sightings, nothing changed since the last read (median of ${runs})`,
    value: `${w.toFixed(0)} ms`,
    target: "< 1000 ms",
    met: w < 1000,
  },
  {
    part: "results",
    figure: "results handler path, first read after a change (aggregate queries + lib/diversity)",
    value: `${c.toFixed(0)} ms`,
    target: "< 1000 ms",
    met: c < 1000,
  },
  {
    part: "results",
    figure: "after one more approval (trigger + recompute)",
    value: `${median(afterChange).toFixed(0)} ms`,
  },
  { part: "results", figure: "plain GROUP BY it replaces (one run, counts only)", value: `${groupBy.toFixed(0)} ms` },
]);
