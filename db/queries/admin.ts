import "server-only";
import { eq, sql } from "drizzle-orm";
import { getDb } from "../client";
import { adminLog, emailOutbox, users, workerRuns } from "../schema";

// The site admin console's reads and its actions on people and mails. Every action writes
// its row of the append-only admin_log in the same transaction.

export async function listOrganisationsForAdmin() {
  const { rows } = await getDb().execute<{
    id: string;
    name: string;
    slug: string;
    country: string | null;
    contactEmail: string;
    suspendedAt: string | null;
    organisers: number;
    events: number;
  }>(sql`
    SELECT o.id, o.name, o.slug, o.country, o.contact_email AS "contactEmail", o.suspended_at AS "suspendedAt",
      (SELECT count(*)::int FROM organisation_members m WHERE m.organisation_id = o.id AND m.role = 'organiser') AS organisers,
      (SELECT count(*)::int FROM events e WHERE e.organisation_id = o.id) AS events
    FROM organisations o ORDER BY o.name`);
  return rows;
}

const likeEscape = (s: string) => s.replace(/[\\%_]/g, (c) => `\\${c}`);

/** People whose address or name contains `q` (all when empty), newest first, at most 50. */
export async function searchPeople(q: string) {
  const pattern = `%${likeEscape(q.trim().toLowerCase())}%`;
  const { rows } = await getDb().execute<{
    id: string;
    email: string;
    name: string | null;
    isAdmin: boolean;
    lockedAt: string | null;
    erasedAt: string | null;
    createdAt: string;
  }>(sql`
    SELECT id, email, name, is_admin AS "isAdmin", locked_at AS "lockedAt", erased_at AS "erasedAt",
      created_at AS "createdAt" FROM users
    WHERE lower(email) LIKE ${pattern} OR lower(coalesce(name, '')) LIKE ${pattern}
    ORDER BY created_at DESC, email LIMIT 50`);
  return rows;
}

/** The account's address, when it exists and is not erased yet (the admin's erasure confirms it). */
export async function liveAccountEmail(userId: string): Promise<string | null> {
  const [u] = await getDb()
    .select({ email: users.email })
    .from(users)
    .where(sql`${users.id} = ${userId} AND ${users.erasedAt} IS NULL`);
  return u?.email ?? null;
}

/** Locks (sessions end at once: no session version while locked) or unlocks an account. */
export async function setAccountLocked(adminId: string, userId: string, locked: boolean, reason: string) {
  return getDb().transaction(async (tx) => {
    const changed = await tx
      .update(users)
      .set({ lockedAt: locked ? new Date() : null, sessionVersion: sql`${users.sessionVersion} + 1` })
      .where(sql`${users.id} = ${userId} AND (${users.lockedAt} IS NULL) = ${locked}`)
      .returning({ email: users.email });
    if (!changed.length) return false;
    await tx.insert(adminLog).values({
      actorId: adminId,
      action: locked ? "account_locked" : "account_unlocked",
      subjectUserId: userId,
      subjectEmail: changed[0]!.email,
      reason,
    });
    return true;
  });
}

/** Ends every session of the person (users.session_version, as sign-out does). */
export async function endSessionsOf(adminId: string, userId: string) {
  return getDb().transaction(async (tx) => {
    const changed = await tx
      .update(users)
      .set({ sessionVersion: sql`${users.sessionVersion} + 1` })
      .where(eq(users.id, userId))
      .returning({ email: users.email });
    if (!changed.length) return false;
    await tx
      .insert(adminLog)
      .values({ actorId: adminId, action: "sessions_ended", subjectUserId: userId, subjectEmail: changed[0]!.email });
    return true;
  });
}

export async function listAllEvents() {
  const { rows } = await getDb().execute<{
    id: string;
    slug: string;
    name: string;
    status: string;
    startsAt: string;
    timeZone: string;
    organisation: string;
    sightings: number;
  }>(sql`
    SELECT e.id, e.slug, e.name, e.status, e.starts_at AS "startsAt", e.time_zone AS "timeZone", o.name AS organisation,
      (SELECT count(*)::int FROM sightings s WHERE s.event_id = e.id) AS sightings
    FROM events e JOIN organisations o ON o.id = e.organisation_id ORDER BY e.starts_at DESC`);
  return rows;
}

/** Photo storage used by each organisation: the photos stored for its events' sightings (photos.size_bytes), largest first. */
export async function photoStorageByOrganisation() {
  const { rows } = await getDb().execute<{ id: string; name: string; photos: number; bytes: number }>(sql`
    SELECT o.id, o.name, count(p.id)::int AS photos, coalesce(sum(p.size_bytes), 0)::float8 AS bytes
    FROM organisations o
      LEFT JOIN events e ON e.organisation_id = o.id
      LEFT JOIN sightings s ON s.event_id = e.id
      LEFT JOIN photos p ON p.sighting_id = s.id AND p.event_id = s.event_id
    GROUP BY o.id, o.name ORDER BY bytes DESC, o.name`);
  return rows;
}

/** A mail "sending" for longer than this is stuck (the worker requeues it after 10 minutes too). */
export const STUCK_MINUTES = 10;

