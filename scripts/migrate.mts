// Applies db/migrations to DATABASE_URL (or the URL given as the first argument).
import { runMigrations } from "../db/migrate";
import { env } from "../lib/env";

const url = process.argv[2] ?? env().DATABASE_URL;
await runMigrations(url);
console.log(`[ecotone] migrations applied to ${url.replace(/:[^:@/]+@/, ":***@")}`);
