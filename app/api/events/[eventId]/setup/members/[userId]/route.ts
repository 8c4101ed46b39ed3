import { changeMemberRole, removeMember } from "@/db/queries/setup";
import { ApiError, handle } from "@/lib/http/errors";
import { parseParams, pathId } from "@/lib/http/params";
import type { Locale } from "@/lib/i18n/routing";
import { translator } from "@/lib/i18n/translator";
import { requireSetupWritePermit } from "@/server/setup/handler";
import { roleChangeInput } from "./schema";

type Ctx = { params: Promise<{ eventId: string; userId: string }> };

function notOwnRole(locale: Locale, actorId: string, userId: string) {
  // An organiser cannot lock themself out; another organiser can change their role.
  if (actorId === userId) {
    throw new ApiError("unprocessable", [{ field: "userId", message: translator(locale, "Setup")("errors.ownRole") }]);
  }
}

// Change a member's role (a coordinator optionally limited to taxon groups); logged.
export const PATCH = handle<Ctx>(async (request, { params }) => {
  const { eventId, userId } = await parseParams(params, { eventId: pathId, userId: pathId });
  const { user, input, locale } = await requireSetupWritePermit(request, eventId, roleChangeInput);
  notOwnRole(locale, user.id, userId);
  const outcome = await changeMemberRole(eventId, userId, input.role, input.taxonGroups, user.id);
  if (outcome === "notMember") throw new ApiError("not_found");
  return Response.json({ ok: true, changed: outcome === "changed" });
});

// Remove a member from the event; their records stay, and the removal is logged.
export const DELETE = handle<Ctx>(async (request, { params }) => {
  const { eventId, userId } = await parseParams(params, { eventId: pathId, userId: pathId });
  const { user, locale } = await requireSetupWritePermit(request, eventId);
  notOwnRole(locale, user.id, userId);
  if (!(await removeMember(eventId, userId, user.id))) throw new ApiError("not_found");
  return Response.json({ ok: true });
});
