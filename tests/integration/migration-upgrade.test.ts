import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { drizzle } from "drizzle-orm/node-postgres";
import { migrate } from "drizzle-orm/node-postgres/migrator";
import { Client, Pool } from "pg";
import { afterAll, describe, expect, it } from "vitest";
import { migrationsFolder, runMigrations } from "@/db/migrate";
import { dropDatabase, recreateEmptyDatabase } from "@/tests/support/test-db";

// Databases of this file, beside the run's own (ecotone_test* names only).
// As the owner role: migrations create and alter tables (db/roles.ts).
const base = process.env.DATABASE_OWNER_URL!;
function dbUrl(suffix: string): string {
  const u = new URL(base);
  u.pathname = `${u.pathname}_${suffix}`;
  return u.toString();
}
const made: string[] = [];
afterAll(async () => {
  for (const url of made) await dropDatabase(url);
});

type JournalEntry = { idx: number; version: string; when: number; tag: string; breakpoints: boolean };
const current = JSON.parse(fs.readFileSync(path.join(migrationsFolder, "meta/_journal.json"), "utf8")) as {
  entries: JournalEntry[];
};

// The journal as it stood before its `when` values were put in order (commit 3e4f16f):
// 0007 and 0008 came after 0005 in the list but carried smaller `when` values.
const oldJournal: [string, number][] = [
  ["0000_postgis", 1796182292238],
  ["0001_data_model", 1796182294758],
  ["0002_append_only", 1796182301268],
  ["0003_accounts", 1796183277579],
  ["0004_membership_log_append_only", 1796183280238],
  ["0005_review_notices", 1796220676342],
  ["0007_results_aggregates", 1796219628061],
  ["0008_zone_multipolygons", 1796218471253],
];

/** A copy of db/migrations whose journal lists only `entries`, for drizzle's own migrator. */
function folderWith(entries: [string, number][]): string {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "ecotone-migrations-"));
  fs.cpSync(migrationsFolder, dir, { recursive: true });
  const journal = {
    version: "7",
    dialect: "postgresql",
    entries: entries.map(([tag, when], idx) => ({ idx, version: "7", when, tag, breakpoints: true })),
  };
  fs.writeFileSync(path.join(dir, "meta/_journal.json"), JSON.stringify(journal, null, 2));
  return dir;
}

/** A fresh database (PostGIS added as the superuser) migrated by drizzle with the given journal. */
async function databaseAt(suffix: string, entries: [string, number][]): Promise<string> {
  const url = dbUrl(suffix);
  made.push(url);
  await recreateEmptyDatabase(url);
  const folder = folderWith(entries);
  const pool = new Pool({ connectionString: url, max: 1 });
  try {
    await migrate(drizzle(pool), { migrationsFolder: folder });
  } finally {
    await pool.end();
    fs.rmSync(folder, { recursive: true, force: true });
  }
  return url;
}

async function withClient<T>(url: string, fn: (c: Client) => Promise<T>): Promise<T> {
  const c = new Client({ connectionString: url });
  await c.connect();
  try {
    return await fn(c);
  } finally {
    await c.end();
  }
}

async function tableExists(c: Client, name: string): Promise<boolean> {
  const r = await c.query("SELECT to_regclass($1) IS NOT NULL AS there", [`public.${name}`]);
  return r.rows[0].there;
}

const ids = {
  org: "0b7d2f5e-0000-4000-8000-000000000001",
  user: "0b7d2f5e-0000-4000-8000-000000000002",
  event: "0b7d2f5e-0000-4000-8000-000000000003",
  zone: "0b7d2f5e-0000-4000-8000-000000000004",
  oak: "0b7d2f5e-0000-4000-8000-000000000005",
  wren: "0b7d2f5e-0000-4000-8000-000000000006",
  session: "0b7d2f5e-0000-4000-8000-000000000007",
  s1: "0b7d2f5e-0000-4000-8000-000000000011",
  s2: "0b7d2f5e-0000-4000-8000-000000000012",
  s3: "0b7d2f5e-0000-4000-8000-000000000013",
  s4: "0b7d2f5e-0000-4000-8000-000000000014",
};

