import "server-only";
import { randomBytes } from "node:crypto";
import { and, eq, sql } from "drizzle-orm";
import { getDb } from "../client";
import { users } from "../schema";
import type { MyData, MySightingRow } from "@/lib/account/my-data";

export type { MyData } from "@/lib/account/my-data";

// A volunteer's own data: what is published about them (a name they choose, with their
// consent), everything the site holds about them (for download), and erasure.

/** The name the person chose to be published under, and when they agreed to it. */
export async function publishedNameOf(userId: string): Promise<{ name: string | null; consentAt: Date | null }> {
  const [row] = await getDb()
    .select({ name: users.publishedName, consentAt: users.publishConsentAt })
    .from(users)
    .where(eq(users.id, userId))
    .limit(1);
  return { name: row?.name ?? null, consentAt: row?.consentAt ?? null };
}

/** Stores the published name together with the time of consent (the two always go together). */
export async function setPublishedName(userId: string, name: string): Promise<void> {
  await getDb()
    .update(users)
    .set({ publishedName: name, publishConsentAt: new Date() })
    .where(and(eq(users.id, userId), sql`${users.erasedAt} IS NULL`));
}

const iso = (d: Date | string | null) => (d === null ? null : new Date(d).toISOString());

/** Everything the site holds about one person, for their own download. */
export async function myData(userId: string): Promise<MyData | null> {
  const db = getDb();
  const [u] = (
    await db.execute<{
      id: string;
      email: string;
      name: string | null;
      published_name: string | null;
      publish_consent_at: string | null;
      locale: string;
      has_password: boolean;
      email_verified: string | null;
      created_at: string;
    }>(sql`SELECT id, email, name, published_name, publish_consent_at, locale, password_hash IS NOT NULL AS has_password,
             email_verified, created_at FROM users WHERE id = ${userId} AND erased_at IS NULL`)
  ).rows;
  if (!u) return null;
  const email = u.email.toLowerCase();
  const [roles, orgRoles, log, invites, sessions, sights, made] = await Promise.all([
    db.execute<{ event: string; slug: string; role: string; groups: string[]; since: string }>(sql`
      SELECT e.name AS event, e.slug, m.role::text AS role, m.taxon_groups::text[] AS groups, m.created_at AS since
      FROM event_members m JOIN events e ON e.id = m.event_id WHERE m.user_id = ${userId} ORDER BY e.name`),
    db.execute<{ organisation: string; role: string }>(sql`
      SELECT o.name AS organisation, m.role::text AS role
      FROM organisation_members m JOIN organisations o ON o.id = m.organisation_id WHERE m.user_id = ${userId} ORDER BY o.name`),
    db.execute<{ event: string; action: string; from_role: string | null; to_role: string | null; at: string }>(sql`
      SELECT e.name AS event, l.action::text AS action, l.from_role::text AS from_role, l.to_role::text AS to_role, l.at
      FROM membership_log l JOIN events e ON e.id = l.event_id
      WHERE l.subject_user_id = ${userId} OR lower(l.subject_email) = ${email} ORDER BY l.at, l.id`),
    db.execute<{
      event: string;
      name: string | null;
      role: string;
      created_at: string;
      accepted_at: string | null;
    }>(sql`
      SELECT e.name AS event, i.name, i.role::text AS role, i.created_at, i.accepted_at
      FROM invitations i JOIN events e ON e.id = i.event_id WHERE lower(i.email) = ${email} ORDER BY i.created_at`),
    db.execute<{
      id: string;
      event: string;
      kind: string;
      zone: string | null;
      started_at: string;
      ended_at: string | null;
      all_species_noted: boolean;
      distance_m: number | null;
      notes: string;
    }>(sql`
      SELECT c.id, e.name AS event, c.kind::text AS kind, z.name AS zone, c.started_at, c.ended_at, c.all_species_noted,
             c.distance_m::float8 AS distance_m, c.notes
      FROM count_sessions c JOIN events e ON e.id = c.event_id LEFT JOIN zones z ON z.id = c.zone_id
      WHERE c.user_id = ${userId} ORDER BY c.started_at, c.id`),
    db.execute<{
      id: string;
      event: string;
      slug: string;
      scientific_name: string | null;
      description: string;
      count: number;
      count_is_estimate: boolean;
      observed_at: string;
      lat: number;
      lon: number;
      accuracy_m: number;
      zone: string | null;
      session_id: string | null;
      notes: string;
      review_state: string;
      created_at: string;
      photos: MySightingRow["photos"] | null;
      decisions: (Omit<MySightingRow["decisions"][number], "decidedAt"> & { decidedAt: string })[] | null;
    }>(sql`
      SELECT s.id, e.name AS event, e.slug, t.scientific_name, s.description, s.count, s.count_is_estimate, s.observed_at,
             ST_Y(s.location) AS lat, ST_X(s.location) AS lon, s.accuracy_m::float8 AS accuracy_m, z.name AS zone,
             s.session_id, s.notes, s.review_state::text AS review_state, s.created_at,
             (SELECT json_agg(json_build_object('id', p.id, 'contentType', p.content_type, 'sizeBytes', p.size_bytes,
                      'sha256', p.sha256) ORDER BY p.created_at, p.id)
                FROM photos p WHERE p.sighting_id = s.id AND p.event_id = s.event_id) AS photos,
             (SELECT json_agg(json_build_object('decidedAt', r.decided_at, 'fromState', r.from_state, 'toState', r.to_state,
                      'fromTaxon', ft.scientific_name, 'toTaxon', tt.scientific_name, 'reason', r.reason, 'message', r.message)
                      ORDER BY r.decided_at, r.id)
                FROM reviews r LEFT JOIN taxa ft ON ft.id = r.from_taxon_id LEFT JOIN taxa tt ON tt.id = r.to_taxon_id
                WHERE r.sighting_id = s.id AND r.event_id = s.event_id) AS decisions
      FROM sightings s JOIN events e ON e.id = s.event_id LEFT JOIN taxa t ON t.id = s.taxon_id
      LEFT JOIN zones z ON z.id = s.zone_id
      WHERE s.user_id = ${userId} ORDER BY s.observed_at, s.id`),
    db.execute<{ sighting_id: string; decided_at: string; from_state: string; to_state: string; reason: string }>(sql`
      SELECT r.sighting_id, r.decided_at, r.from_state::text AS from_state, r.to_state::text AS to_state, r.reason
      FROM reviews r JOIN sightings s ON s.id = r.sighting_id AND s.event_id = r.event_id
      WHERE r.reviewer_id = ${userId} AND s.user_id <> ${userId} ORDER BY r.decided_at, r.id`),
  ]);
  return {
    exportedAt: new Date().toISOString(),
    account: {
      id: u.id,
      email: u.email,
      name: u.name,
      publishedName: u.published_name,
      publishConsentAt: iso(u.publish_consent_at),
      locale: u.locale,
      hasPassword: u.has_password,
      emailVerifiedAt: iso(u.email_verified),
      createdAt: iso(u.created_at)!,
    },
    eventRoles: roles.rows.map((r) => ({
      event: r.event,
      eventSlug: r.slug,
      role: r.role,
      taxonGroups: r.groups,
      since: iso(r.since)!,
    })),
    organisationRoles: orgRoles.rows,
    membershipLog: log.rows.map((r) => ({
      event: r.event,
      action: r.action,
      fromRole: r.from_role,
      toRole: r.to_role,
      at: iso(r.at)!,
    })),
    invitations: invites.rows.map((r) => ({
      event: r.event,
      name: r.name,
      role: r.role,
      createdAt: iso(r.created_at)!,
      acceptedAt: iso(r.accepted_at),
    })),
    countSessions: sessions.rows.map((r) => ({
      id: r.id,
      event: r.event,
      kind: r.kind,
      zone: r.zone,
      startedAt: iso(r.started_at)!,
      endedAt: iso(r.ended_at),
      allSpeciesNoted: r.all_species_noted,
      distanceM: r.distance_m,
      notes: r.notes,
    })),
    sightings: sights.rows.map((r) => ({
      id: r.id,
      event: r.event,
      eventSlug: r.slug,
      scientificName: r.scientific_name,
      description: r.description,
      count: r.count,
      countIsEstimate: r.count_is_estimate,
      observedAt: iso(r.observed_at)!,
      latitude: r.lat,
      longitude: r.lon,
      accuracyM: r.accuracy_m,
      zone: r.zone,
      sessionId: r.session_id,
      notes: r.notes,
      reviewState: r.review_state,
      receivedAt: iso(r.created_at)!,
      photos: r.photos ?? [],
      decisions: (r.decisions ?? []).map((d) => ({ ...d, decidedAt: iso(d.decidedAt)! })),
    })),
    decisionsMade: made.rows.map((r) => ({
      sightingId: r.sighting_id,
      decidedAt: iso(r.decided_at)!,
      fromState: r.from_state,
      toState: r.to_state,
      reason: r.reason,
    })),
  };
}

