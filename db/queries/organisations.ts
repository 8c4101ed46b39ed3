import "server-only";
import { and, desc, eq, sql } from "drizzle-orm";
import type { EventRole, OrganisationRequestState, TaxonGroup } from "@/lib/domain";
import { getDb } from "../client";
import { organisationLog, organisationMembers, organisationRequests, organisations, users } from "../schema";
import { enqueueMail, type OutboxMail } from "./mail-queue";

// Organisations that start on their own: a signed-in person asks, the site admin approves
// (the organisation is made and the person becomes its first organiser) or declines with
// a reason; organisers then add and remove organisers, never leaving none, and see every
// event's members. Every change is a row of the append-only organisation_log, written in the
// same transaction.

type Tx = Parameters<Parameters<ReturnType<typeof getDb>["transaction"]>[0]>[0];

export type OrganisationRequestInput = { name: string; contactEmail: string; country: string; description: string };

/** The site admins' addresses and languages, for the mail about a new request. */
export async function siteAdmins(): Promise<{ email: string; locale: string }[]> {
  return getDb()
    .select({ email: users.email, locale: users.locale })
    .from(users)
    .where(and(eq(users.isAdmin, true), sql`${users.lockedAt} IS NULL`));
}

/** Stores the request, its log row and the admins' mails together; returns the request's id. */
export async function requestOrganisation(
  userId: string,
  input: OrganisationRequestInput,
  mails: OutboxMail[],
): Promise<string> {
  return getDb().transaction(async (tx) => {
    const [req] = await tx
      .insert(organisationRequests)
      .values({ requestedBy: userId, ...input })
      .returning({ id: organisationRequests.id });
    await tx.insert(organisationLog).values({ requestId: req!.id, action: "requested", actorId: userId });
    await enqueueMail(mails, tx as never);
    return req!.id;
  });
}

const requestColumns = {
  id: organisationRequests.id,
  name: organisationRequests.name,
  contactEmail: organisationRequests.contactEmail,
  country: organisationRequests.country,
  description: organisationRequests.description,
  state: organisationRequests.state,
  reason: organisationRequests.reason,
  organisationId: organisationRequests.organisationId,
  createdAt: organisationRequests.createdAt,
  decidedAt: organisationRequests.decidedAt,
  requestedBy: organisationRequests.requestedBy,
  requesterEmail: users.email,
  requesterName: users.name,
};
export type OrganisationRequestRow = Awaited<ReturnType<typeof listOrganisationRequests>>[number];

/** A person's own requests, newest first. */
export async function myOrganisationRequests(userId: string) {
  return getDb()
    .select(requestColumns)
    .from(organisationRequests)
    .innerJoin(users, eq(users.id, organisationRequests.requestedBy))
    .where(eq(organisationRequests.requestedBy, userId))
    .orderBy(desc(organisationRequests.createdAt));
}

/** Requests for the admin console: pending first (oldest first), then decided ones, newest first. */
export async function listOrganisationRequests(state?: OrganisationRequestState) {
  return getDb()
    .select(requestColumns)
    .from(organisationRequests)
    .innerJoin(users, eq(users.id, organisationRequests.requestedBy))
    .where(state ? eq(organisationRequests.state, state) : sql`true`)
    .orderBy(
      sql`${organisationRequests.state} = 'pending' DESC`,
      sql`CASE WHEN ${organisationRequests.state} = 'pending' THEN ${organisationRequests.createdAt} END ASC`,
      desc(organisationRequests.createdAt),
    )
    .limit(200);
}

/** A free slug from a name: "Friends of the Vale" → friends-of-the-vale, then -2, -3 … */
async function freeSlug(tx: Tx, name: string): Promise<string> {
  const base =
    name
      .normalize("NFKD")
      .replace(/[\u0300-\u036f]/g, "")
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, "-")
      .replace(/^-+|-+$/g, "")
      .slice(0, 70) || "organisation";
  const { rows } = await tx.execute<{ slug: string }>(
    sql`SELECT slug FROM organisations WHERE slug = ${base} OR slug LIKE ${`${base}-%`}`,
  );
  const taken = new Set(rows.map((r) => r.slug));
  if (!taken.has(base)) return base;
  for (let n = 2; ; n++) if (!taken.has(`${base}-${n}`)) return `${base}-${n}`;
}