/** Rows written with the schema as it stood at 0005 (plain SQL: the app's code targets the latest). */
async function writeData(c: Client): Promise<void> {
  await c.query("INSERT INTO organisations (id, slug, name) VALUES ($1, 'upgrade-trust', 'Upgrade Trust')", [ids.org]);
  await c.query("INSERT INTO users (id, name, email) VALUES ($1, 'Ada', 'ada@example.org')", [ids.user]);
  await c.query(
    `INSERT INTO events (id, organisation_id, slug, name, status, starts_at, ends_at, time_zone, area)
     VALUES ($1, $2, 'upgrade-day', 'Upgrade day', 'open', '2026-05-01T06:00Z', '2026-05-02T18:00Z', 'Europe/London',
             ST_GeomFromText('POLYGON((0 51, 0.1 51, 0.1 51.1, 0 51.1, 0 51))', 4326))`,
    [ids.event, ids.org],
  );
  await c.query("INSERT INTO event_members (event_id, user_id, role) VALUES ($1, $2, 'organiser')", [
    ids.event,
    ids.user,
  ]);
  await c.query(
    `INSERT INTO zones (id, event_id, name, habitat, geom)
     VALUES ($1, $2, 'Meadow', 'grassland', ST_GeomFromText('POLYGON((0 51, 0.05 51, 0.05 51.05, 0 51.05, 0 51))', 4326))`,
    [ids.zone, ids.event],
  );
  await c.query(
    "INSERT INTO taxa (id, scientific_name, taxon_group) VALUES ($1, 'Quercus robur', 'vascular_plants'), ($2, 'Troglodytes troglodytes', 'birds')",
    [ids.oak, ids.wren],
  );
  await c.query(
    "INSERT INTO count_sessions (id, event_id, user_id, kind, started_at) VALUES ($1, $2, $3, 'walk', '2026-05-01T07:00Z')",
    [ids.session, ids.event, ids.user],
  );
  const sighting = `INSERT INTO sightings (id, event_id, user_id, session_id, taxon_id, count, observed_at, location, accuracy_m, zone_id, review_state)
    VALUES ($1, $2, $3, $4, $5, $6, '2026-05-01T08:00Z', ST_SetSRID(ST_MakePoint(0.01, 51.01), 4326), 5, $7, $8)`;
  await c.query(sighting, [ids.s1, ids.event, ids.user, ids.session, ids.oak, 3, ids.zone, "approved"]);
  await c.query(sighting, [ids.s2, ids.event, ids.user, ids.session, ids.oak, 2, ids.zone, "approved"]);
  await c.query(sighting, [ids.s3, ids.event, ids.user, null, ids.wren, 1, null, "approved"]);
  await c.query(sighting, [ids.s4, ids.event, ids.user, ids.session, ids.wren, 7, ids.zone, "pending"]);
  await c.query(
    "INSERT INTO reviews (sighting_id, reviewer_id, from_state, to_state, reason) VALUES ($1, $2, 'pending', 'approved', 'clear photo')",
    [ids.s1, ids.user],
  );
  await c.query("INSERT INTO review_notices (review_id, volunteer_id) SELECT id, $1 FROM reviews", [ids.user]);
}

