import "server-only";
import type { ReviewScope } from "@/db/queries/review";
import { eventPermitFor, requireUser, type SessionUser } from "@/server/auth/guard";
import { requestLocale } from "@/lib/http/errors";
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
