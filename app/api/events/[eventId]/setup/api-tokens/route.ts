import { createApiToken, listApiTokens } from "@/db/queries/api-tokens";
import { ApiError, handle, requestLocale } from "@/lib/http/errors";
import { parseParams, pathId } from "@/lib/http/params";
import { translator } from "@/lib/i18n/translator";
import { makeApiToken } from "@/server/auth/api-token-secret";
import { requireSetupReadPermit, requireSetupWritePermit } from "@/server/setup/handler";
import { newApiTokenInput } from "./schema";

type Ctx = { params: Promise<{ eventId: string }> };
export const dynamic = "force-dynamic";

// The event's read-only API tokens (and the organisation's, for its organisers). The secret
// is never listed: only its first characters.
export const GET = handle<Ctx>(async (request, { params }) => {
  const { eventId } = await parseParams(params, { eventId: pathId });
  const { access, role } = await requireSetupReadPermit(request, eventId);
  const canOrganisation = role === "admin" || access.isOrganisationOrganiser;
  return Response.json(
    { tokens: await listApiTokens(eventId, canOrganisation), canOrganisation },
    { headers: { "Cache-Control": "no-store" } },
  );
});

// Makes a token and answers its secret, this once: only its SHA-256 is kept.
export const POST = handle<Ctx>(async (request, { params }) => {
  const { eventId } = await parseParams(params, { eventId: pathId });
  const { user, access, role, input } = await requireSetupWritePermit(request, eventId, newApiTokenInput, {
    limit: ["api-token", 30, 60 * 60_000],
  });
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
