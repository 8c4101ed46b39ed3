import pg from "pg";
import { sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { loadInputRecords, loadResultsInput } from "@/db/queries/results";
import { queueCounts, reviewQueue } from "@/db/queries/review";
import { ingestBatch } from "@/db/queries/sync";
import { queueFilters } from "@/lib/review/filters";
import type { SightingRecord } from "@/lib/sync/records";
import { db, makeFixture, syncSession, syncSighting } from "./helpers";

// Sightings and the aggregate tables keyed by event are partitioned by HASH (event_id)
// (migration 0025_sightings_partitioned). The review queue, the results aggregation and a sync
// batch of one event must read one partition of each: every statement they send is recorded
// at the driver, then run again under EXPLAIN ANALYZE (in a transaction rolled back) and the
// partitions its plan actually executed are read from the plan.
const PARTITIONED = [
  "sightings",
  "result_taxon_counts",
  "check_count_stats",
  "result_session_taxa",
  "result_session_zones",
  "result_pending",
];
const PARTITION = new RegExp(`^(${PARTITIONED.join("|")})_p(\\d\\d)$`);

type Fixture = Awaited<ReturnType<typeof makeFixture>>;
type Statement = { text: string; values: unknown[] };
let a: Fixture;
let b: Fixture;
let explainer: pg.Client;

/** The remainder of event_id's hash among the 16 partitions. */
async function partitionOf(eventId: string): Promise<number> {
  const r = await db().execute<{ r: number }>(sql`
    SELECT r FROM generate_series(0, 15) r WHERE satisfies_hash_partition('sightings'::regclass, 16, r, ${eventId}::uuid)`);
  return r.rows[0]!.r;
}

/** Every statement `work` sends through the pg driver, as sent (text and parameters). */
async function recorded(work: () => Promise<unknown>): Promise<Statement[]> {
  const seen: Statement[] = [];
  const proto = pg.Client.prototype as unknown as { query: (...args: unknown[]) => unknown };
  const original = proto.query;
  proto.query = function (this: unknown, ...args: unknown[]) {
    const [first, second] = args;
    if (typeof first === "string") seen.push({ text: first, values: Array.isArray(second) ? second : [] });
    else if (first && typeof first === "object" && "text" in first) {
      const q = first as { text: string; values?: unknown[] };
      seen.push({ text: q.text, values: q.values ?? (Array.isArray(second) ? second : []) });
    }
    return original.apply(this, args);
  };
  try {
    await work();
  } finally {
    proto.query = original;
  }
  return seen.filter(
    (s) =>
      /^\s*(WITH|SELECT|INSERT|UPDATE|DELETE)\b/i.test(s.text) &&
      /\b(sightings|result_\w+|check_count_stats)\b/i.test(s.text),
  );
}

type PlanNode = { "Relation Name"?: string; "Actual Loops"?: number; Plans?: PlanNode[] };

/** The partitions (by table) a statement's plan executed, with the plan as text for the failure message. */
async function scanned(st: Statement): Promise<{ parts: Map<string, Set<string>>; plan: string }> {
  await explainer.query("BEGIN");
  try {
    const r = await explainer.query(`EXPLAIN (ANALYZE, FORMAT JSON) ${st.text}`, st.values);
    const plan = (r.rows[0]["QUERY PLAN"] as { Plan: PlanNode }[])[0]!.Plan;
    const parts = new Map<string, Set<string>>();
    const walk = (n: PlanNode) => {
      const m = n["Relation Name"]?.match(PARTITION);
      if (m && (n["Actual Loops"] ?? 0) > 0) parts.set(m[1]!, (parts.get(m[1]!) ?? new Set()).add(m[2]!));
      for (const c of n.Plans ?? []) walk(c);
    };
    walk(plan);
    const text = await explainer.query(`EXPLAIN ${st.text}`, st.values);
    return { parts, plan: text.rows.map((x) => x["QUERY PLAN"]).join("\n") };
  } finally {
    await explainer.query("ROLLBACK");
  }
}

/** Asserts every recorded statement executed at most one partition of each table, the event's own. */
async function expectOnePartition(statements: Statement[], eventId: string) {
  expect(statements.length).toBeGreaterThan(0);
  const own = String(await partitionOf(eventId)).padStart(2, "0");
  let touched = 0;
  for (const st of statements) {
    const { parts, plan } = await scanned(st);
    for (const [table, set] of parts) {
      touched++;
      expect([...set], `${table} in\n${st.text}\n${plan}`).toEqual([own]);
    }
  }
  expect(touched).toBeGreaterThan(0);
}

const sightingsOf = (f: Fixture, n: number, over: Record<string, unknown> = {}): SightingRecord[] =>
  Array.from({ length: n }, (_, i) => syncSighting(f.taxon.id, { count: 1 + (i % 7), ...over }));
const ingest = (f: Fixture, sightings: SightingRecord[], sessions = [] as ReturnType<typeof syncSession>[]) =>
  ingestBatch({
    userId: f.user.id,
    eventId: f.event.id,
    sessions: sessions.map((record, index) => ({ index, record })),
    sightings: sightings.map((record, index) => ({ index, record })),
    now: new Date("2026-06-21T00:00:00Z"),
  });

beforeAll(async () => {
  a = await makeFixture("part-a");
  // A second event in another partition (16 partitions: a few tries at most).
  for (let i = 0; ; i++) {
    b = await makeFixture(`part-b${i}`);
    if ((await partitionOf(b.event.id)) !== (await partitionOf(a.event.id))) break;
  }
  for (const f of [a, b]) {
    const session = syncSession(f.zone.id);
    await ingest(f, [...sightingsOf(f, 30), ...sightingsOf(f, 5, { sessionId: session.id })], [session]);
    await db().execute(
      sql`UPDATE sightings SET review_state = 'approved' WHERE event_id = ${f.event.id} AND count > 3`,
    );
  }
  await db().execute(sql`ANALYZE sightings`);
  explainer = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await explainer.connect();
});

afterAll(async () => {
  await explainer?.end();
});

describe("sightings partitioned by event", () => {
  it("keeps each event's rows in its own partition", async () => {
    const r = await db().execute<{ part: string; n: number }>(sql`
      SELECT tableoid::regclass::text AS part, count(*)::int AS n FROM sightings
      WHERE event_id IN (${a.event.id}, ${b.event.id}) GROUP BY 1 ORDER BY 1`);
    expect(r.rows).toHaveLength(2);
    expect(r.rows.map((x) => x.n)).toEqual([35, 35]);
  });

  it("reads one partition for the review queue: first page, next page and counts", async () => {
    const scope = { eventId: a.event.id, taxonGroups: [], locale: "en" };
    const filters = queueFilters.parse({});
    const first = await reviewQueue(scope, filters, null, 10);
    expect(first.nextCursor).not.toBeNull();
    const statements = await recorded(async () => {
      await reviewQueue(scope, filters, null, 10);
      await reviewQueue(scope, filters, first.nextCursor, 10);
      await queueCounts(scope, filters);
    });
    await expectOnePartition(statements, a.event.id);
  });

  it("reads one partition of each aggregate table for the results, and of sightings for a report's input", async () => {
    const statements = await recorded(async () => {
      const input = await loadResultsInput(a.event.id, { db: db() });
      expect(input.counts.length).toBeGreaterThan(0);
      expect((await loadInputRecords(a.event.id)).length).toBeGreaterThan(0);
    });
    await expectOnePartition(statements, a.event.id);
  });

  it("writes and reads one partition for a sync batch: new sightings, a resend and a correction", async () => {
    const [kept] = sightingsOf(a, 1);
    await ingest(a, [kept!]);
    const statements = await recorded(async () => {
      const acks = await ingest(a, [
        ...sightingsOf(a, 5),
        kept!,
        { ...kept!, count: 9, correction: { toVersion: 1 } } as SightingRecord,
      ]);
      expect(acks.map((x) => x.outcome)).toEqual([
        "created",
        "created",
        "created",
        "created",
        "created",
        "already_had",
        "updated",
      ]);
    });
    await expectOnePartition(statements, a.event.id);
  });

  it("keeps a resent id idempotent within its event, and an id of another event out of it", async () => {
    const [rec] = sightingsOf(b, 1);
    expect((await ingest(b, [rec!]))[0]!.outcome).toBe("created");
    expect((await ingest(b, [rec!]))[0]!.outcome).toBe("already_had");
    const r = await db().execute<{ n: number }>(sql`SELECT count(*)::int AS n FROM sightings WHERE id = ${rec!.id}`);
    expect(r.rows[0]!.n).toBe(1);
    // Every look-up of the event's sightings is scoped to the event: a's queue never shows b's row.
    const page = await reviewQueue(
      { eventId: a.event.id, taxonGroups: [], locale: "en" },
      queueFilters.parse({}),
      null,
      500,
    );
    expect(page.items.map((i) => i.id)).not.toContain(rec!.id);
  });
});
