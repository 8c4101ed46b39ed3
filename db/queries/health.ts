import "server-only";
import { sql } from "drizzle-orm";
import { getDb } from "../client";

/** Round trip to PostgreSQL; reports PostGIS too, since every record has a geometry. */
export async function checkDatabase(): Promise<{ ok: true; latencyMs: number; postgis: string } | { ok: false }> {
  const started = performance.now();
  try {
    const result = await getDb().execute<{ postgis: string }>(sql`SELECT postgis_lib_version() AS postgis`);
    return { ok: true, latencyMs: Math.round(performance.now() - started), postgis: result.rows[0]?.postgis ?? "" };
  } catch (err) {
    console.error("[health] database check failed:", (err as Error).message);
    return { ok: false };
  }
}
