import "server-only";
import type { ReviewScope } from "@/db/queries/review";
import { eventPermitFor, requireUser, type SessionUser } from "@/server/auth/guard";
import { ApiError, requestLocale } from "@/lib/http/errors";
import { translator } from "@/lib/i18n/translator";
import type { ReviewState } from "@/lib/domain";
import type { Locale } from "@/lib/i18n/routing";

/** A coordinator (or organiser, or admin) of the event; a coordinator limited to taxon groups sees only those. */
export async function requireReviewPermit(eventId: string, request: Request) {
  return reviewPermitFor(await requireUser(), eventId, requestLocale(request));
}

export async function reviewPermitFor(user: SessionUser, eventId: string, locale: Locale) {
  const permit = await eventPermitFor(user, eventId, "coordinator");
  const scope: ReviewScope = { eventId, taxonGroups: permit.taxonGroups, locale };
  return { ...permit, scope };
}

/**
 * The refusal of a decision or an undo made on a version of the sighting that is no longer its
 * current one: a 409 naming the current state and version, so the desk can say what changed.
 */
export function staleVersion(locale: Locale, current: { reviewState: ReviewState; version: number }): ApiError {
  return new ApiError("conflict", [
    {
      field: "version",
      message: translator(locale, "ReviewDesk")("errors.conflict", {
        state: translator(locale, "StateMark")(`review.${current.reviewState}`),
        version: current.version,
      }),
    },
  ]);
}
