import "server-only";
import { drizzle, type NodePgDatabase } from "drizzle-orm/node-postgres";
import { Pool } from "pg";
import { env } from "@/lib/env";
import * as schema from "./schema";

export type Db = NodePgDatabase<typeof schema>;
/** The handle a transaction callback receives. */
export type Tx = Parameters<Parameters<Db["transaction"]>[0]>[0];

// One pool per process, kept on globalThis so Next's development reloads reuse it.
const globalForDb = globalThis as unknown as {
  ecotonePool?: Pool;
  ecotoneDb?: Db;
  ecotoneReplicaPool?: Pool;
  ecotoneReplicaDb?: Db;
};

/**
 * PostgreSQL's JIT compiles a plan when its estimated cost is high; on our aggregates it spent
 * 40–160 ms compiling for queries that run in tens of milliseconds (results' first read,
 * publishing; scripts/bench-notes.md), and no query of the app runs long enough to repay it.
 * Turning it off per connection is common practice for short, many-user queries.
 */
const connectionOptions = "-c jit=off";

export function getDb(): Db {
  if (!globalForDb.ecotoneDb) {
    const pool = new Pool({
      connectionString: env().DATABASE_URL,
      max: env().DATABASE_POOL_MAX,
      options: connectionOptions,
    });
    pool.on("error", (err) => console.error("[db] idle client error", err.message));
    globalForDb.ecotonePool = pool;
    globalForDb.ecotoneDb = drizzle(pool, { schema });
  }
  return globalForDb.ecotoneDb;
}

/**
 * For reads that may lag a moment behind the primary: public report pages and downloads,
 * results and the live board. The streaming replica when DATABASE_REPLICA_URL is set,
 * otherwise the primary itself. Never for a write, nor for a read that decides a write
 * (the review desk, sync, publishing read the primary through getDb).
 */
export function getReadDb(): Db {
  const url = env().DATABASE_REPLICA_URL;
  if (!url) return getDb();
  if (!globalForDb.ecotoneReplicaDb) {
    const pool = new Pool({ connectionString: url, max: env().DATABASE_POOL_MAX, options: connectionOptions });
    pool.on("error", (err) => console.error("[db] idle replica client error", err.message));
    globalForDb.ecotoneReplicaPool = pool;
    globalForDb.ecotoneReplicaDb = drizzle(pool, { schema });
  }
  return globalForDb.ecotoneReplicaDb;
}

/** Closes the replica's pool (tests that start and stop a replica; a server's shutdown). */
export async function endReadDb(): Promise<void> {
  const pool = globalForDb.ecotoneReplicaPool;
  globalForDb.ecotoneReplicaPool = undefined;
  globalForDb.ecotoneReplicaDb = undefined;
  await pool?.end();
}
