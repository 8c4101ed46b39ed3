import "server-only";
import { DrizzleAdapter } from "@auth/drizzle-adapter";
import { and, eq, gte, inArray, isNull, lt, sql } from "drizzle-orm";
import type { EventRole, TaxonGroup } from "@/lib/domain";
import type { Adapter } from "next-auth/adapters";
import { getDb } from "../client";
import {
  accounts,
  eventMembers,
  events,
  invitations,
  membershipLog,
  organisationMembers,
  sessions,
  signInAttempts,
  users,
  verificationTokens,
} from "../schema";

/** next-auth's store of users, accounts and e-mail tokens, on our tables. */
export function authAdapter(): Adapter {
  const tables = {
    usersTable: users,
    accountsTable: accounts,
    sessionsTable: sessions,
    verificationTokensTable: verificationTokens,
  };
  return DrizzleAdapter(getDb(), tables as never) as unknown as Adapter;
}

/** An e-mail sign-in token, stored hashed as next-auth stores its own. */
export async function storeVerificationToken(identifier: string, tokenHash: string, expires: Date): Promise<void> {
  await getDb().insert(verificationTokens).values({ identifier, token: tokenHash, expires });
}

export async function findUserByEmail(email: string) {
  const [row] = await getDb()
    .select()
    .from(users)
    .where(sql`lower(${users.email}) = lower(${email})`)
    .limit(1);
  return row ?? null;
}

export async function findUserById(id: string) {
  const [row] = await getDb()
    .select({
      id: users.id,
      name: users.name,
      email: users.email,
      locale: users.locale,
      isAdmin: users.isAdmin,
      hasPassword: sql<boolean>`${users.passwordHash} IS NOT NULL`,
    })
    .from(users)
    .where(eq(users.id, id))
    .limit(1);
  return row ?? null;
}

export async function setPasswordHash(userId: string, hash: string): Promise<void> {
  await getDb().update(users).set({ passwordHash: hash }).where(eq(users.id, userId));
}

/** The person's current session version (null: no such person, e.g. erased, or an account a site admin locked). */
export async function sessionVersionOf(userId: string): Promise<number | null> {
  if (!/^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i.test(userId)) return null;
  const [row] = await getDb()
    .select({ v: users.sessionVersion, locked: users.lockedAt })
    .from(users)
    .where(eq(users.id, userId))
    .limit(1);
  return row && !row.locked ? row.v : null;
}

/** Ends every session of the person (each token carries the version it was issued with); returns the new version. */
export async function bumpSessionVersion(userId: string): Promise<number | null> {
  const [row] = await getDb()
    .update(users)
    .set({ sessionVersion: sql`${users.sessionVersion} + 1` })
    .where(eq(users.id, userId))
    .returning({ v: users.sessionVersion });
  return row?.v ?? null;
}

/** A new password hash, and every session of the person ended in the same statement; returns the new session version. */
export async function changePassword(userId: string, hash: string): Promise<number> {
  const [row] = await getDb()
    .update(users)
    .set({ passwordHash: hash, sessionVersion: sql`${users.sessionVersion} + 1` })
    .where(eq(users.id, userId))
    .returning({ v: users.sessionVersion });
  return row!.v;
}

export async function passwordHashOf(userId: string): Promise<string | null> {
  const [row] = await getDb().select({ h: users.passwordHash }).from(users).where(eq(users.id, userId)).limit(1);
  return row?.h ?? null;
}

export type EventAccess = {
  eventId: string;
  organisationId: string;
  role: EventRole | null;
  taxonGroups: TaxonGroup[];
  isOrganisationOrganiser: boolean;
};

/** What one person may do in one event: their event role, and whether they organise its organisation. */
export async function eventAccess(userId: string, eventId: string): Promise<EventAccess | null> {
  const [row] = await getDb()
    .select({
      eventId: events.id,
      organisationId: events.organisationId,
      role: eventMembers.role,
      taxonGroups: eventMembers.taxonGroups,
      orgRole: organisationMembers.role,
    })
    .from(events)
    .leftJoin(eventMembers, and(eq(eventMembers.eventId, events.id), eq(eventMembers.userId, userId)))
    .leftJoin(
      organisationMembers,
      and(eq(organisationMembers.organisationId, events.organisationId), eq(organisationMembers.userId, userId)),
    )
    .where(eq(events.id, eventId))
    .limit(1);
  if (!row) return null;
  return {
    eventId: row.eventId,
    organisationId: row.organisationId,
    role: row.role ?? null,
    taxonGroups: row.taxonGroups ?? [],
    isOrganisationOrganiser: row.orgRole === "organiser",
  };
}

