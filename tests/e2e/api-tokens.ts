import { createHash } from "node:crypto";
import type { Client } from "pg";
import { withE2eDb } from "./demo-ids";
import type { ApiTokenHolder } from "./route-table";

// Read-only API tokens for the role matrix, written straight into the browser tests'
// database with fixed secrets (only their SHA-256 is stored, as the app stores them).
// Idempotent: a second call changes nothing but un-revokes the matrix's revocable token.
const secretOf = (who: string) => `eco_matrix_${who}_${"x".repeat(24)}`;
const sha256 = (s: string) => createHash("sha256").update(s, "utf8").digest("hex");

const PLAN: Record<ApiTokenHolder | "revocable", { event: string; wholeOrganisation?: boolean }> = {
  eventToken: { event: "harrowmere-vale-midsummer-count" },
  organisationToken: { event: "harrowmere-vale-midsummer-count", wholeOrganisation: true },
  otherEventToken: { event: "harrowmere-vale-autumn-fungus-foray" },
  otherOrganisationToken: { event: "kestrel-moor-winter-count" },
  revocable: { event: "harrowmere-vale-autumn-fungus-foray" },
};

async function upsert(c: Client, who: string, plan: { event: string; wholeOrganisation?: boolean }): Promise<string> {
  const secret = secretOf(who);
  const { rows } = await c.query(
    `
    INSERT INTO api_tokens (organisation_id, event_id, name, prefix, token_hash, expires_at)
    SELECT e.organisation_id, CASE WHEN $2 THEN NULL ELSE e.id END, $3, $4, $5, now() + interval '30 days' FROM events e WHERE e.slug = $1
    ON CONFLICT (token_hash) DO UPDATE SET revoked_at = NULL, revoked_by = NULL, expires_at = now() + interval '30 days', window_calls = 0
    RETURNING id`,
    [plan.event, Boolean(plan.wholeOrganisation), `Role matrix ${who}`, secret.slice(0, 12), sha256(secret)],
  );
  if (!rows[0]) throw new Error(`no event ${plan.event} in the browser tests' database`);
  return rows[0].id as string;
}

export async function matrixTokens(): Promise<{ secrets: Record<ApiTokenHolder, string>; revocableId: string }> {
  return withE2eDb(async (c) => {
    const secrets = {} as Record<ApiTokenHolder, string>;
    for (const who of ["eventToken", "organisationToken", "otherEventToken", "otherOrganisationToken"] as const) {
      await upsert(c, who, PLAN[who]);
      secrets[who] = secretOf(who);
    }
    return { secrets, revocableId: await upsert(c, "revocable", PLAN.revocable) };
  });
}
