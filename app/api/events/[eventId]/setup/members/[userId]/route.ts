import { changeMemberRole, removeMember } from "@/db/queries/setup";
import { requireEventRole } from "@/server/auth/guard";
import { ApiError, handle, requestLocale } from "@/lib/http/errors";
import { limitWrites } from "@/lib/http/write-limit";
import { translator } from "@/lib/i18n/translator";
import { parseSetupBody } from "@/lib/setup/api";
import { roleChangeInput } from "./schema";

type Ctx = { params: Promise<{ eventId: string; userId: string }> };
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

function notOwnRole(request: Request, actorId: string, userId: string) {
  // An organiser cannot lock themself out; another organiser can change their role.
  if (actorId === userId) {
    const t = translator(requestLocale(request), "Setup");
    throw new ApiError("unprocessable", [{ field: "userId", message: t("errors.ownRole") }]);
  }
}

// Change a member's role (a coordinator optionally limited to taxon groups); logged.
export const PATCH = handle<Ctx>(async (request, { params }) => {
  const { eventId, userId } = await params;
  const { user } = await requireEventRole(eventId, "organiser");
  limitWrites(`setup:${user.id}`);
  if (!UUID.test(userId)) throw new ApiError("not_found");
  const input = await parseSetupBody(request, roleChangeInput);
  notOwnRole(request, user.id, userId);
  const outcome = await changeMemberRole(eventId, userId, input.role, input.taxonGroups, user.id);
  if (outcome === "notMember") throw new ApiError("not_found");
  return Response.json({ ok: true, changed: outcome === "changed" });
});

// Remove a member from the event; their records stay, and the removal is logged.
export const DELETE = handle<Ctx>(async (request, { params }) => {
  const { eventId, userId } = await params;
  const { user } = await requireEventRole(eventId, "organiser");
  limitWrites(`setup:${user.id}`);
  if (!UUID.test(userId)) throw new ApiError("not_found");
  notOwnRole(request, user.id, userId);
  if (!(await removeMember(eventId, userId, user.id))) throw new ApiError("not_found");
  return Response.json({ ok: true });
});