async function expectUpgradedData(c: Client): Promise<void> {
  // Everything written before the upgrade is still there.
  expect((await c.query("SELECT name FROM organisations WHERE id = $1", [ids.org])).rows).toEqual([
    { name: "Upgrade Trust" },
  ]);
  expect((await c.query("SELECT name, ST_AsText(area) AS area FROM events WHERE id = $1", [ids.event])).rows).toEqual([
    { name: "Upgrade day", area: "POLYGON((0 51,0.1 51,0.1 51.1,0 51.1,0 51))" },
  ]);
  expect((await c.query("SELECT name, GeometryType(geom) AS kind FROM zones WHERE id = $1", [ids.zone])).rows).toEqual([
    { name: "Meadow", kind: "POLYGON" },
  ]);
  expect(
    (await c.query("SELECT count(*)::int AS n FROM taxa WHERE id IN ($1, $2)", [ids.oak, ids.wren])).rows[0].n,
  ).toBe(2);
  expect(
    (await c.query("SELECT id, review_state FROM sightings WHERE event_id = $1 ORDER BY id", [ids.event])).rows,
  ).toEqual([
    { id: ids.s1, review_state: "approved" },
    { id: ids.s2, review_state: "approved" },
    { id: ids.s3, review_state: "approved" },
    { id: ids.s4, review_state: "pending" },
  ]);
  expect((await c.query("SELECT to_state, reason FROM reviews WHERE sighting_id = $1", [ids.s1])).rows).toEqual([
    { to_state: "approved", reason: "clear photo" },
  ]);
  // 0025 (sightings partitioned by event) gave the decision its sighting's event.
  expect((await c.query("SELECT event_id FROM reviews WHERE sighting_id = $1", [ids.s1])).rows).toEqual([
    { event_id: ids.event },
  ]);
  expect((await c.query("SELECT count(*)::int AS n FROM review_notices")).rows[0].n).toBe(1);

  // 0007 filled its aggregates from the approved sightings already there (the pending one not).
  const noZone = "00000000-0000-0000-0000-000000000000";
  expect(
    (
      await c.query(
        "SELECT zone_key, taxon_id, individuals::int, sightings FROM result_taxon_counts WHERE event_id = $1 ORDER BY taxon_id, zone_key",
        [ids.event],
      )
    ).rows,
  ).toEqual([
    { zone_key: ids.zone, taxon_id: ids.oak, individuals: 5, sightings: 2 },
    { zone_key: noZone, taxon_id: ids.wren, individuals: 1, sightings: 1 },
  ]);
  expect(
    (await c.query("SELECT session_id, taxon_id, sightings FROM result_session_taxa WHERE event_id = $1", [ids.event]))
      .rows,
  ).toEqual([{ session_id: ids.session, taxon_id: ids.oak, sightings: 2 }]);
  expect(
    (await c.query("SELECT count(*)::int AS n FROM result_stamps WHERE event_id = $1", [ids.event])).rows[0].n,
  ).toBe(1);
  // 0023 filled the session's sightings by zone (every state) and the pending figure by (session, volunteer).
  expect(
    (await c.query("SELECT session_id, zone_key, sightings FROM result_session_zones WHERE event_id = $1", [ids.event]))
      .rows,
  ).toEqual([{ session_id: ids.session, zone_key: ids.zone, sightings: 3 }]);
  expect(
    (
      await c.query("SELECT session_key, user_id, pending, returned FROM result_pending WHERE event_id = $1", [
        ids.event,
      ])
    ).rows,
  ).toEqual([{ session_key: ids.session, user_id: ids.user, pending: 1, returned: 0 }]);
  // 0024 gave every taxon a code and filled the session's list of present taxa with them.
  expect(
    (
      await c.query(
        `SELECT l.session_id, l.taxa = (SELECT code::text FROM result_taxon_codes WHERE taxon_id = $2) AS oak_only,
                (SELECT count(*)::int FROM taxa t WHERE NOT EXISTS (SELECT 1 FROM result_taxon_codes x WHERE x.taxon_id = t.id)) AS uncoded
         FROM result_session_lists l WHERE l.event_id = $1`,
        [ids.event, ids.oak],
      )
    ).rows,
  ).toEqual([{ session_id: ids.session, oak_only: true, uncoded: 0 }]);

  // The aggregate triggers work on the upgraded database: approving the pending sighting counts it.
  await c.query("UPDATE sightings SET review_state = 'approved', version = version + 1 WHERE id = $1", [ids.s4]);
  expect(
    (
      await c.query(
        "SELECT individuals::int, sightings FROM result_taxon_counts WHERE event_id = $1 AND zone_key = $2 AND taxon_id = $3",
        [ids.event, ids.zone, ids.wren],
      )
    ).rows,
  ).toEqual([{ individuals: 7, sightings: 1 }]);

  // 0008: zones may now be multipolygons, and still only areas.
  await c.query("UPDATE zones SET geom = ST_Multi(geom) WHERE id = $1", [ids.zone]);
  await expect(
    c.query("UPDATE zones SET geom = ST_SetSRID(ST_MakePoint(0, 51), 4326) WHERE id = $1", [ids.zone]),
  ).rejects.toThrow(/zones_geom_areal/);

  // Reviews stay append-only.
  await expect(c.query("UPDATE reviews SET reason = 'changed' WHERE sighting_id = $1", [ids.s1])).rejects.toThrow(
    /append-only: UPDATE refused/,
  );
  await expect(c.query("DELETE FROM reviews WHERE sighting_id = $1", [ids.s1])).rejects.toThrow(
    /append-only: DELETE refused/,
  );
}

