import { getApiToken, revokeApiToken } from "@/db/queries/api-tokens";
import { ApiError, handle } from "@/lib/http/errors";
import { limitWrites } from "@/lib/http/write-limit";
import { requireEventRole } from "@/server/auth/guard";

type Ctx = { params: Promise<{ eventId: string; tokenId: string }> };
export const dynamic = "force-dynamic";

// Revokes a token at once: its next call is refused. The event's own tokens by the event's
// organisers; organisation-wide ones by the organisation's organisers only.
export const DELETE = handle<Ctx>(async (_request, { params }) => {
  const { eventId, tokenId } = await params;
  const { user, access, role } = await requireEventRole(eventId, "organiser");
  limitWrites(`setup:${user.id}`);
  const token = await getApiToken(tokenId);
  const mine =
    token && (token.eventId === eventId || (token.eventId === null && token.organisationId === access.organisationId));
  if (!token || !mine) throw new ApiError("not_found");
  if (token.eventId === null && role !== "admin" && !access.isOrganisationOrganiser) throw new ApiError("forbidden");
  const outcome = await revokeApiToken(token.id, user.id);
  return Response.json({ ok: true, outcome });
});
