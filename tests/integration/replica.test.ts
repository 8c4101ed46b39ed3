// Past one machine with PostgreSQL's own tools (issue 18): a streaming replica of the test
// cluster on loopback (pg_basebackup + standby.signal), DATABASE_REPLICA_URL pointing at it,
// and the reads that may lag (results, the live board) served by it while writes stay on the
// primary. Replay paused on the replica shows where a read comes from: the primary has the
// new approval (or a report's withdrawal), the replica's answer does not, until replay resumes.
import { sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startReplica, type Replica } from "../support/replica";

const REPLICA_PORT = Number(process.env.TEST_REPLICA_PORT ?? 54339);
let replica: Replica;

beforeAll(async () => {
  replica = await startReplica(process.env.DATABASE_URL!, REPLICA_PORT);
  // Before anything reads the settings (lib/env.ts caches them on first use).
  process.env.DATABASE_REPLICA_URL = replica.url;
}, 120_000);

afterAll(async () => {
  const { endReadDb } = await import("@/db/client");
  await endReadDb();
  delete process.env.DATABASE_REPLICA_URL;
  await replica?.stop();
});

async function eventually<T>(read: () => Promise<T>, ok: (v: T) => boolean, what: string): Promise<T> {
  for (let i = 0; i < 100; i++) {
    const v = await read();
    if (ok(v)) return v;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`the replica never caught up: ${what}`);
}

describe("a streaming replica for reads that may lag", () => {
  it("serves results and live figures from the replica, and the primary keeps every write", async () => {
    const { getDb, getReadDb } = await import("@/db/client");
    const { liveFigures, loadResultsInput } = await import("@/db/queries/results");
    const s = await import("@/db/schema");
    const { db, makeFixture, sightingValues } = await import("./helpers");

    const inRecovery = async (d: ReturnType<typeof getDb>) =>
      (await d.execute<{ r: boolean }>(sql`SELECT pg_is_in_recovery() AS r`)).rows[0]!.r;
    expect(await inRecovery(getReadDb())).toBe(true);
    expect(await inRecovery(getDb())).toBe(false);
    // Both pools open their connections with JIT off (db/client.ts says why).
    for (const d of [getDb(), getReadDb()])
      expect((await d.execute<{ jit: string }>(sql`SELECT current_setting('jit') AS jit`)).rows[0]!.jit).toBe("off");

    const f = await makeFixture("replica-reads");
    await db()
      .insert(s.sightings)
      .values(sightingValues(f, { count: 3, reviewState: "approved" }));
    const individuals = async () =>
      (await loadResultsInput(f.event.id)).counts.reduce((sum, c) => sum + c.individuals, 0);
    await eventually(individuals, (n) => n === 3, "the first approval");

    // Replay paused: a new approval on the primary is not in the results read from the replica.
    const admin = await replica.admin();
    try {
      await admin.query("SELECT pg_wal_replay_pause()");
      await eventually(
        async () => (await admin.query("SELECT pg_get_wal_replay_pause_state() AS s")).rows[0].s as string,
        (state) => state === "paused",
        "replay pausing",
      );
      await db()
        .insert(s.sightings)
        .values(sightingValues(f, { count: 4, reviewState: "approved" }));
      const onPrimary = await getDb().execute<{ n: number }>(
        sql`SELECT sum(count)::int AS n FROM sightings WHERE event_id = ${f.event.id} AND review_state = 'approved'`,
      );
      expect(onPrimary.rows[0]!.n).toBe(7);
      expect(await individuals()).toBe(3);
      expect((await liveFigures(f.event.id)).backlog.approved).toBe(1);

      await admin.query("SELECT pg_wal_replay_resume()");
      await eventually(individuals, (n) => n === 7, "the second approval after replay resumed");
    } finally {
      await admin.query("SELECT pg_wal_replay_resume()").catch(() => undefined);
      await admin.end();
    }
  });

  it("serves a published report's page from the replica, and a version just published from the primary", async () => {
    const { getReport } = await import("@/db/queries/reports");
    const { publishReport } = await import("@/server/results/publish");
    const { withdrawReport } = await import("@/server/results/withdraw");
    const s = await import("@/db/schema");
    const { db, makeFixture, sightingValues } = await import("./helpers");

    const f = await makeFixture("replica-report");
    await db()
      .insert(s.sightings)
      .values(sightingValues(f, { count: 2, reviewState: "approved" }));
    const admin = await replica.admin();
    try {
      // Published while replay is paused: the replica has not got it, so the page reads the primary.
      await admin.query("SELECT pg_wal_replay_pause()");
      const v1 = await publishReport(f.event.id, f.user.id);
      const fresh = await getReport(f.event.id, v1.version);
      expect(fresh?.id).toBe(v1.id);
      await admin.query("SELECT pg_wal_replay_resume()");
      await eventually(
        async () => (await admin.query("SELECT count(*)::int AS n FROM reports WHERE id = $1", [v1.id])).rows[0].n,
        (n) => n === 1,
        "the report",
      );

      // Withdrawn while replay is paused: the public page (from the replica) does not say so yet.
      await admin.query("SELECT pg_wal_replay_pause()");
      await eventually(
        async () => (await admin.query("SELECT pg_get_wal_replay_pause_state() AS s")).rows[0].s as string,
        (state) => state === "paused",
        "replay pausing",
      );
      await withdrawReport(f.event.id, v1.version, f.user.id, "counted twice");
      expect((await getReport(f.event.id, v1.version, { primary: true }))?.withdrawal?.reason).toBe("counted twice");
      expect((await getReport(f.event.id, v1.version))?.withdrawal).toBeNull();
      await admin.query("SELECT pg_wal_replay_resume()");
      await eventually(
        async () => (await getReport(f.event.id, v1.version))?.withdrawal?.reason,
        (reason) => reason === "counted twice",
        "the withdrawal",
      );
    } finally {
      await admin.query("SELECT pg_wal_replay_resume()").catch(() => undefined);
      await admin.end();
    }
  });
});