async function recorded(c: Client): Promise<number[]> {
  const r = await c.query("SELECT created_at FROM drizzle.__drizzle_migrations ORDER BY id");
  return r.rows.map((row) => Number(row.created_at));
}

const upTo = (tag: string) => current.entries.slice(0, current.entries.findIndex((e) => e.tag === tag) + 1);

describe("upgrading an existing database with runMigrations", () => {
  it("keeps every `when` in the journal increasing and its numbers without gaps", () => {
    current.entries.forEach((e, i) => {
      expect(e.idx).toBe(i);
      expect(e.tag.slice(0, 4)).toBe(String(i).padStart(4, "0"));
      if (i > 0) expect(e.when).toBeGreaterThan(current.entries[i - 1]!.when);
    });
  });

  it("brings a database at 0005 to the latest with its data, aggregates and append-only reviews", async () => {
    const url = await databaseAt(
      "at5",
      upTo("0005_review_notices").map((e) => [e.tag, e.when]),
    );
    await withClient(url, async (c) => {
      expect(await tableExists(c, "result_taxon_counts")).toBe(false);
      await writeData(c);
    });
    await runMigrations(url);
    await withClient(url, async (c) => {
      expect(await recorded(c)).toEqual(current.entries.map((e) => e.when));
      await expectUpgradedData(c);
    });
  });

  it("gives 0007 and 0008 to a database migrated to 0005 with the old, unordered journal", async () => {
    const url = await databaseAt("old5", oldJournal.slice(0, 6));
    await withClient(url, writeData);
    // What the old journal itself did: 0007 and 0008 skipped, as their `when` is below 0005's.
    const stale = folderWith(oldJournal);
    const pool = new Pool({ connectionString: url, max: 1 });
    await migrate(drizzle(pool), { migrationsFolder: stale }).finally(() => pool.end());
    fs.rmSync(stale, { recursive: true, force: true });
    await withClient(url, async (c) => expect(await tableExists(c, "result_taxon_counts")).toBe(false));

    await runMigrations(url);
    await withClient(url, async (c) => {
      expect(await tableExists(c, "result_taxon_counts")).toBe(true);
      expect(await recorded(c)).toEqual(current.entries.map((e) => e.when));
      await expectUpgradedData(c);
    });
  });

  it("re-applies nothing on a database fully migrated with the old journal, and records the 0006 no-op", async () => {
    const url = await databaseAt("oldfull", oldJournal);
    await withClient(url, writeData);
    const before = await withClient(url, (c) => c.query("SELECT * FROM result_taxon_counts ORDER BY 1, 2, 3"));
    await runMigrations(url);
    await runMigrations(url); // and again: nothing changes a second time
    await withClient(url, async (c) => {
      // One row per journal entry, each with its entry's `when`: 0006 added, none applied twice.
      expect((await recorded(c)).sort()).toEqual(current.entries.map((e) => e.when));
      // A second run of 0007 would have failed on CREATE TABLE or doubled these counts.
      expect((await c.query("SELECT * FROM result_taxon_counts ORDER BY 1, 2, 3")).rows).toEqual(before.rows);
      await expectUpgradedData(c);
    });
  });

  it("refuses, naming the migration, a database that records later migrations but not an earlier one", async () => {
    // A database that has 0007 but never had 0005 (the state of a branch before the merge).
    const url = await databaseAt("gap", [...oldJournal.slice(0, 5), ["0007_results_aggregates", 1796219628061]]);
    await expect(runMigrations(url)).rejects.toThrow(/not 0005_review_notices; migrating would skip it/);
    await withClient(url, async (c) => expect(await tableExists(c, "review_notices")).toBe(false));
  });
});
