import "server-only";
import { randomInt } from "node:crypto";
import { and, asc, desc, eq, inArray, isNull, sql } from "drizzle-orm";
import { getDb } from "../client";
import { eventMembers, events, invitations, membershipLog, organisationMembers, organisations, users } from "../schema";
import { enqueueMail, type OutboxMail } from "./mail-queue";
import type { EventRole, EventStatus, SessionKind, TaxonGroup } from "@/lib/domain";

// ---------------------------------------------------------------- organisations and events

/** Organisations the person organises (every organisation for a site admin), with their events. */
export async function organisationsForSetup(userId: string, isAdmin: boolean) {
  const db = getDb();
  const orgs = isAdmin
    ? await db
        .select({ id: organisations.id, name: organisations.name })
        .from(organisations)
        .orderBy(asc(organisations.name))
    : await db
        .select({ id: organisations.id, name: organisations.name })
        .from(organisations)
        .innerJoin(
          organisationMembers,
          and(
            eq(organisationMembers.organisationId, organisations.id),
            eq(organisationMembers.userId, userId),
            eq(organisationMembers.role, "organiser"),
          ),
        )
        .orderBy(asc(organisations.name));
  // Events organised by event role alone (no organisation role) are listed too.
  const rows = await db
    .select({
      id: events.id,
      name: events.name,
      slug: events.slug,
      status: events.status,
      startsAt: events.startsAt,
      timeZone: events.timeZone,
      organisationId: events.organisationId,
    })
    .from(events)
    .where(
      isAdmin
        ? sql`true`
        : sql`${events.organisationId} IN (SELECT organisation_id FROM organisation_members WHERE user_id = ${userId} AND role = 'organiser')
      OR ${events.id} IN (SELECT event_id FROM event_members WHERE user_id = ${userId} AND role = 'organiser')`,
    )
    .orderBy(desc(events.startsAt));
  const extraOrgIds = [...new Set(rows.map((r) => r.organisationId))].filter((id) => !orgs.some((o) => o.id === id));
  const extra = extraOrgIds.length
    ? await db
        .select({ id: organisations.id, name: organisations.name })
        .from(organisations)
        .where(inArray(organisations.id, extraOrgIds))
    : [];
  return [...orgs.map((o) => ({ ...o, canCreate: true })), ...extra.map((o) => ({ ...o, canCreate: false }))].map(
    (o) => ({ ...o, events: rows.filter((e) => e.organisationId === o.id) }),
  );
}

/** Whether the person sets up anything at all (for the "Event setup" link). */
export async function organisesAnything(userId: string): Promise<boolean> {
  const { rows } = await getDb().execute<{ yes: boolean }>(sql`
    SELECT EXISTS (SELECT 1 FROM organisation_members WHERE user_id = ${userId} AND role = 'organiser')
        OR EXISTS (SELECT 1 FROM event_members WHERE user_id = ${userId} AND role = 'organiser') AS yes`);
  return Boolean(rows[0]?.yes);
}

export function newJoinCode(): string {
  // No 0/O or 1/I: people read codes aloud and copy them from paper.
  const alphabet = "ABCDEFGHJKLMNPQRSTUVWXYZ23456789";
  const part = () => Array.from({ length: 4 }, () => alphabet[randomInt(alphabet.length)]).join("");
  return `${part()}-${part()}-${part()}`;
}

export type EventSettings = {
  name: string;
  description: string;
  startsAt: Date;
  endsAt: Date;
  timeZone: string;
  languages: string[];
  sessionKinds: SessionKind[];
  photoRequiredSensitive: boolean;
  photoRequiredOffList: boolean;
  accuracyLimitM: number;
};

/** Creates a draft event; null when the slug is taken. */
export async function createEvent(
  organisationId: string,
  slug: string,
  settings: EventSettings,
): Promise<{ id: string } | null> {
  const [row] = await getDb()
    .insert(events)
    .values({ organisationId, slug, status: "draft", joinCode: newJoinCode(), ...settings })
    .onConflictDoNothing({ target: events.slug })
    .returning({ id: events.id });
  return row ?? null;
}

export async function updateEvent(
  eventId: string,
  settings: EventSettings & { status: EventStatus; dataLicense?: string; publishAbsences?: boolean },
): Promise<void> {
  await getDb().update(events).set(settings).where(eq(events.id, eventId));
}

/**
 * Takes a species off the event's list, unless sightings of the event use it: then the number
 * of those sightings (any review state), and nothing changes. "notListed" when it is not on the list.
 */
