import { getEventPack } from "@/db/queries/pack";
import { requireEventRole } from "@/server/auth/guard";
import { ApiError, handle } from "@/lib/http/errors";
import { parseParams, pathId } from "@/lib/http/params";
import { jsonWithEtag } from "@/lib/http/etag";

type Ctx = { params: Promise<{ eventId: string }> };

// The event pack for the field log (members of the event). A strong ETag over the exact
// bytes lets the device download it again only when something changed (304 otherwise).
export const GET = handle<Ctx>(async (request, { params }) => {
  const { eventId } = await parseParams(params, { eventId: pathId });
  await requireEventRole(eventId, "volunteer");
  const pack = await getEventPack(eventId);
  if (!pack) throw new ApiError("not_found");
  return jsonWithEtag(request, pack);
});
