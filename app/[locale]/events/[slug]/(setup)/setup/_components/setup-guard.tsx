import { cache } from "react";
import { eventIdBySlug } from "@/db/queries/events";
import type { Locale } from "@/lib/i18n/routing";
import { requirePageEventRole } from "@/server/auth/page";

/**
 * Every setup page of an event: organisers (and site admins) only, through the one guard.
 * Resolves the event by its slug (drafts included); null when it does not exist or the
 * person may not set it up. Cached per request, so the layout and the page ask once.
 */
export const setupPermit = cache(async (locale: Locale, slug: string, path: string) => {
  const eventId = await eventIdBySlug(slug);
  if (!eventId) return null;
  const permit = await requirePageEventRole(locale, eventId, "organiser", `/events/${slug}/setup${path}`);
  return permit ? { eventId } : null;
});