export type Decision =
  | { ok: true; organisationId: string | null; request: OrganisationRequestRow }
  | { ok: false; reason: "not_found" | "already_decided" };

/**
 * Approves or declines a pending request (the site admin). On approval the organisation
 * is made and the requester becomes its first organiser. `mail` writes the requester's
 * mail from the decided request; it goes to the outbox in the same transaction.
 */
export async function decideOrganisationRequest(
  adminId: string,
  requestId: string,
  decision: "approve" | "decline",
  reason: string,
  mail: (request: OrganisationRequestRow, locale: string) => OutboxMail,
): Promise<Decision> {
  return getDb().transaction(async (tx) => {
    const { rows } = await tx.execute<{ state: OrganisationRequestState }>(
      sql`SELECT state FROM organisation_requests WHERE id = ${requestId} FOR UPDATE`,
    );
    if (!rows[0]) return { ok: false, reason: "not_found" } as const;
    if (rows[0].state !== "pending") return { ok: false, reason: "already_decided" } as const;
    const [req] = await tx
      .select({ ...requestColumns, locale: users.locale })
      .from(organisationRequests)
      .innerJoin(users, eq(users.id, organisationRequests.requestedBy))
      .where(eq(organisationRequests.id, requestId));
    let organisationId: string | null = null;
    if (decision === "approve") {
      const [org] = await tx
        .insert(organisations)
        .values({
          slug: await freeSlug(tx, req!.name),
          name: req!.name,
          contactEmail: req!.contactEmail,
          country: req!.country,
          description: req!.description,
        })
        .returning({ id: organisations.id });
      organisationId = org!.id;
      await tx.insert(organisationMembers).values({ organisationId, userId: req!.requestedBy, role: "organiser" });
      await tx.insert(organisationLog).values([
        { organisationId, requestId, action: "approved", actorId: adminId, reason },
        {
          organisationId,
          requestId,
          action: "organiser_added",
          actorId: adminId,
          subjectUserId: req!.requestedBy,
          subjectEmail: req!.requesterEmail,
        },
      ]);
    } else {
      await tx.insert(organisationLog).values({ requestId, action: "declined", actorId: adminId, reason });
    }
    const decidedAt = new Date();
    await tx
      .update(organisationRequests)
      .set({
        state: decision === "approve" ? "approved" : "declined",
        decidedBy: adminId,
        decidedAt,
        reason,
        organisationId,
      })
      .where(eq(organisationRequests.id, requestId));
    const { locale, ...row } = req!;
    const decided: OrganisationRequestRow = {
      ...row,
      state: decision === "approve" ? "approved" : "declined",
      reason,
      organisationId,
      decidedAt,
    };
    await enqueueMail([mail(decided, locale)], tx as never);
    return { ok: true, organisationId, request: decided } as const;
  });
}

// ---------------------------------------------------------------- an organisation's organisers

export async function organisationById(organisationId: string) {
  const [row] = await getDb().select().from(organisations).where(eq(organisations.id, organisationId)).limit(1);
  return row ?? null;
}

export async function listOrganisers(organisationId: string) {
  return getDb()
    .select({ userId: users.id, email: users.email, name: users.name, since: organisationMembers.createdAt })
    .from(organisationMembers)
    .innerJoin(users, eq(users.id, organisationMembers.userId))
    .where(and(eq(organisationMembers.organisationId, organisationId), eq(organisationMembers.role, "organiser")))
    .orderBy(organisationMembers.createdAt, users.email);
}

export type OrganiserChange =
  { ok: true } | { ok: false; reason: "no_account" | "already_organiser" | "not_organiser" | "last_organiser" };

/** Adds the person with this address (an account must exist) as an organiser. */
export async function addOrganiser(actorId: string, organisationId: string, email: string): Promise<OrganiserChange> {
  return getDb().transaction(async (tx) => {
    const [person] = await tx
      .select({ id: users.id, email: users.email })
      .from(users)
      .where(sql`lower(${users.email}) = lower(${email})`)
      .limit(1);
    if (!person) return { ok: false, reason: "no_account" } as const;
    const added = await tx
      .insert(organisationMembers)
      .values({ organisationId, userId: person.id, role: "organiser" })
      .onConflictDoNothing()
      .returning({ userId: organisationMembers.userId });
    if (!added.length) return { ok: false, reason: "already_organiser" } as const;
    await tx.insert(organisationLog).values({
      organisationId,
      action: "organiser_added",
      actorId,
      subjectUserId: person.id,
      subjectEmail: person.email,
    });
    return { ok: true } as const;
  });
}

