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

function testDatabaseName(url: string): string {
  const name = new URL(url).pathname.slice(1);
  if (!/^ecotone_(test|e2e)\w*$/.test(name))
    throw new Error(`Refusing to recreate or drop "${name}": test databases are named ecotone_test* or ecotone_e2e*`);
  return name;
}

/**
 * Drops and re-creates the database named in `url` and adds PostGIS as the superuser,
 * without migrations (the migration-upgrade test applies its own).
 */
export async function recreateEmptyDatabase(url: string): Promise<void> {
  const name = testDatabaseName(url);
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
}

/** Drops a test database (ecotone_test* or ecotone_e2e* only). */
export async function dropDatabase(url: string): Promise<void> {
  const name = testDatabaseName(url);
  const admin = new Client({ connectionString: adminUrl(url) });
  await admin.connect();
  try {
    await admin.query(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
  } finally {
    await admin.end();
  }
}

/**
 * Drops and re-creates the database named in `url`, adds PostGIS as the superuser and
 * applies every migration: each test run starts from nothing and never touches the demo.
 */
export async function recreateDatabase(url: string): Promise<void> {
  await recreateEmptyDatabase(url);
  await runMigrations(url);
}
