import { and, eq, inArray, sql } from "drizzle-orm";
import { Client } from "pg";
import { beforeAll, describe, expect, it } from "vitest";
import {
  directCountQuartiles,
  GROUP_THRESHOLDS,
  HIGH_COUNT_FLOOR,
  HIGH_COUNT_MIN_RECORDS,
  keptCountQuartiles,
  refreshCheckMarks,
} from "@/db/queries/check-marks";
import { ingestBatch } from "@/db/queries/sync";
import * as s from "@/db/schema";
import { sightingRecord } from "@/lib/sync/records";
import { db, lonLat, makeFixture, sightingValues } from "./helpers";
import { seededRandom } from "@/db/seed/random";

// The unusual-count check mark reads its per-taxon quartiles from check_count_stats, kept by
// triggers on sightings (issue 18), instead of sorting every sighting of the taxon on each batch.
// These tests hold the kept figures to the direct computation (count and percentile_cont over
// the non-rejected sightings) after records arrive through sync and by other connections, are
// corrected, rejected, returned, re-identified and deleted, and hold the marks to the rule.
type Fixture = Awaited<ReturnType<typeof makeFixture>>;
let f: Fixture;
let taxonB: string;

const random = seededRandom(18);
// Right-skewed counts with ties (most values repeat), as a count day brings them.
const someCount = () => 1 + Math.floor(-Math.log(1 - random()) * 6);
let minute = 0;
/** Each record 11 minutes from the last and away on the map, so none is a possible duplicate of another. */
const apart = () => {
  minute += 1;
  return {
    observedAt: new Date(Date.parse("2026-06-20T06:00:00Z") + minute * 11 * 60_000),
    location: lonLat(0.05 + (minute % 40) * 0.02, 0.05 + Math.floor(minute / 40) * 0.02),
  };
};

async function expectKeptEqualsDirect() {
  for (const taxon of [f.taxon.id, taxonB]) {
    const direct = await directCountQuartiles(db(), f.event.id, taxon);
    const kept = await keptCountQuartiles(db(), f.event.id, taxon);
    // The same numbers, bit for bit: not an estimate.
    expect(kept).toEqual(direct);
  }
}

async function idsOf(taxonId: string, state: "pending" | "approved" | "returned" | "rejected", limit: number) {
  return (
    await db()
      .select({ id: s.sightings.id })
      .from(s.sightings)
      .where(
        and(eq(s.sightings.eventId, f.event.id), eq(s.sightings.taxonId, taxonId), eq(s.sightings.reviewState, state)),
      )
      .orderBy(s.sightings.id)
      .limit(limit)
  ).map((r) => r.id);
}

beforeAll(async () => {
  f = await makeFixture("countstats");
  const [b] = await db()
    .insert(s.taxa)
    .values({ scientificName: "Testus countstats alter", taxonGroup: "mammals" })
    .returning();
  taxonB = b!.id;
  await db()
    .insert(s.eventSpecies)
    .values([
      { eventId: f.event.id, taxonId: f.taxon.id },
      { eventId: f.event.id, taxonId: taxonB },
    ]);
});

