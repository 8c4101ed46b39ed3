import { removeOrganiser } from "@/db/queries/organisations";
import { ApiError, handle, requestLocale } from "@/lib/http/errors";
import { parseParams, pathId } from "@/lib/http/params";
import { limitWrites } from "@/lib/http/write-limit";
import { translator } from "@/lib/i18n/translator";
import { requireOrganisationOrganiser } from "@/server/auth/guard";

type Ctx = { params: Promise<{ organisationId: string; userId: string }> };

// An organiser removes an organiser (or leaves); the last organiser cannot.
export const DELETE = handle<Ctx>(async (request, { params }) => {
  const { organisationId, userId } = await parseParams(params, { organisationId: pathId, userId: pathId });
  const user = await requireOrganisationOrganiser(organisationId);
  limitWrites(`setup:${user.id}`);
  const result = await removeOrganiser(user.id, organisationId, userId);
  if (!result.ok) {
    if (result.reason === "not_organiser") throw new ApiError("not_found");
    const t = translator(requestLocale(request), "Organisations");
    throw new ApiError("conflict", [{ field: "userId", message: t(`errors.${result.reason}`) }]);
  }
  return Response.json({ ok: true });
});
