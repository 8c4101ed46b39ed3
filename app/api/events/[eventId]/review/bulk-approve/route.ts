import { bulkApprove, bulkPreview, MAX_BULK } from "@/db/queries/review";
import { parseJson } from "@/lib/http/body";
import { ApiError, handle, parseQuery, requestLocale } from "@/lib/http/errors";
import { parseParams, pathId } from "@/lib/http/params";
import { limitWrites } from "@/lib/http/write-limit";
import { translator } from "@/lib/i18n/translator";
import { requireReviewPermit } from "@/server/review/permit";
import { bulkApproveInput, bulkPreviewQuery } from "./schema";

export const dynamic = "force-dynamic";

// What bulk approval would take with these filters and included marks, and what it leaves out for check marks.
export const GET = handle(async (request, ctx: { params: Promise<{ eventId: string }> }) => {
  const { eventId } = await parseParams(ctx.params, { eventId: pathId });
  const { scope } = await requireReviewPermit(eventId, request);
  const { include, ...filters } = parseQuery(request, bulkPreviewQuery);
  return Response.json(await bulkPreview(scope, filters, include ?? []), { headers: { "Cache-Control": "no-store" } });
});

// Approves the pending sightings matching the filters with no check mark (or only included ones),
// if their number is still the one confirmed.
export const POST = handle(async (request, ctx: { params: Promise<{ eventId: string }> }) => {
  const { eventId } = await parseParams(ctx.params, { eventId: pathId });
  const { user, scope } = await requireReviewPermit(eventId, request);
  limitWrites(`review:${user.id}`, 240);
  const { filters, include, expectedCount } = await parseJson(request, bulkApproveInput);
  const t = translator(requestLocale(request), "ReviewDesk");
  const result = await bulkApprove(scope, user.id, filters, expectedCount, include);
  if (result.outcome === "too_many")
    throw new ApiError("unprocessable", [{ field: "filters", message: t("errors.bulkTooMany", { max: MAX_BULK }) }]);
  if (result.outcome === "count_changed") {
    throw new ApiError("conflict", [
      {
        field: "expectedCount",
        message: t("errors.bulkCountChanged", { expected: expectedCount, count: result.count }),
      },
    ]);
  }
  return Response.json({ approved: result.approved });
});
