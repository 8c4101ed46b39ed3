import { createApiToken, listApiTokens } from "@/db/queries/api-tokens";
import { ApiError, handle, parseQuery, requestLocale } from "@/lib/http/errors";
import { limitWrites } from "@/lib/http/write-limit";
import { translator } from "@/lib/i18n/translator";
import { parseSetupBody } from "@/lib/setup/api";
import { makeApiToken } from "@/server/auth/api-token-secret";
import { requireEventRole } from "@/server/auth/guard";
import { setupQuery } from "../schema";
import { newApiTokenInput } from "./schema";

type Ctx = { params: Promise<{ eventId: string }> };
export const dynamic = "force-dynamic";

// The event's read-only API tokens (and the organisation's, for its organisers). The secret
// is never listed: only its first characters.
export const GET = handle<Ctx>(async (request, { params }) => {
  const { eventId } = await params;
  const { access, role } = await requireEventRole(eventId, "organiser");
  parseQuery(request, setupQuery);
  const canOrganisation = role === "admin" || access.isOrganisationOrganiser;
  return Response.json(
    { tokens: await listApiTokens(eventId, canOrganisation), canOrganisation },
    { headers: { "Cache-Control": "no-store" } },
  );
});

// Makes a token and answers its secret, this once: only its SHA-256 is kept.
export const POST = handle<Ctx>(async (request, { params }) => {
  const { eventId } = await params;
  const { user, access, role } = await requireEventRole(eventId, "organiser");
  limitWrites(`api-token:${user.id}`, 30, 60 * 60_000);
  const input = await parseSetupBody(request, newApiTokenInput);
  if (input.scope === "organisation" && role !== "admin" && !access.isOrganisationOrganiser) {
    const t = translator(requestLocale(request), "ApiTokens");
    throw new ApiError("forbidden", [{ field: "scope", message: t("organisationOnly") }]);
  }
  const { secret, prefix, hash } = makeApiToken();
  const expiresAt = new Date(Date.now() + input.expiresInDays * 24 * 60 * 60 * 1000);
  const row = await createApiToken({
    organisationId: access.organisationId,
    eventId: input.scope === "event" ? eventId : null,
    name: input.name.trim(),
    prefix,
    tokenHash: hash,
    createdBy: user.id,
    expiresAt,
  });
  return Response.json(
    { id: row.id, token: secret, prefix, expiresAt: expiresAt.toISOString() },
    { status: 201, headers: { "Cache-Control": "no-store" } },
  );
});
