import { sightingDetail } from "@/db/queries/review";
import { ApiError, handle } from "@/lib/http/errors";
import { parseParams, pathId } from "@/lib/http/params";
import { requireReviewPermit } from "@/server/review/permit";

export const dynamic = "force-dynamic";

// One sighting for the desk's detail pane: names, count, time, place and map, session, photos,
// the volunteer's records nearby in time, and the full history of decisions.
export const GET = handle(async (request, ctx: { params: Promise<{ eventId: string; sightingId: string }> }) => {
  const { eventId, sightingId } = await parseParams(ctx.params, { eventId: pathId, sightingId: pathId });
  const { scope } = await requireReviewPermit(eventId, request);
  const detail = await sightingDetail(scope, sightingId);
  if (detail.check !== "ok") throw new ApiError(detail.check);
  const { check: _c, ...body } = detail;
  return Response.json(body, { headers: { "Cache-Control": "no-store" } });
});