/** The e-mail outbox: counts by status, and the mails that need a look (failed, stuck or long queued). */
export async function mailQueueState() {
  const db = getDb();
  const [counts, troubled, runs] = await Promise.all([
    db.execute<{ status: string; n: number }>(sql`SELECT status, count(*)::int AS n FROM email_outbox GROUP BY status`),
    db.execute<{
      id: number;
      toAddress: string;
      kind: string;
      subject: string;
      status: string;
      attempts: number;
      lastError: string | null;
      sendAfter: string;
      createdAt: string;
      stuck: boolean;
    }>(sql`
      SELECT id::int AS id, to_address AS "toAddress", kind, subject, status, attempts, last_error AS "lastError",
        send_after AS "sendAfter", created_at AS "createdAt",
        (status = 'sending' AND send_after < now() - make_interval(mins => ${STUCK_MINUTES})) AS stuck
      FROM email_outbox
      WHERE status = 'failed'
         OR (status = 'sending' AND send_after < now() - make_interval(mins => ${STUCK_MINUTES}))
         OR (status = 'queued' AND send_after < now() - make_interval(mins => ${STUCK_MINUTES}))
      ORDER BY created_at DESC LIMIT 100`),
    db.select().from(workerRuns),
  ]);
  return {
    counts: Object.fromEntries(counts.rows.map((r) => [r.status, r.n])) as Record<string, number>,
    troubled: troubled.rows,
    worker: runs.find((r) => r.worker === "mail") ?? null,
  };
}

/** Puts a failed or stuck mail back in the queue now, with its tries counted afresh. */
export async function retryMail(adminId: string, mailId: number) {
  return getDb().transaction(async (tx) => {
    const changed = await tx
      .update(emailOutbox)
      .set({ status: "queued", attempts: 0, sendAfter: new Date() })
      .where(sql`${emailOutbox.id} = ${mailId} AND ${emailOutbox.status} IN ('failed', 'sending', 'queued')`)
      .returning({ to: emailOutbox.toAddress, lastError: emailOutbox.lastError });
    if (!changed.length) return false;
    await tx.insert(adminLog).values({
      actorId: adminId,
      action: "mail_retried",
      mailId,
      subjectEmail: changed[0]!.to,
      reason: changed[0]!.lastError ?? "",
    });
    return true;
  });
}

// ---------------------------------------------------------------- the audit view
export const AUDIT_SOURCES = ["memberships", "organisations", "decisions", "publications", "admin"] as const;
export type AuditSource = (typeof AUDIT_SOURCES)[number];
export const AUDIT_PAGE = 50;

export type AuditFilters = { source?: AuditSource; actor?: string; from?: Date; to?: Date; page: number };
export type AuditRow = {
  source: AuditSource;
  id: string;
  at: string;
  actor: string | null;
  action: string;
  subject: string | null;
  detail: string;
};

/** One list over the append-only logs, newest first, filtered and paged (AUDIT_PAGE rows a page). */
export async function auditLog(f: AuditFilters): Promise<{ rows: AuditRow[]; more: boolean }> {
  const parts = {
    memberships: sql`
      SELECT 'memberships' AS source, l.id::text AS id, l.at, a.email AS actor, l.action::text AS action, l.subject_email AS subject,
        concat_ws(' ', e.name, l.from_role::text || ' → ' || l.to_role::text) AS detail
      FROM membership_log l LEFT JOIN users a ON a.id = l.actor_id JOIN events e ON e.id = l.event_id`,
    organisations: sql`
      SELECT 'organisations', l.id::text, l.at, a.email, l.action::text, l.subject_email,
        concat_ws(' ', coalesce(o.name, r.name), nullif(l.reason, ''))
      FROM organisation_log l LEFT JOIN users a ON a.id = l.actor_id
        LEFT JOIN organisations o ON o.id = l.organisation_id LEFT JOIN organisation_requests r ON r.id = l.request_id`,
    decisions: sql`
      SELECT 'decisions', r.id::text, r.decided_at, a.email, r.from_state::text || ' → ' || r.to_state::text, s.id::text,
        concat_ws(' ', e.name, nullif(r.reason, ''))
      FROM reviews r JOIN users a ON a.id = r.reviewer_id JOIN sightings s ON s.id = r.sighting_id AND s.event_id = r.event_id JOIN events e ON e.id = s.event_id`,
    publications: sql`
      SELECT 'publications', p.id::text, p.published_at, a.email, 'published', e.name, 'version ' || p.version
      FROM reports p JOIN users a ON a.id = p.published_by JOIN events e ON e.id = p.event_id`,
    admin: sql`
      SELECT 'admin', l.id::text, l.at, a.email, l.action::text, coalesce(l.subject_email, l.mail_id::text),
        concat_ws(' ', CASE WHEN l.mail_id IS NOT NULL THEN 'mail #' || l.mail_id END, nullif(l.reason, ''))
      FROM admin_log l LEFT JOIN users a ON a.id = l.actor_id`,
  } satisfies Record<AuditSource, ReturnType<typeof sql>>;
  const chosen = f.source ? [parts[f.source]] : Object.values(parts);
  const where = [
    f.actor ? sql`lower(coalesce(actor, '')) LIKE ${`%${likeEscape(f.actor.toLowerCase())}%`}` : null,
    f.from ? sql`at >= ${f.from}` : null,
    f.to ? sql`at < ${f.to}` : null,
  ].filter((w) => w !== null);
  const { rows } = await getDb().execute<AuditRow>(sql`
    SELECT * FROM (${sql.join(chosen, sql` UNION ALL `)}) AS x(source, id, at, actor, action, subject, detail)
    ${where.length ? sql`WHERE ${sql.join(where, sql` AND `)}` : sql``}
    ORDER BY at DESC, source, id DESC
    LIMIT ${AUDIT_PAGE + 1} OFFSET ${f.page * AUDIT_PAGE}`);
  return { rows: rows.slice(0, AUDIT_PAGE), more: rows.length > AUDIT_PAGE };
}
