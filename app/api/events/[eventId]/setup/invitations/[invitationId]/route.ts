import { revokeInvitation } from "@/db/queries/setup";
import { requireEventRole } from "@/server/auth/guard";
import { ApiError, handle } from "@/lib/http/errors";
import { limitWrites } from "@/lib/http/write-limit";

type Ctx = { params: Promise<{ eventId: string; invitationId: string }> };

// Withdraw an open invitation: its link no longer gives a role. Logged.
export const DELETE = handle<Ctx>(async (_request, { params }) => {
  const { eventId, invitationId } = await params;
  const { user } = await requireEventRole(eventId, "organiser");
  limitWrites(`setup:${user.id}`);
  if (!/^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i.test(invitationId)) throw new ApiError("not_found");
  if (!(await revokeInvitation(eventId, invitationId, user.id))) throw new ApiError("not_found");
  return Response.json({ ok: true });
});
