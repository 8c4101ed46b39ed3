import "server-only";
import { redirect } from "@/lib/i18n/navigation";
import type { Locale } from "@/lib/i18n/routing";
import { ApiError } from "@/lib/http/errors";
import type { EventRole } from "@/lib/domain";
import { getSessionUser, requireEventRole, type SessionUser } from "@/server/auth/guard";

// Page-side faces of the one guard: no session sends the person to sign in and back;
// too low a role (or an event hidden from the person) gives null, and the page shows its
// own translated "not allowed" message in place of its content.

export async function requirePageUser(locale: Locale, returnTo: string): Promise<SessionUser> {
  const user = await getSessionUser();
  if (!user) redirect({ href: { pathname: "/sign-in", query: { callbackUrl: `/${locale}${returnTo}` } }, locale });
  return user!;
}

export async function requirePageEventRole(locale: Locale, eventId: string, minimum: EventRole, returnTo: string) {
  await requirePageUser(locale, returnTo);
  try {
    return await requireEventRole(eventId, minimum);
  } catch (err) {
    if (err instanceof ApiError && (err.code === "forbidden" || err.code === "not_found")) return null;
    throw err;
  }
}

/** A page of the admin console: the site admin, or null (the console's layout shows why). Every page checks for itself. */
export async function requirePageSiteAdmin(locale: Locale, returnTo: string): Promise<SessionUser | null> {
  const user = await requirePageUser(locale, returnTo);
  return user.isAdmin ? user : null;
}
