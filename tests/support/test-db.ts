import { Client } from "pg";
import { runMigrations } from "@/db/migrate";
import { APP_ROLE, OWNER_ROLE, urlAsRole } from "@/db/roles";

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
 * The owner and app roles (db/roles.ts), created if missing, as scripts/pg.sh does: the shared
 * cluster of a checkout that predates them gains them here. Two runs may race: a duplicate is fine.
 */
async function ensureRoles(admin: Client): Promise<void> {
  for (const [role, extra] of [
    [OWNER_ROLE, "CREATEDB"],
    [APP_ROLE, "NOCREATEDB NOCREATEROLE"],
  ] as const) {
    const { rows } = await admin.query("SELECT 1 FROM pg_roles WHERE rolname = $1", [role]);
    if (rows.length > 0) continue;
    await admin.query(`CREATE ROLE "${role}" LOGIN PASSWORD '${role}' ${extra}`).catch((err: { code?: string }) => {
      if (err.code !== "42710" && err.code !== "23505") throw err;
    });
  }
}

/** The test database named in `url` as the owner role (migrations) and as the app's role. */
export function testUrls(url: string): { owner: string; app: string } {
  return { owner: urlAsRole(url, OWNER_ROLE), app: urlAsRole(url, APP_ROLE) };
}

/**
 * Drops and re-creates the database named in `url` (owned by the owner role) and adds PostGIS as the superuser,
 * without migrations (the migration-upgrade test applies its own).
 */
export async function recreateEmptyDatabase(url: string): Promise<void> {
  const name = testDatabaseName(url);
  const admin = new Client({ connectionString: adminUrl(url) });
  await admin.connect();
  try {
    await ensureRoles(admin);
    await admin.query(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
    await admin.query(`CREATE DATABASE "${name}" OWNER ${OWNER_ROLE}`);
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
 * applies every migration as the owner role, granting the app role its row access: each
 * test run starts from nothing and never touches the demo. (`url` names the database; the
 * roles are always the owner and app roles of db/roles.ts.)
 */
export async function recreateDatabase(url: string): Promise<void> {
  await recreateEmptyDatabase(url);
  await runMigrations(testUrls(url).owner, { appRole: APP_ROLE });
}