export async function isOrganisationOrganiser(userId: string, organisationId: string): Promise<boolean> {
  const [row] = await getDb()
    .select({ role: organisationMembers.role })
    .from(organisationMembers)
    .where(and(eq(organisationMembers.organisationId, organisationId), eq(organisationMembers.userId, userId)))
    .limit(1);
  return row?.role === "organiser";
}

export async function hasPendingInvitation(email: string): Promise<boolean> {
  const [row] = await getDb()
    .select({ id: invitations.id })
    .from(invitations)
    .where(
      and(
        sql`lower(${invitations.email}) = lower(${email})`,
        isNull(invitations.acceptedAt),
        isNull(invitations.revokedAt),
      ),
    )
    .limit(1);
  return Boolean(row);
}

/**
 * Turns every open invitation for this address into an event membership, in one
 * transaction, and logs each. An existing role is changed only by an organiser's
 * invitation, never by a self-service join (a coordinator stays a coordinator).
 */
export async function acceptPendingInvitations(userId: string, email: string): Promise<number> {
  return getDb().transaction(async (tx) => {
    const open = await tx
      .select()
      .from(invitations)
      .where(
        and(
          sql`lower(${invitations.email}) = lower(${email})`,
          isNull(invitations.acceptedAt),
          isNull(invitations.revokedAt),
        ),
      )
      .for("update");
    for (const inv of open) {
      const [current] = await tx
        .select()
        .from(eventMembers)
        .where(and(eq(eventMembers.eventId, inv.eventId), eq(eventMembers.userId, userId)))
        .limit(1);
      const selfService = inv.invitedBy === null;
      if (!current) {
        await tx
          .insert(eventMembers)
          .values({ eventId: inv.eventId, userId, role: inv.role, taxonGroups: inv.taxonGroups });
        await tx.insert(membershipLog).values({
          eventId: inv.eventId,
          subjectEmail: email,
          subjectUserId: userId,
          actorId: inv.invitedBy,
          action: "joined",
          toRole: inv.role,
          taxonGroups: inv.taxonGroups,
        });
      } else if (!selfService && (current.role !== inv.role || current.taxonGroups.join() !== inv.taxonGroups.join())) {
        await tx
          .update(eventMembers)
          .set({ role: inv.role, taxonGroups: inv.taxonGroups })
          .where(and(eq(eventMembers.eventId, inv.eventId), eq(eventMembers.userId, userId)));
        await tx.insert(membershipLog).values({
          eventId: inv.eventId,
          subjectEmail: email,
          subjectUserId: userId,
          actorId: inv.invitedBy,
          action: "role_changed",
          fromRole: current.role,
          toRole: inv.role,
          taxonGroups: inv.taxonGroups,
        });
      }
      // A self-service join carried the published name the person consented to on the join page.
      if (selfService && inv.name)
        await tx
          .update(users)
          .set({ publishedName: inv.name, publishConsentAt: inv.createdAt })
          .where(and(eq(users.id, userId), isNull(users.publishConsentAt), isNull(users.erasedAt)));
      await tx.update(invitations).set({ acceptedAt: new Date() }).where(eq(invitations.id, inv.id));
    }
    return open.length;
  });
}

export async function countRecentAttempts(key: string, since: Date): Promise<number> {
  const [row] = await getDb()
    .select({ n: sql<number>`count(*)::int` })
    .from(signInAttempts)
    .where(and(eq(signInAttempts.key, key), gte(signInAttempts.at, since)));
  return row?.n ?? 0;
}

export async function recordAttempts(keys: string[], pruneBefore: Date): Promise<void> {
  const db = getDb();
  await db.insert(signInAttempts).values(keys.map((key) => ({ key })));
  await db.delete(signInAttempts).where(and(inArray(signInAttempts.key, keys), lt(signInAttempts.at, pruneBefore)));
}

/** Every event role a person holds, with the event's name, for their account page. */
export async function rolesOf(userId: string) {
  return getDb()
    .select({
      eventId: events.id,
      eventName: events.name,
      eventSlug: events.slug,
      role: eventMembers.role,
      taxonGroups: eventMembers.taxonGroups,
    })
    .from(eventMembers)
    .innerJoin(events, eq(events.id, eventMembers.eventId))
    .where(eq(eventMembers.userId, userId))
    .orderBy(events.name);
}
