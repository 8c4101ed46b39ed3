import { undoDecision } from "@/db/queries/review";
import { parseJson } from "@/lib/http/body";
import { ApiError, handle, requestLocale } from "@/lib/http/errors";
import { parseParams, pathId } from "@/lib/http/params";
import { limitWrites } from "@/lib/http/write-limit";
import { translator } from "@/lib/i18n/translator";
import { requireReviewPermit, staleVersion } from "@/server/review/permit";
import { undoInput } from "./schema";

// Undoes the latest decision on a sighting by appending a decision that restores the state and
// taxon before it: any coordinator of the sighting's group may, at any time (the desk offers it
// for a minute in its toast and later in the history).
export const POST = handle(async (request, ctx: { params: Promise<{ eventId: string; sightingId: string }> }) => {
  const { eventId, sightingId } = await parseParams(ctx.params, { eventId: pathId, sightingId: pathId });
  const { user, scope } = await requireReviewPermit(eventId, request);
  limitWrites(`review:${user.id}`, 240);
  const { reviewId, version } = await parseJson(request, undoInput);
  const locale = requestLocale(request);
  const t = translator(locale, "ReviewDesk");
  const result = await undoDecision(scope, user.id, sightingId, reviewId, version);
  switch (result.outcome) {
    case "ok":
      return Response.json({ sighting: result.sighting, reviewId: result.reviewId });
    case "conflict":
      throw staleVersion(locale, result.current);
    case "not_last":
      throw new ApiError("conflict", [{ field: "reviewId", message: t("errors.undoNotLast") }]);
    case "unknown_review":
      throw new ApiError("unprocessable", [{ field: "reviewId", message: t("errors.undoUnknown") }]);
    case "not_found":
    case "forbidden":
      throw new ApiError(result.outcome);
    default:
      throw new ApiError("unprocessable");
  }
});
