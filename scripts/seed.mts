// Seeds the demo scenario into DATABASE_URL (or the URL given as the first argument).
import { drizzle } from "drizzle-orm/node-postgres";
import { Pool } from "pg";
import * as schema from "../db/schema";
import { seedDemo } from "../db/seed/demo";
import { DEMO_PASSWORD } from "../db/seed/demo-scenario";
import { hashPassword } from "../server/auth/password";
import { env } from "../lib/env";

const url = process.argv[2] ?? env().DATABASE_URL;
const pool = new Pool({ connectionString: url, max: 2 });
try {
  const summary = await seedDemo(drizzle(pool, { schema }), { passwordHash: await hashPassword(DEMO_PASSWORD) });
  console.log(
    `[ecotone] demo seeded: ${summary.people} people, ${summary.taxa} taxa, ${summary.sessions} count sessions, ` +
      `${summary.sightings} sightings (${Object.entries(summary.byState)
        .map(([k, v]) => `${v} ${k}`)
        .join(", ")}), ${summary.reviews} review decisions`,
  );
} finally {
  await pool.end();
}
