import { bulkApprove, MAX_BULK } from "@/db/queries/review";
import { parseJson } from "@/lib/http/body";
import { ApiError, handle, requestLocale } from "@/lib/http/errors";
import { parseParams, pathId } from "@/lib/http/params";
import { limitWrites } from "@/lib/http/write-limit";
import { translator } from "@/lib/i18n/translator";
import { requireReviewPermit } from "@/server/review/permit";
import { bulkApproveInput } from "./schema";

// Approves every pending sighting matching the filters, if their number is still the one confirmed.
export const POST = handle(async (request, ctx: { params: Promise<{ eventId: string }> }) => {
  const { eventId } = await parseParams(ctx.params, { eventId: pathId });
  const { user, scope } = await requireReviewPermit(eventId, request);
  limitWrites(`review:${user.id}`, 240);
  const { filters, expectedCount } = await parseJson(request, bulkApproveInput);
  const t = translator(requestLocale(request), "ReviewDesk");
  const result = await bulkApprove(scope, user.id, filters, expectedCount);
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
