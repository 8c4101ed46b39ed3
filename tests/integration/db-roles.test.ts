import { Client } from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { runMigrations } from "@/db/migrate";
import { APP_ROLE, OWNER_ROLE, roleOf } from "@/db/roles";
import * as schema from "@/db/schema";
import { dropDatabase, recreateEmptyDatabase, testUrls } from "@/tests/support/test-db";
import { db, makeFixture, sightingValues } from "./helpers";

// Hardening at rest (issue 13): the app connects as a role that owns no table, so that a
// compromised app (or an SQL injection) cannot switch off the append-only guarantees; the
// owner role runs the migrations. DATABASE_URL is the app's connection in these tests.
const appUrl = process.env.DATABASE_URL!;
const ownerUrl = process.env.DATABASE_OWNER_URL!;

async function connect(url: string): Promise<Client> {
  const c = new Client({ connectionString: url });
  await c.connect();
  return c;
}

/** The error code PostgreSQL answers `statement` with as this client (null if it succeeds), in a rolled-back transaction. */
async function refusal(c: Client, statement: string): Promise<string | null> {
  await c.query("BEGIN");
  try {
    await c.query(statement);
    return null;
  } catch (err) {
    return (err as { code?: string }).code ?? "unknown";
  } finally {
    await c.query("ROLLBACK");
  }
}

describe("the app's database role", () => {
  let app: Client;
  let guarded: { table: string; trigger: string }[] = [];
  beforeAll(async () => {
    app = await connect(appUrl);
    const { rows } = await app.query<{ table: string; trigger: string }>(
      `SELECT c.relname AS table, t.tgname AS trigger FROM pg_trigger t
         JOIN pg_class c ON c.oid = t.tgrelid JOIN pg_proc p ON p.oid = t.tgfoid
        WHERE p.proname = 'ecotone_refuse_change' ORDER BY 1, 2`,
    );
    guarded = rows;
  });
  afterAll(() => app.end());

  it("is a separate login that owns nothing and may not create", async () => {
    expect(roleOf(appUrl)).toBe(APP_ROLE);
    expect(roleOf(ownerUrl)).toBe(OWNER_ROLE);
    const { rows } = await app.query(
      `SELECT current_user AS who, r.rolsuper, r.rolcreatedb, r.rolcreaterole, r.rolbypassrls,
              (SELECT count(*)::int FROM pg_class WHERE relowner = r.oid) AS owned,
              has_schema_privilege('public', 'CREATE') AS can_create,
              has_database_privilege(current_database(), 'CREATE') AS can_create_schema
         FROM pg_roles r WHERE r.rolname = current_user`,
    );
    expect(rows[0]).toEqual({
      who: APP_ROLE,
      rolsuper: false,
      rolcreatedb: false,
      rolcreaterole: false,
      rolbypassrls: false,
      owned: 0,
      can_create: false,
      can_create_schema: false,
    });
    expect(await refusal(app, "CREATE TABLE public.intruder (id int)")).toBe("42501");
    expect(await refusal(app, "SELECT * FROM drizzle.__drizzle_migrations")).toBe("42501");
  });

  it("has row access to every table and no TRUNCATE, TRIGGER or REFERENCES right on any", async () => {
    const { rows } = await app.query<{ table: string; rw: boolean; extra: boolean }>(
      `SELECT c.relname AS table,
              has_table_privilege(c.oid, 'SELECT, INSERT, UPDATE, DELETE') AND
                has_table_privilege(c.oid, 'SELECT') AND has_table_privilege(c.oid, 'INSERT') AND
                has_table_privilege(c.oid, 'UPDATE') AND has_table_privilege(c.oid, 'DELETE') AS rw,
              has_table_privilege(c.oid, 'TRUNCATE') OR has_table_privilege(c.oid, 'TRIGGER') OR
                has_table_privilege(c.oid, 'REFERENCES') AS extra
         FROM pg_class c JOIN pg_namespace n ON n.oid = c.relnamespace
        WHERE n.nspname = 'public' AND c.relkind IN ('r', 'p') AND c.relname <> 'spatial_ref_sys'`,
    );
    expect(rows.length).toBeGreaterThan(20);
    expect(rows.filter((r) => !r.rw).map((r) => r.table)).toEqual([]);
    expect(rows.filter((r) => r.extra).map((r) => r.table)).toEqual([]);
  });

  it("cannot drop, disable or get around the append-only triggers, nor truncate or drop their tables", async () => {
    expect(guarded.map((g) => g.table)).toEqual(expect.arrayContaining(["reviews", "reports"]));
    for (const { table, trigger } of guarded) {
      expect([table, await refusal(app, `DROP TRIGGER "${trigger}" ON "${table}"`)]).toEqual([table, "42501"]);
      expect([table, await refusal(app, `ALTER TABLE "${table}" DISABLE TRIGGER "${trigger}"`)]).toEqual([
        table,
        "42501",
      ]);
      expect([table, await refusal(app, `ALTER TABLE "${table}" DISABLE TRIGGER ALL`)]).toEqual([table, "42501"]);
      expect([table, await refusal(app, `TRUNCATE "${table}"`)]).toEqual([table, "42501"]);
      expect([table, await refusal(app, `DROP TABLE "${table}" CASCADE`)]).toEqual([table, "42501"]);
    }
    // Nor by replacing the trigger's function, or by replica mode (which skips ordinary triggers).
    expect(
      await refusal(
        app,
        "CREATE OR REPLACE FUNCTION ecotone_refuse_change() RETURNS trigger LANGUAGE plpgsql AS $$ BEGIN RETURN NEW; END $$",
      ),
    ).toBe("42501");
    expect(await refusal(app, "SET session_replication_role = replica")).toBe("42501");
    expect(await refusal(app, "ALTER TABLE reviews OWNER TO ecotone_app")).toBe("42501");
  });

  it("still writes rows as the app does, and the triggers still refuse edits to review history", async () => {
    await app.query("BEGIN");
    try {
      const org = await app.query<{ id: string }>(
        "INSERT INTO organisations (slug, name) VALUES ('roles-test', 'Roles test') RETURNING id",
      );
      await app.query("UPDATE organisations SET name = 'Roles test, renamed' WHERE id = $1", [org.rows[0]!.id]);
      const { rows } = await app.query("SELECT name FROM organisations WHERE id = $1", [org.rows[0]!.id]);
      expect(rows[0].name).toBe("Roles test, renamed");
      const deleted = await app.query("DELETE FROM organisations WHERE id = $1", [org.rows[0]!.id]);
      expect(deleted.rowCount).toBe(1);
    } finally {
      await app.query("ROLLBACK");
    }
    // The app's own pool (db/client.ts) connects as the same role and writes a decision.
    const f = await makeFixture("db-roles");
    const [sighting] = await db().insert(schema.sightings).values(sightingValues(f)).returning();
    const [review] = await db()
      .insert(schema.reviews)
      .values({
        sightingId: sighting!.id,
        eventId: sighting!.eventId,
        reviewerId: f.user.id,
        fromState: "pending",
        toState: "approved",
      })
      .returning();
    const update = await app.query("UPDATE reviews SET reason = 'changed' WHERE id = $1", [review!.id]).catch((e) => e);
    expect(String(update.message)).toMatch(/append-only/);
    const remove = await app.query("DELETE FROM reviews WHERE id = $1", [review!.id]).catch((e) => e);
    expect(String(remove.message)).toMatch(/append-only/);
  });
});

