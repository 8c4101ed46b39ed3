import { Client } from "pg";
import { runMigrations } from "@/db/migrate";

/** The superuser URL of the same cluster (trust authentication on loopback). */
function adminUrl(url: string): string {
  const u = new URL(url);
  u.username = "postgres";
  u.password = "";
  u.pathname = "/postgres";
  return u.toString();
}

/**
 * Drops and re-creates the database named in `url`, adds PostGIS as the superuser and
 * applies every migration: each test run starts from nothing and never touches the demo.
 */
export async function recreateDatabase(url: string): Promise<void> {
  const name = new URL(url).pathname.slice(1);
  if (!/^ecotone_(test|e2e)\w*$/.test(name)) throw new Error(`Refusing to recreate "${name}": test databases are named ecotone_test* or ecotone_e2e*`);
  const admin = new Client({ connectionString: adminUrl(url) });
  await admin.connect();
  try {
    await admin.query(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
    await admin.query(`CREATE DATABASE "${name}" OWNER ecotone`);
  } finally {
    await admin.end();
  }
  const ext = new Client({ connectionString: adminUrl(url).replace(/\/postgres$/, `/${name}`) });
  await ext.connect();
  try {
    await ext.query("CREATE EXTENSION IF NOT EXISTS postgis");
  } finally {
    await ext.end();
  }
  await runMigrations(url);
}
