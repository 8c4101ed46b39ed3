import { decodeCursor, queueCounts, reviewQueue } from "@/db/queries/review";
import { ApiError, handle, parseQuery, requestLocale } from "@/lib/http/errors";
import { parseParams, pathId } from "@/lib/http/params";
import { translator } from "@/lib/i18n/translator";
import { requireReviewPermit } from "@/server/review/permit";
import { queueQuery } from "./schema";

export const dynamic = "force-dynamic";

// The review queue: one page of the sightings the coordinator may review, with counts per state.
export const GET = handle(async (request, ctx: { params: Promise<{ eventId: string }> }) => {
  const { eventId } = await parseParams(ctx.params, { eventId: pathId });
  const { scope } = await requireReviewPermit(eventId, request);
  const { cursor, limit, ...filters } = parseQuery(request, queueQuery);
  if (cursor && !decodeCursor(cursor)) {
    throw new ApiError("bad_request", [
      { field: "cursor", message: translator(requestLocale(request), "ReviewDesk")("errors.badCursor") },
    ]);
  }
  const [page, counts] = await Promise.all([
    reviewQueue(scope, filters, cursor ?? null, limit),
    queueCounts(scope, filters),
  ]);
  return Response.json({ ...page, counts }, { headers: { "Cache-Control": "no-store" } });
});
