import { decide } from "@/db/queries/review";
import { parseJson } from "@/lib/http/body";
import { ApiError, handle, requestLocale } from "@/lib/http/errors";
import { parseParams, pathId } from "@/lib/http/params";
import { limitWrites } from "@/lib/http/write-limit";
import { translator } from "@/lib/i18n/translator";
import { requireReviewPermit, staleVersion } from "@/server/review/permit";
import { decisionInput } from "./schema";

// A coordinator's decision on one sighting. A stale version (someone decided first) is a 409
// saying what the sighting is now; nothing is overwritten.
export const POST = handle(async (request, ctx: { params: Promise<{ eventId: string; sightingId: string }> }) => {
  const { eventId, sightingId } = await parseParams(ctx.params, { eventId: pathId, sightingId: pathId });
  const { user, scope } = await requireReviewPermit(eventId, request);
  limitWrites(`review:${user.id}`, 240);
  const input = await parseJson(request, decisionInput);
  const t = translator(requestLocale(request), "ReviewDesk");
  const result = await decide(scope, user.id, sightingId, input);
  switch (result.outcome) {
    case "ok":
      return Response.json({ sighting: result.sighting, reviewId: result.reviewId });
    case "conflict":
      throw staleVersion(requestLocale(request), result.current);
    case "unchanged":
      throw new ApiError("unprocessable", [{ field: "action", message: t("errors.unchanged") }]);
    case "bad_taxon":
      throw new ApiError("unprocessable", [{ field: "taxonId", message: t(`errors.taxon_${result.why}`) }]);
    default:
      throw new ApiError(result.outcome);
  }
});
