import { revokeInvitation } from "@/db/queries/setup";
import { ApiError, handle } from "@/lib/http/errors";
import { parseParams, pathId } from "@/lib/http/params";
import { requireSetupWritePermit } from "@/server/setup/handler";

type Ctx = { params: Promise<{ eventId: string; invitationId: string }> };

// Withdraw an open invitation: its link no longer gives a role. Logged.
export const DELETE = handle<Ctx>(async (request, { params }) => {
  const { eventId, invitationId } = await parseParams(params, { eventId: pathId, invitationId: pathId });
  const { user } = await requireSetupWritePermit(request, eventId);
  if (!(await revokeInvitation(eventId, invitationId, user.id))) throw new ApiError("not_found");
  return Response.json({ ok: true });
});
