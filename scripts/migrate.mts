// Applies db/migrations as the owner role (DATABASE_OWNER_URL, or the URL given as the first
// argument), then grants the app's role (the user in DATABASE_URL) row access to every table.
import { runMigrations } from "../db/migrate";
import { roleOf } from "../db/roles";
import { env } from "../lib/env";

const url = process.argv[2] ?? env().DATABASE_OWNER_URL;
await runMigrations(url, { appRole: roleOf(env().DATABASE_URL) });
console.log(`[ecotone] migrations applied to ${url.replace(/:[^:@/]+@/, ":***@")}`);