describe("per-taxon count statistics for the unusual-count mark", () => {
  it("start empty: no records, no quartiles", async () => {
    expect(await keptCountQuartiles(db(), f.event.id, f.taxon.id)).toEqual({ n: 0, q1: null, q3: null });
    await expectKeptEqualsDirect();
  });

  it("follow records sent through sync and stored by other connections at once", async () => {
    const batch = Array.from({ length: 60 }, (_, i) => {
      const a = apart();
      return {
        index: i,
        record: sightingRecord.parse({
          id: crypto.randomUUID(),
          sessionId: null,
          taxonId: i % 3 === 0 ? taxonB : f.taxon.id,
          description: "",
          count: someCount(),
          countIsEstimate: false,
          observedAt: a.observedAt.toISOString(),
          latitude: a.location.latitude,
          longitude: a.location.longitude,
          accuracyM: 5,
          zoneId: null,
          notes: "",
          photoIds: [],
        }),
      };
    });
    const acks = await ingestBatch({
      userId: f.user.id,
      eventId: f.event.id,
      sessions: [],
      sightings: batch,
      now: new Date("2026-06-22T00:00:00Z"),
    });
    expect(acks.every((a) => a.outcome === "created")).toBe(true);
    // Resent, the batch changes nothing (already_had) and neither do the statistics.
    const before = await keptCountQuartiles(db(), f.event.id, f.taxon.id);
    const again = await ingestBatch({
      userId: f.user.id,
      eventId: f.event.id,
      sessions: [],
      sightings: batch,
      now: new Date("2026-06-22T00:00:00Z"),
    });
    expect(again.every((a) => a.outcome === "already_had")).toBe(true);
    expect(await keptCountQuartiles(db(), f.event.id, f.taxon.id)).toEqual(before);

    // Three more connections (each its own backend, so its own shard) insert at the same time.
    const url = process.env.DATABASE_URL!;
    const clients = await Promise.all(
      [0, 1, 2].map(async () => {
        const c = new Client({ connectionString: url });
        await c.connect();
        return c;
      }),
    );
    try {
      await Promise.all(
        clients.map(async (c, k) => {
          for (let round = 0; round < 5; round++) {
            const rows = Array.from({ length: 8 }, (_, i) =>
              sightingValues(f, { taxonId: (i + k) % 2 ? taxonB : f.taxon.id, count: someCount(), ...apart() }),
            );
            await c.query(
              `INSERT INTO sightings (id, event_id, user_id, taxon_id, count, observed_at, location, accuracy_m)
               SELECT id, $1, $2, taxon, cnt, at, ST_SetSRID(ST_MakePoint(lon, lat), 4326), 5
               FROM unnest($3::uuid[], $4::uuid[], $5::int[], $6::timestamptz[], $7::float8[], $8::float8[]) AS r(id, taxon, cnt, at, lon, lat)`,
              [
                f.event.id,
                f.user.id,
                rows.map((r) => r.id),
                rows.map((r) => r.taxonId),
                rows.map((r) => r.count),
                rows.map((r) => r.observedAt.toISOString()),
                rows.map((r) => r.location.longitude),
                rows.map((r) => r.location.latitude),
              ],
            );
          }
        }),
      );
    } finally {
      await Promise.all(clients.map((c) => c.end()));
    }
    const { n } = await keptCountQuartiles(db(), f.event.id, f.taxon.id);
    expect(n).toBeGreaterThan(HIGH_COUNT_MIN_RECORDS);
    await expectKeptEqualsDirect();
  });

  it("let two open transactions record the same taxon and count without waiting on each other", async () => {
    const url = process.env.DATABASE_URL!;
    // Two volunteers' phones (one phone syncs its batches one after another).
    const [other] = await db()
      .insert(s.users)
      .values({ email: "count-stats-second@example.org", name: "Second volunteer" })
      .returning();
    const a = new Client({ connectionString: url });
    const b = new Client({ connectionString: url });
    await Promise.all([a.connect(), b.connect()]);
    const insert = (c: Client, userId: string) => {
      const row = sightingValues(f, { count: 3, ...apart() });
      return c.query(
        `INSERT INTO sightings (id, event_id, user_id, taxon_id, count, observed_at, location, accuracy_m)
         VALUES ($1, $2, $3, $4, 3, $5, ST_SetSRID(ST_MakePoint($6, $7), 4326), 5)`,
        [row.id, f.event.id, userId, f.taxon.id, row.observedAt.toISOString(), 0.3, 0.3],
      );
    };
    try {
      await a.query("BEGIN");
      await insert(a, f.user.id);
      // b would wait for a's commit on a shared row; with its own shard it does not.
      await b.query("BEGIN");
      await b.query("SET LOCAL lock_timeout = '2s'");
      await insert(b, other!.id);
      await b.query("COMMIT");
      await a.query("COMMIT");
    } finally {
      await Promise.all([a.end(), b.end()]);
    }
    await expectKeptEqualsDirect();
  });

  it("follow rejections, returns and approvals (rejected records leave the statistics)", async () => {
    const a = await idsOf(f.taxon.id, "pending", 12);
    await db()
      .update(s.sightings)
      .set({ reviewState: "rejected" })
      .where(inArray(s.sightings.id, a.slice(0, 6)));
    await db()
      .update(s.sightings)
      .set({ reviewState: "returned" })
      .where(inArray(s.sightings.id, a.slice(6, 9)));
    await db()
      .update(s.sightings)
      .set({ reviewState: "approved" })
      .where(inArray(s.sightings.id, a.slice(9)));
    await expectKeptEqualsDirect();
    // A rejection undone comes back.
    await db()
      .update(s.sightings)
      .set({ reviewState: "pending" })
      .where(inArray(s.sightings.id, a.slice(0, 2)));
    await expectKeptEqualsDirect();
  });

  it("follow corrections of the count and of the taxon, and check-mark updates change nothing", async () => {
    const a = await idsOf(f.taxon.id, "pending", 10);
    for (const [i, id] of a.entries())
      await db()
        .update(s.sightings)
        .set(i % 2 ? { count: someCount() * 3 } : { taxonId: taxonB })
        .where(eq(s.sightings.id, id));
    // A rejected record corrected stays out.
    const [rejected] = await idsOf(f.taxon.id, "rejected", 1);
    await db().update(s.sightings).set({ count: 400 }).where(eq(s.sightings.id, rejected!));
    const before = await keptCountQuartiles(db(), f.event.id, f.taxon.id);
    await refreshCheckMarks(db(), a);
    expect(await keptCountQuartiles(db(), f.event.id, f.taxon.id)).toEqual(before);
    await expectKeptEqualsDirect();
  });

  it("follow deletions", async () => {
    const a = [...(await idsOf(taxonB, "pending", 5)), ...(await idsOf(f.taxon.id, "rejected", 2))];
    await db().delete(s.sightings).where(inArray(s.sightings.id, a));
    await expectKeptEqualsDirect();
    const stored = await db().execute<{ n: string }>(
      sql`SELECT sum(n) AS n FROM check_count_stats WHERE event_id = ${f.event.id}`,
    );
    const counted = await db().execute<{ n: string }>(
      sql`SELECT count(*) AS n FROM sightings WHERE event_id = ${f.event.id} AND review_state <> 'rejected' AND taxon_id IS NOT NULL`,
    );
    expect(Number(stored.rows[0]!.n)).toBe(Number(counted.rows[0]!.n));
  });

  it("equal percentile_cont for every size of sample, ties and all (each fraction of p·(n−1))", async () => {
    const extra = await db()
      .insert(s.taxa)
      .values(
        Array.from({ length: 14 }, (_, i) => ({
          scientificName: `Testus countstats ${i}`,
          taxonGroup: "birds" as const,
        })),
      )
      .returning();
    for (const [i, t] of extra.entries()) {
      const size = i + 1;
      await db()
        .insert(s.sightings)
        .values(
          Array.from({ length: size }, () => sightingValues(f, { taxonId: t.id, count: someCount(), ...apart() })),
        );
      expect([size, await keptCountQuartiles(db(), f.event.id, t.id)]).toEqual([
        size,
        await directCountQuartiles(db(), f.event.id, t.id),
      ]);
    }
  });

  it("give the marks the rule gives with the direct quartiles, at and around the far-out fence", async () => {
    for (const taxon of [f.taxon.id, taxonB]) {
      const { n, q1, q3 } = await directCountQuartiles(db(), f.event.id, taxon);
      expect(n).toBeGreaterThanOrEqual(HIGH_COUNT_MIN_RECORDS);
      const fence = Math.max(HIGH_COUNT_FLOOR, Math.exp(q3! + 3 * (q3! - q1!)));
      // Counts just under, at and over the fence; each new record moves the quartiles a little,
      // so the rule is checked against the quartiles with the record in (as the pass reads them).
      for (const count of [Math.floor(fence) - 1, Math.floor(fence), Math.floor(fence) + 1, Math.ceil(fence) + 40]) {
        const row = sightingValues(f, { taxonId: taxon, count: Math.max(1, count), ...apart() });
        await db().insert(s.sightings).values(row);
        await refreshCheckMarks(db(), [row.id]);
        const now = await directCountQuartiles(db(), f.event.id, taxon);
        const expected =
          now.n >= HIGH_COUNT_MIN_RECORDS
            ? row.count > Math.max(HIGH_COUNT_FLOOR, Math.exp(now.q3! + 3 * (now.q3! - now.q1!)))
            : row.count > GROUP_THRESHOLDS.birds;
        const [stored] = await db()
          .select({ marks: s.sightings.checkMarks })
          .from(s.sightings)
          .where(eq(s.sightings.id, row.id));
        expect([count, stored!.marks.includes("high_count")]).toEqual([count, expected]);
      }
    }
    await expectKeptEqualsDirect();
  });
});
