import "server-only";
import { getServerSession } from "next-auth";
import { eventAccess, findUserById, isOrganisationOrganiser, type EventAccess } from "@/db/queries/auth";
import { SITE_ADMIN, type EffectiveRole, type EventRole, type TaxonGroup } from "@/lib/domain";
import { ApiError } from "@/lib/http/errors";
import { isUuid } from "@/lib/http/params";
import { authOptions } from "@/server/auth/options";

// The one authorisation helper (conventions, habit 4). Every route handler and every
// signed-in page goes through these; 401 without a session, 403 with the wrong role.

export type SessionUser = NonNullable<Awaited<ReturnType<typeof findUserById>>>;

const rank: Record<EventRole, number> = { volunteer: 1, coordinator: 2, organiser: 3 };

export async function getSessionUser(): Promise<SessionUser | null> {
  const session = await getServerSession(authOptions());
  const id = (session?.user as { id?: string } | undefined)?.id;
  if (!id) return null;
  return findUserById(id);
}

export async function requireUser(): Promise<SessionUser> {
  const user = await getSessionUser();
  if (!user) throw new ApiError("unauthenticated");
  return user;
}

export type EventPermit = { user: SessionUser; access: EventAccess; role: EffectiveRole; taxonGroups: TaxonGroup[] };

/** The person's effective role in the event: admin, organiser (of the event's organisation, or by event role), then their event role. */
export function effectiveRole(user: Pick<SessionUser, "isAdmin">, access: EventAccess): EffectiveRole | null {
  if (user.isAdmin) return SITE_ADMIN;
  if (access.isOrganisationOrganiser || access.role === "organiser") return "organiser";
  return access.role;
}

/**
 * Allows the call when the person holds `minimum` or a higher role in the event
 * (organiser > coordinator > volunteer; site admins pass). An unknown event is a 404
 * for members and non-members alike.
 */
export async function requireEventRole(eventId: string, minimum: EventRole): Promise<EventPermit> {
  return eventPermitFor(await requireUser(), eventId, minimum);
}

/** requireEventRole's check for a person already known (a signed-in user, or a test's person). */
export async function eventPermitFor(user: SessionUser, eventId: string, minimum: EventRole): Promise<EventPermit> {
  if (!isUuid(eventId)) throw new ApiError("not_found"); // never a malformed uuid to PostgreSQL (handlers parse theirs first)
  const access = await eventAccess(user.id, eventId);
  if (!access) throw new ApiError("not_found");
  const role = effectiveRole(user, access);
  if (!role || (role !== SITE_ADMIN && rank[role] < rank[minimum])) throw new ApiError("forbidden");
  // Only coordinators carry taxon-group limits; organisers and admins see everything.
  return { user, access, role, taxonGroups: role === "coordinator" ? access.taxonGroups : [] };
}

export async function requireOrganisationOrganiser(organisationId: string): Promise<SessionUser> {
  const user = await requireUser();
  if (user.isAdmin) return user;
  if (!isUuid(organisationId) || !(await isOrganisationOrganiser(user.id, organisationId)))
    throw new ApiError("forbidden");
  return user;
}

/** The site admin (users.is_admin): the admin console and its handlers; 403 for everyone else signed in. */
export async function requireSiteAdmin(): Promise<SessionUser> {
  const user = await requireUser();
  if (!user.isAdmin) throw new ApiError("forbidden");
  return user;
}
