import { getApiToken, revokeApiToken } from "@/db/queries/api-tokens";
import { ApiError, handle } from "@/lib/http/errors";
import { parseParams, pathId } from "@/lib/http/params";
import { requireSetupWritePermit } from "@/server/setup/handler";

type Ctx = { params: Promise<{ eventId: string; tokenId: string }> };
export const dynamic = "force-dynamic";

// Revokes a token at once: its next call is refused. The event's own tokens by the event's
// organisers; organisation-wide ones by the organisation's organisers only.
export const DELETE = handle<Ctx>(async (request, { params }) => {
  const { eventId, tokenId } = await parseParams(params, { eventId: pathId, tokenId: pathId });
  const { user, access, role } = await requireSetupWritePermit(request, eventId);
  const token = await getApiToken(tokenId);
  const mine =
    token && (token.eventId === eventId || (token.eventId === null && token.organisationId === access.organisationId));
  if (!token || !mine) throw new ApiError("not_found");
  if (token.eventId === null && role !== "admin" && !access.isOrganisationOrganiser) throw new ApiError("forbidden");
  const outcome = await revokeApiToken(token.id, user.id);
  return Response.json({ ok: true, outcome });
});