export async function removeEventSpecies(eventId: string, taxonId: string): Promise<"removed" | "notListed" | number> {
  return getDb().transaction(async (tx) => {
    // Lock the list row first, so a sighting cannot slip in between the count and the delete's commit.
    const listed = await tx.execute(
      sql`SELECT 1 FROM event_species WHERE event_id = ${eventId} AND taxon_id = ${taxonId} FOR UPDATE`,
    );
    if (!listed.rows.length) return "notListed";
    const [used] = (
      await tx.execute<{ n: number }>(
        sql`SELECT count(*)::int AS n FROM sightings WHERE event_id = ${eventId} AND taxon_id = ${taxonId}`,
      )
    ).rows;
    if (used && used.n > 0) return used.n;
    await tx.execute(sql`DELETE FROM event_species WHERE event_id = ${eventId} AND taxon_id = ${taxonId}`);
    return "removed";
  });
}

export async function eventForSetup(eventId: string) {
  const [row] = await getDb()
    .select({
      id: events.id,
      organisationId: events.organisationId,
      organisationName: organisations.name,
      slug: events.slug,
      name: events.name,
      description: events.description,
      status: events.status,
      startsAt: events.startsAt,
      endsAt: events.endsAt,
      timeZone: events.timeZone,
      languages: events.languages,
      sessionKinds: events.sessionKinds,
      photoRequiredSensitive: events.photoRequiredSensitive,
      photoRequiredOffList: events.photoRequiredOffList,
      accuracyLimitM: events.accuracyLimitM,
      joinCode: events.joinCode,
      dataLicense: events.dataLicense,
      publishAbsences: events.publishAbsences,
    })
    .from(events)
    .innerJoin(organisations, eq(organisations.id, events.organisationId))
    .where(eq(events.id, eventId))
    .limit(1);
  return row ?? null;
}

export async function rotateJoinCode(eventId: string): Promise<string> {
  const code = newJoinCode();
  await getDb().update(events).set({ joinCode: code }).where(eq(events.id, eventId));
  return code;
}

// ---------------------------------------------------------------- people

export async function membersOf(eventId: string) {
  const db = getDb();
  const members = await db
    .select({
      userId: users.id,
      name: users.name,
      email: users.email,
      role: eventMembers.role,
      taxonGroups: eventMembers.taxonGroups,
      since: eventMembers.createdAt,
    })
    .from(eventMembers)
    .innerJoin(users, eq(users.id, eventMembers.userId))
    .where(eq(eventMembers.eventId, eventId))
    .orderBy(asc(eventMembers.role), asc(users.email));
  const pending = await db
    .select({
      id: invitations.id,
      email: invitations.email,
      name: invitations.name,
      role: invitations.role,
      taxonGroups: invitations.taxonGroups,
      createdAt: invitations.createdAt,
      selfService: sql<boolean>`${invitations.invitedBy} IS NULL`,
    })
    .from(invitations)
    .where(and(eq(invitations.eventId, eventId), isNull(invitations.acceptedAt), isNull(invitations.revokedAt)))
    .orderBy(desc(invitations.createdAt));
  const log = await db
    .select({
      id: membershipLog.id,
      at: membershipLog.at,
      action: membershipLog.action,
      subjectEmail: membershipLog.subjectEmail,
      fromRole: membershipLog.fromRole,
      toRole: membershipLog.toRole,
      taxonGroups: membershipLog.taxonGroups,
      actorEmail: users.email,
    })
    .from(membershipLog)
    .leftJoin(users, eq(users.id, membershipLog.actorId))
    .where(eq(membershipLog.eventId, eventId))
    .orderBy(desc(membershipLog.at), desc(membershipLog.id))
    .limit(50);
  return { members, pending, log };
}

export type InviteOutcome = "invited" | "alreadyMember";

/**
 * Records an invitation, its log line and its mail in one transaction: the mail leaves
 * through the outbox only if the invitation was stored. An earlier open invitation for
 * the same address and event is replaced (revoked), so the newest role wins.
 */
export async function inviteToEvent(opts: {
  eventId: string;
  email: string;
  name: string | null;
  role: EventRole;
  taxonGroups: TaxonGroup[];
  actorId: string | null;
  mail: (invitationId: string) => Promise<OutboxMail>;
}): Promise<InviteOutcome> {
  const email = opts.email.trim().toLowerCase();
  return getDb().transaction(async (tx) => {
    const [member] = await tx
      .select({ role: eventMembers.role })
      .from(eventMembers)
      .innerJoin(users, eq(users.id, eventMembers.userId))
      .where(and(eq(eventMembers.eventId, opts.eventId), sql`lower(${users.email}) = ${email}`))
      .limit(1);
    if (member && opts.actorId) return "alreadyMember";
    const open = await tx
      .update(invitations)
      .set({ revokedAt: new Date() })
      .where(
        and(
          eq(invitations.eventId, opts.eventId),
          sql`lower(${invitations.email}) = ${email}`,
          isNull(invitations.acceptedAt),
          isNull(invitations.revokedAt),
          opts.actorId ? sql`true` : isNull(invitations.invitedBy),
        ),
      )
      .returning({ id: invitations.id });
    const [inv] = await tx
      .insert(invitations)
      .values({
        eventId: opts.eventId,
        email,
        name: opts.name,
        role: opts.role,
        taxonGroups: opts.taxonGroups,
        invitedBy: opts.actorId,
      })
      .returning({ id: invitations.id });
    if (opts.actorId || open.length === 0) {
      await tx.insert(membershipLog).values({
        eventId: opts.eventId,
        subjectEmail: email,
        actorId: opts.actorId,
        action: "invited",
        toRole: opts.role,
        taxonGroups: opts.taxonGroups,
      });
    }
    await enqueueMail([await opts.mail(inv!.id)], tx as never);
    return "invited";
  });
}

