import "server-only";
import { getServerSession } from "next-auth";
import { eventAccess, findUserById, isOrganisationOrganiser, type EventAccess } from "@/db/queries/auth";
import { eventOwner, recordApiTokenCall } from "@/db/queries/api-tokens";
import { hashApiToken } from "@/server/auth/api-token-secret";
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
  // The session could not be checked against the database (authOptions' jwt callback): 503.
  if ((session as { unchecked?: boolean } | null)?.unchecked) throw new ApiError("unavailable");
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

// ---------------------------------------------------------------- read-only API tokens
export type ApiTokenPermit = { tokenId: string; organisationId: string; eventId: string | null };
export type ApiTokenScope = { eventId: string } | "token's own events";

/** Calls per token per minute (common practice for a read API; a full pull of a large event is a few dozen pages). */
export const API_TOKEN_CALLS_PER_MINUTE = 120;

/**
 * The token endpoints' check (app/api/v1): "Authorization: Bearer <token>" of a token that
 * is neither revoked nor expired (401 otherwise), within its per-minute limit (429), and,
 * for an event's data, an event of the token's own (404 for an unknown event, 403 for an
 * event of another organisation or, with an event token, another event). Every call is
 * recorded as the token's last use. Tokens only ever read: the v1 handlers export GET alone.
 */
export async function requireApiToken(request: Request, scope: ApiTokenScope): Promise<ApiTokenPermit> {
  const header = request.headers.get("authorization") ?? "";
  const secret = /^Bearer\s+([A-Za-z0-9_-]{16,200})\s*$/i.exec(header)?.[1];
  if (!secret) throw new ApiError("api_token_refused");
  const use = await recordApiTokenCall(hashApiToken(secret), { calls: API_TOKEN_CALLS_PER_MINUTE, windowSeconds: 60 });
  if (use.outcome === "refused") throw new ApiError("api_token_refused");
  if (use.outcome === "rate_limited") throw new ApiError("rate_limited");
  const permit = { tokenId: use.token.id, organisationId: use.token.organisationId, eventId: use.token.eventId };
  if (scope === "token's own events") return permit;
  const owner = await eventOwner(scope.eventId);
  if (!owner) throw new ApiError("not_found");
  if (owner.organisationId !== permit.organisationId || (permit.eventId && permit.eventId !== scope.eventId))
    throw new ApiError("forbidden");
  return permit;
}