describe("migrations as the owner role", () => {
  const base = new URL(ownerUrl);
  base.pathname = `${base.pathname}_roles`;
  const url = base.toString();
  afterAll(() => dropDatabase(url));

  it("apply to a fresh database, grant the app role, and cover tables later migrations add", async () => {
    await recreateEmptyDatabase(url);
    const urls = testUrls(url);
    await runMigrations(urls.owner, { appRole: APP_ROLE });
    await runMigrations(urls.owner, { appRole: APP_ROLE }); // again: nothing changes, nothing fails

    const owner = await connect(urls.owner);
    const app = await connect(urls.app);
    try {
      const owned = await owner.query<{ n: number }>(
        `SELECT count(*)::int AS n FROM pg_tables WHERE schemaname = 'public' AND tableowner = $1`,
        [OWNER_ROLE],
      );
      expect(owned.rows[0]!.n).toBeGreaterThan(20);
      // A table the next migration might add: the app may use it at once, without a grant of its own.
      await owner.query("CREATE TABLE later_table (id bigserial PRIMARY KEY, note text)");
      await app.query("INSERT INTO later_table (note) VALUES ('written by the app')");
      const { rows } = await app.query("SELECT note FROM later_table");
      expect(rows).toEqual([{ note: "written by the app" }]);
      expect(await refusal(app, "TRUNCATE later_table")).toBe("42501");
      expect(await refusal(app, "DROP TABLE later_table")).toBe("42501");
    } finally {
      await app.end();
      await owner.end();
    }
  });
});