export async function revokeInvitation(eventId: string, invitationId: string, actorId: string): Promise<boolean> {
  return getDb().transaction(async (tx) => {
    const [inv] = await tx
      .update(invitations)
      .set({ revokedAt: new Date() })
      .where(
        and(
          eq(invitations.id, invitationId),
          eq(invitations.eventId, eventId),
          isNull(invitations.acceptedAt),
          isNull(invitations.revokedAt),
        ),
      )
      .returning();
    if (!inv) return false;
    await tx
      .insert(membershipLog)
      .values({ eventId, subjectEmail: inv.email, actorId, action: "invitation_revoked", fromRole: inv.role });
    return true;
  });
}

export type MemberChange = "changed" | "unchanged" | "notMember";

export async function changeMemberRole(
  eventId: string,
  userId: string,
  role: EventRole,
  taxonGroups: TaxonGroup[],
  actorId: string,
): Promise<MemberChange> {
  return getDb().transaction(async (tx) => {
    const [current] = await tx
      .select({ role: eventMembers.role, taxonGroups: eventMembers.taxonGroups, email: users.email })
      .from(eventMembers)
      .innerJoin(users, eq(users.id, eventMembers.userId))
      .where(and(eq(eventMembers.eventId, eventId), eq(eventMembers.userId, userId)))
      .for("update")
      .limit(1);
    if (!current) return "notMember";
    const groups = role === "coordinator" ? [...new Set(taxonGroups)].sort() : [];
    if (current.role === role && [...current.taxonGroups].sort().join() === groups.join()) return "unchanged";
    await tx
      .update(eventMembers)
      .set({ role, taxonGroups: groups })
      .where(and(eq(eventMembers.eventId, eventId), eq(eventMembers.userId, userId)));
    await tx.insert(membershipLog).values({
      eventId,
      subjectEmail: current.email,
      subjectUserId: userId,
      actorId,
      action: "role_changed",
      fromRole: current.role,
      toRole: role,
      taxonGroups: groups,
    });
    return "changed";
  });
}

export async function removeMember(eventId: string, userId: string, actorId: string): Promise<boolean> {
  return getDb().transaction(async (tx) => {
    const [gone] = await tx
      .delete(eventMembers)
      .where(and(eq(eventMembers.eventId, eventId), eq(eventMembers.userId, userId)))
      .returning();
    if (!gone) return false;
    const [who] = await tx.select({ email: users.email }).from(users).where(eq(users.id, userId)).limit(1);
    await tx.insert(membershipLog).values({
      eventId,
      subjectEmail: who?.email ?? "",
      subjectUserId: userId,
      actorId,
      action: "removed",
      fromRole: gone.role,
      taxonGroups: gone.taxonGroups,
    });
    return true;
  });
}

// ---------------------------------------------------------------- joining with a code

export async function eventByJoinCode(code: string) {
  const [row] = await getDb()
    .select({
      id: events.id,
      name: events.name,
      slug: events.slug,
      status: events.status,
      organisationName: organisations.name,
      description: events.description,
      startsAt: events.startsAt,
      endsAt: events.endsAt,
      timeZone: events.timeZone,
      zoneNames: sql<
        string[]
      >`coalesce((SELECT array_agg(z.name ORDER BY z.name) FROM zones z WHERE z.event_id = ${events.id}), ARRAY[]::text[])`,
    })
    .from(events)
    .innerJoin(organisations, eq(organisations.id, events.organisationId))
    .where(sql`upper(${events.joinCode}) = upper(${code.trim()})`)
    .limit(1);
  return row ?? null;
}

/** A signed-in person joins as a volunteer; an existing role is kept as it is. */
export async function joinAsVolunteer(
  eventId: string,
  userId: string,
  email: string,
): Promise<"joined" | "alreadyMember"> {
  return getDb().transaction(async (tx) => {
    const [made] = await tx
      .insert(eventMembers)
      .values({ eventId, userId, role: "volunteer" })
      .onConflictDoNothing()
      .returning();
    if (!made) return "alreadyMember";
    await tx.insert(membershipLog).values({
      eventId,
      subjectEmail: email,
      subjectUserId: userId,
      actorId: userId,
      action: "joined",
      toRole: "volunteer",
    });
    return "joined";
  });
}