/**
 * Erases a person's account. Their e-mail, name and every way to sign in go; the users row
 * stays as a tombstone (an unusable address under .invalid, a random recorder name, erased_at
 * set) so that their sightings, count sessions and the append-only review history keep
 * pointing at a row, and published reports re-compute exactly as before (they never held who
 * recorded what). The session version rises, so every token already issued stops working.
 * The membership, organisation and admin logs stay append-only: their rows are only redacted
 * to the tombstone address, the one change their triggers allow (migrations 0012 and 0018).
 * `byAdmin`: a site admin erases the account from the console; the admin log says so, naming
 * the tombstone, never the erased address.
 */
export async function eraseAccount(
  userId: string,
  byAdmin?: { adminId: string; reason: string },
): Promise<{ recorder: string } | null> {
  return getDb().transaction(async (tx) => {
    const [u] = (
      await tx.execute<{ email: string }>(
        sql`SELECT email FROM users WHERE id = ${userId} AND erased_at IS NULL FOR UPDATE`,
      )
    ).rows;
    if (!u) return null;
    const email = u.email.toLowerCase();
    const tag = randomBytes(6).toString("hex");
    const recorder = `recorder-${tag.slice(0, 8)}`;
    const tombstone = `erased-${tag}@erased.invalid`; // RFC 2606: .invalid never resolves
    await tx.execute(sql`
      UPDATE users SET email = ${tombstone}, name = NULL, image = NULL, password_hash = NULL, email_verified = NULL,
        is_admin = false, published_name = ${recorder}, publish_consent_at = NULL, erased_at = now(),
        session_version = session_version + 1
      WHERE id = ${userId}`);
    await tx.execute(sql`SELECT set_config('ecotone.erased_email', ${email}, true)`);
    await tx.execute(sql`
      UPDATE membership_log SET subject_email = ${tombstone}, subject_user_id = ${userId}
      WHERE subject_user_id = ${userId} OR (subject_user_id IS NULL AND lower(subject_email) = ${email})`);
    for (const log of [sql`organisation_log`, sql`admin_log`])
      await tx.execute(sql`
        UPDATE ${log} SET subject_email = ${tombstone}, subject_user_id = ${userId}
        WHERE subject_user_id = ${userId} OR (subject_user_id IS NULL AND lower(subject_email) = ${email})`);
    if (byAdmin)
      await tx.execute(sql`
        INSERT INTO admin_log (actor_id, action, subject_user_id, subject_email, reason)
        VALUES (${byAdmin.adminId}, 'account_erased', ${userId}, ${tombstone}, ${byAdmin.reason})`);
    // Roles end, and the log says so (the subject being the tombstone).
    await tx.execute(sql`
      INSERT INTO membership_log (event_id, subject_email, subject_user_id, actor_id, action, from_role, taxon_groups)
      SELECT event_id, ${tombstone}, ${userId}, ${userId}, 'removed', role, taxon_groups FROM event_members WHERE user_id = ${userId}`);
    await tx.execute(sql`DELETE FROM event_members WHERE user_id = ${userId}`);
    await tx.execute(sql`DELETE FROM organisation_members WHERE user_id = ${userId}`);
    await tx.execute(sql`DELETE FROM accounts WHERE user_id = ${userId}`);
    await tx.execute(sql`DELETE FROM sessions WHERE user_id = ${userId}`);
    await tx.execute(sql`DELETE FROM verification_tokens WHERE lower(identifier) = ${email}`);
    await tx.execute(sql`DELETE FROM invitations WHERE lower(email) = ${email}`);
    await tx.execute(sql`DELETE FROM sign_in_attempts WHERE key = ${`email:${email}`}`);
    await tx.execute(sql`DELETE FROM review_notices WHERE volunteer_id = ${userId}`);
    await tx.execute(sql`DELETE FROM email_outbox WHERE lower(to_address) = ${email}`);
    return { recorder };
  });
}
