import fs from "node:fs";
import path from "node:path";
import { drizzle } from "drizzle-orm/node-postgres";
import { readMigrationFiles } from "drizzle-orm/migrator";
import { migrate } from "drizzle-orm/node-postgres/migrator";
import { Pool, type PoolClient } from "pg";
import { appGrants, roleOf } from "./roles";

export const migrationsFolder = path.join(process.cwd(), "db/migrations");

// The journal entry that only fills a number (db/migrations/0006_number_left_free.sql).
const NO_OP_TAG = "0006_number_left_free";

type Entry = { tag: string; hash: string; when: number };

function journalEntries(folder: string): Entry[] {
  const journal = JSON.parse(fs.readFileSync(path.join(folder, "meta/_journal.json"), "utf8")) as {
    entries: { tag: string }[];
  };
  // readMigrationFiles is what migrate() reads: same order, same hashes, same `when` values.
  return readMigrationFiles({ migrationsFolder: folder }).map((m, i) => ({
    tag: journal.entries[i]?.tag ?? `entry ${i}`,
    hash: m.hash,
    when: m.folderMillis,
  }));
}

/**
 * Drizzle's migrator applies every journal entry whose `when` is greater than the largest
 * created_at in drizzle.__drizzle_migrations; it never looks at which entries are there.
 * Until the journal was put in order, 0007 and 0008 had `when` values below 0005's, so a
 * database migrated back then records them with those values. Before migrating, each
 * recorded migration (known by the hash of its file) takes its entry's present `when`,
 * the 0006 no-op is recorded where later ones were applied, and an entry that would still
 * be skipped (recorded later ones but not it) stops the upgrade with a message instead.
 */
async function reconcileJournal(client: PoolClient, entries: Entry[]): Promise<void> {
  const table = await client.query("SELECT to_regclass('drizzle.__drizzle_migrations') AS t");
  if (!table.rows[0].t) return; // a fresh database: migrate() applies everything
  await client.query("BEGIN");
  try {
    await client.query("SELECT pg_advisory_xact_lock(hashtext('ecotone migrations'))");
    for (const e of entries) {
      await client.query(
        "UPDATE drizzle.__drizzle_migrations SET created_at = $2 WHERE hash = $1 AND created_at IS DISTINCT FROM $2",
        [e.hash, e.when],
      );
    }
    const { rows } = await client.query<{ hash: string; created_at: string | null }>(
      "SELECT hash, created_at FROM drizzle.__drizzle_migrations",
    );
    const applied = new Set(rows.map((r) => r.hash));
    const last = Math.max(0, ...rows.map((r) => Number(r.created_at ?? 0)));
    const skipped: string[] = [];
    for (const e of entries) {
      if (applied.has(e.hash) || e.when > last) continue;
      if (e.tag === NO_OP_TAG) {
        await client.query("INSERT INTO drizzle.__drizzle_migrations (hash, created_at) VALUES ($1, $2)", [
          e.hash,
          e.when,
        ]);
      } else {
        skipped.push(e.tag);
      }
    }
    if (skipped.length > 0) {
      throw new Error(
        `This database records later migrations but not ${skipped.join(", ")}; migrating would skip ` +
          `${skipped.length === 1 ? "it" : "them"}. Restore a backup taken before the gap, or apply the missing SQL by hand and record it in drizzle.__drizzle_migrations.`,
      );
    }
    await client.query("COMMIT");
  } catch (err) {
    await client.query("ROLLBACK");
    throw err;
  }
}

/**
 * Grants the app's login role what it needs and nothing more (db/roles.ts), as the owner, in
 * one transaction: safe to run after every migration run.
 */
async function grantAppRole(client: PoolClient, appRole: string, url: string): Promise<void> {
  const { rows } = await client.query("SELECT 1 FROM pg_roles WHERE rolname = $1", [appRole]);
  if (rows.length === 0)
    throw new Error(
      `The app's database role "${appRole}" (the user in DATABASE_URL) does not exist. Create it as the superuser: ` +
        `CREATE ROLE "${appRole}" LOGIN PASSWORD '...' (scripts/pg.sh start does this on the demo's cluster).`,
    );
  await client.query("BEGIN");
  try {
    for (const statement of appGrants(appRole, roleOf(url))) await client.query(statement);
    await client.query("COMMIT");
  } catch (err) {
    await client.query("ROLLBACK");
    throw err;
  }
}

// Used by the start and test commands and by the test set-up; not by the running app.
// Use this (npm run db:migrate), not `drizzle-kit migrate`, which skips reconcileJournal.
// `url` connects as the owner role (DATABASE_OWNER_URL); `appRole` is the role the app
// connects as (the user in DATABASE_URL): after migrating it is granted row access to every
// table. The same role for both (one-role set-ups) skips the grants.
export async function runMigrations(url: string, options: { appRole?: string } = {}): Promise<void> {
  const pool = new Pool({ connectionString: url, max: 1 });
  try {
    const client = await pool.connect();
    try {
      await reconcileJournal(client, journalEntries(migrationsFolder));
    } finally {
      client.release();
    }
    await migrate(drizzle(pool), { migrationsFolder });
    if (options.appRole && options.appRole !== roleOf(url)) {
      const grants = await pool.connect();
      try {
        await grantAppRole(grants, options.appRole, url);
      } finally {
        grants.release();
      }
    }
  } finally {
    await pool.end();
  }
}
