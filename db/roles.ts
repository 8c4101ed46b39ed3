/**
 * The two database roles (issue 13, hardening at rest). The owner role owns the database and
 * every table, and runs the migrations; the app role is what the running app, the mail worker
 * and the demo seed connect as: it may read and write rows, and nothing else. It owns nothing,
 * so it cannot drop or disable the append-only triggers, truncate, alter or drop a table.
 * The set-up scripts (scripts/pg.sh, tests/support/test-db.ts) create both on loopback clusters;
 * runMigrations grants the app role its rights after migrating.
 */
export const OWNER_ROLE = "ecotone";
export const APP_ROLE = "ecotone_app";

/** The same database as `url`, as another role (the loopback clusters' password is the role's name). */
export function urlAsRole(url: string, role: string): string {
  const u = new URL(url);
  u.username = role;
  u.password = role;
  return u.toString();
}

/** The role a connection string logs in as. */
export function roleOf(url: string): string {
  return decodeURIComponent(new URL(url).username);
}

/**
 * What the app role may do, granted by the owner after each migration run (idempotent):
 * use the schema, read and write rows of every table and use every sequence, now and in
 * tables later migrations create (default privileges for the owner). No TRUNCATE, TRIGGER,
 * REFERENCES or CREATE; nothing on the migrations' own schema.
 */
export function appGrants(role: string, owner: string): string[] {
  const q = (name: string) => `"${name.replaceAll('"', '""')}"`;
  const r = q(role);
  return [
    "REVOKE CREATE ON SCHEMA public FROM PUBLIC",
    `GRANT USAGE ON SCHEMA public TO ${r}`,
    `GRANT SELECT, INSERT, UPDATE, DELETE ON ALL TABLES IN SCHEMA public TO ${r}`,
    `GRANT USAGE ON ALL SEQUENCES IN SCHEMA public TO ${r}`,
    `ALTER DEFAULT PRIVILEGES FOR ROLE ${q(owner)} IN SCHEMA public GRANT SELECT, INSERT, UPDATE, DELETE ON TABLES TO ${r}`,
    `ALTER DEFAULT PRIVILEGES FOR ROLE ${q(owner)} IN SCHEMA public GRANT USAGE ON SEQUENCES TO ${r}`,
  ];
}