/** Removes an organiser (themselves included), never the last one: the organisation's rows are locked while counting. */
export async function removeOrganiser(
  actorId: string,
  organisationId: string,
  userId: string,
): Promise<OrganiserChange> {
  return getDb().transaction(async (tx) => {
    const { rows } = await tx.execute<{ user_id: string; email: string }>(sql`
      SELECT m.user_id, u.email FROM organisation_members m JOIN users u ON u.id = m.user_id
      WHERE m.organisation_id = ${organisationId} AND m.role = 'organiser' FOR UPDATE OF m`);
    const subject = rows.find((r) => r.user_id === userId);
    if (!subject) return { ok: false, reason: "not_organiser" } as const;
    if (rows.length <= 1) return { ok: false, reason: "last_organiser" } as const;
    await tx
      .delete(organisationMembers)
      .where(and(eq(organisationMembers.organisationId, organisationId), eq(organisationMembers.userId, userId)));
    await tx.insert(organisationLog).values({
      organisationId,
      action: "organiser_removed",
      actorId,
      subjectUserId: userId,
      subjectEmail: subject.email,
    });
    return { ok: true } as const;
  });
}

/** Suspends or reinstates an organisation (the site admin), with the reason in the log. */
export async function setOrganisationSuspended(
  adminId: string,
  organisationId: string,
  suspended: boolean,
  reason: string,
): Promise<boolean> {
  return getDb().transaction(async (tx) => {
    const changed = await tx
      .update(organisations)
      .set({ suspendedAt: suspended ? new Date() : null })
      .where(
        and(
          eq(organisations.id, organisationId),
          suspended ? sql`${organisations.suspendedAt} IS NULL` : sql`${organisations.suspendedAt} IS NOT NULL`,
        ),
      )
      .returning({ id: organisations.id });
    if (!changed.length) return false;
    await tx
      .insert(organisationLog)
      .values({ organisationId, action: suspended ? "suspended" : "reinstated", actorId: adminId, reason });
    return true;
  });
}

export async function isOrganisationSuspended(organisationId: string): Promise<boolean> {
  const [row] = await getDb()
    .select({ s: organisations.suspendedAt })
    .from(organisations)
    .where(eq(organisations.id, organisationId))
    .limit(1);
  return !!row?.s;
}

/** The organisation's log, newest first (with who acted). */
export async function organisationLogOf(organisationId: string, limit = 100) {
  const { rows } = await getDb().execute<{
    id: number;
    action: string;
    actorEmail: string | null;
    subjectEmail: string | null;
    reason: string;
    at: string;
  }>(sql`
    SELECT l.id::int AS id, l.action, a.email AS "actorEmail", l.subject_email AS "subjectEmail", l.reason, l.at
    FROM organisation_log l LEFT JOIN users a ON a.id = l.actor_id
    WHERE l.organisation_id = ${organisationId} OR l.request_id IN (SELECT id FROM organisation_requests WHERE organisation_id = ${organisationId})
    ORDER BY l.at DESC, l.id DESC LIMIT ${limit}`);
  return rows;
}

/** Every event of the organisation with its members (role, taxon groups), for its organisers. */
export async function organisationEventMembers(organisationId: string) {
  const { rows } = await getDb().execute<{
    eventId: string;
    slug: string;
    eventName: string;
    members: { userId: string; email: string; name: string | null; role: EventRole; taxonGroups: TaxonGroup[] }[];
  }>(sql`
    SELECT e.id AS "eventId", e.slug, e.name AS "eventName",
      coalesce(json_agg(json_build_object('userId', u.id, 'email', u.email, 'name', u.name, 'role', m.role,
          'taxonGroups', m.taxon_groups)
        ORDER BY array_position(ARRAY['organiser', 'coordinator', 'volunteer']::event_role[], m.role), u.email)
        FILTER (WHERE m.user_id IS NOT NULL), '[]') AS members
    FROM events e
      LEFT JOIN event_members m ON m.event_id = e.id
      LEFT JOIN users u ON u.id = m.user_id
    WHERE e.organisation_id = ${organisationId}
    GROUP BY e.id ORDER BY e.starts_at DESC, e.name`);
  return rows;
}
