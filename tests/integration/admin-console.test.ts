import type { AddressInfo } from "node:net";
import { eq, sql } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import {
  auditLog,
  endSessionsOf,
  liveAccountEmail,
  mailQueueState,
  photoStorageByOrganisation,
  retryMail,
  searchPeople,
  setAccountLocked,
} from "@/db/queries/admin";
import { sessionVersionOf } from "@/db/queries/auth";
import { recordWorkerRun } from "@/db/queries/mail-queue";
import { eraseAccount } from "@/db/queries/my-data";
import { addOrganiser, organisationEventMembers } from "@/db/queries/organisations";
import * as s from "@/db/schema";
import { serviceHealth, tilesReachable } from "@/server/admin/health";
import { startTileFake } from "@/server/tiles/fake";
import { db, makeFixture, refusal, sightingValues } from "./helpers";

async function person(tag: string, isAdmin = false) {
  const [u] = await db()
    .insert(s.users)
    .values({ email: `${tag}@example.org`, name: `Person ${tag}`, isAdmin })
    .returning();
  return u!;
}

describe("admin console", () => {
  it("locks an account (its sessions end at once), unlocks it, ends sessions, each in the admin log", async () => {
    const admin = await person("console-admin", true);
    const who = await person("console-locked");
    expect(await sessionVersionOf(who.id)).toBe(0);
    expect(await setAccountLocked(admin.id, who.id, true, "Spam")).toBe(true);
    expect(await sessionVersionOf(who.id)).toBeNull(); // no session passes while locked
    expect(await setAccountLocked(admin.id, who.id, true, "again")).toBe(false);
    expect(await setAccountLocked(admin.id, who.id, false, "")).toBe(true);
    const v = await sessionVersionOf(who.id);
    expect(v).toBe(2); // the old sessions stay ended after unlocking
    expect(await endSessionsOf(admin.id, who.id)).toBe(true);
    expect(await sessionVersionOf(who.id)).toBe(3);
    expect((await searchPeople("CONSOLE-LOCKED")).map((p) => p.email)).toEqual([who.email]);
    expect(await searchPeople("%")).toEqual([]); // a LIKE wildcard is searched for literally

    const audit = await auditLog({ source: "admin", actor: "console-admin", page: 0 });
    expect(audit.rows.map((r) => [r.action, r.subject])).toEqual([
      ["sessions_ended", who.email],
      ["account_unlocked", who.email],
      ["account_locked", who.email],
    ]);
    const r = await refusal(() => db().execute(sql`DELETE FROM admin_log WHERE subject_user_id = ${who.id}`));
    expect(r.message).toContain("append-only");
  });

  it("shows failed mails with their reason and puts one back in the queue", async () => {
    const admin = await person("console-mail-admin", true);
    const [mail] = await db()
      .insert(s.emailOutbox)
      .values({
        toAddress: "console-mail@example.org",
        kind: "test",
        subject: "Hello",
        textBody: "Hello",
        status: "failed",
        attempts: 8,
        lastError: "550 mailbox unavailable",
      })
      .returning();
    await recordWorkerRun("mail", "digests 0, sent 0, failed 1", null);
    const state = await mailQueueState();
    expect(state.troubled.find((m) => m.id === mail!.id)).toMatchObject({ lastError: "550 mailbox unavailable" });
    expect(state.worker).toMatchObject({ summary: "digests 0, sent 0, failed 1", lastError: null });
    expect(await retryMail(admin.id, mail!.id)).toBe(true);
    const [after] = await db().select().from(s.emailOutbox).where(eq(s.emailOutbox.id, mail!.id));
    expect(after).toMatchObject({ status: "queued", attempts: 0 });
    const audit = await auditLog({ source: "admin", actor: "console-mail-admin", page: 0 });
    expect(audit.rows[0]).toMatchObject({ action: "mail_retried", subject: "console-mail@example.org" });
  });

  it("pages the audit view over every log", async () => {
    const admin = await person("console-pager", true);
    const who = await person("console-paged");
    for (let i = 0; i < 55; i++) await endSessionsOf(admin.id, who.id);
    const first = await auditLog({ actor: "console-pager", page: 0 });
    const second = await auditLog({ actor: "console-pager", page: 1 });
    expect([first.rows.length, first.more, second.rows.length, second.more]).toEqual([50, true, 5, false]);
    const all = await auditLog({ page: 0, from: new Date(Date.now() - 3_600_000) });
    expect(all.rows.length).toBeGreaterThan(0);
  });

  it("erases an account by the volunteer's own rule: a tombstone, records kept, every log redacted, never emptied", async () => {
    const f = await makeFixture("console-erase");
    const admin = await person("console-erase-admin", true);
    const who = f.user;
    const [sighting] = await db().insert(s.sightings).values(sightingValues(f)).returning();
    await db().insert(s.eventMembers).values({ eventId: f.event.id, userId: who.id, role: "coordinator" });
    await db().insert(s.organisationMembers).values({ organisationId: f.org.id, userId: admin.id, role: "organiser" });
    expect(await addOrganiser(admin.id, f.org.id, who.email)).toEqual({ ok: true });
    expect(await setAccountLocked(admin.id, who.id, true, "Complaint")).toBe(true);
    // A mail to the person retried by the admin: logged with the address alone.
    const [mail] = await db()
      .insert(s.emailOutbox)
      .values({ toAddress: who.email, kind: "test", subject: "Hi", textBody: "Hi", status: "failed" })
      .returning();
    expect(await retryMail(admin.id, mail!.id)).toBe(true);
    expect(await liveAccountEmail(who.id)).toBe(who.email);

    const erased = (await eraseAccount(who.id, { adminId: admin.id, reason: "Asked by letter" }))!;
    expect(erased.recorder).toMatch(/^recorder-[0-9a-f]{8}$/);
    expect(await liveAccountEmail(who.id)).toBeNull();
    expect(await eraseAccount(who.id, { adminId: admin.id, reason: "again" })).toBeNull();
    const [u] = await db().select().from(s.users).where(eq(s.users.id, who.id));
    expect(u).toMatchObject({ name: null, passwordHash: null, isAdmin: false, publishedName: erased.recorder });
    expect(u!.email).toMatch(/^erased-[0-9a-f]{12}@erased\.invalid$/);
    expect(u!.erasedAt).not.toBeNull();
    // The record stays, its recorder the tombstone; roles end.
    const [kept] = await db().select().from(s.sightings).where(eq(s.sightings.id, sighting!.id));
    expect(kept!.userId).toBe(who.id);
    expect(await db().select().from(s.eventMembers).where(eq(s.eventMembers.userId, who.id))).toEqual([]);
    expect(await db().select().from(s.organisationMembers).where(eq(s.organisationMembers.userId, who.id))).toEqual([]);

    // No log holds the erased address any more; each kept its rows, and the erasure is one more.
    const { rows: leaks } = await db().execute(sql`
      SELECT 'admin' FROM admin_log WHERE lower(subject_email) = ${who.email}
      UNION ALL SELECT 'organisation' FROM organisation_log WHERE lower(subject_email) = ${who.email}
      UNION ALL SELECT 'membership' FROM membership_log WHERE lower(subject_email) = ${who.email}`);
    expect(leaks).toEqual([]);
    const audit = await auditLog({ source: "admin", actor: "console-erase-admin", page: 0 });
    expect(audit.rows.map((r) => [r.action, r.subject])).toEqual([
      ["account_erased", u!.email],
      ["mail_retried", u!.email],
      ["account_locked", u!.email],
    ]);
    expect(audit.rows[0]!.detail).toBe("Asked by letter");
    const orgLog = await db().select().from(s.organisationLog).where(eq(s.organisationLog.subjectUserId, who.id));
    expect(orgLog.map((l) => [l.action, l.subjectEmail])).toEqual([["organiser_added", u!.email]]);

    // Still append-only: no delete, no change but that redaction.
    for (const change of [
      sql`DELETE FROM admin_log WHERE subject_user_id = ${who.id}`,
      sql`UPDATE admin_log SET reason = 'edited' WHERE subject_user_id = ${who.id}`,
      sql`UPDATE organisation_log SET action = 'organiser_removed' WHERE subject_user_id = ${who.id}`,
      sql`DELETE FROM organisation_log WHERE subject_user_id = ${who.id}`,
    ])
      expect((await refusal(() => db().execute(change))).message).toContain("append-only");
    // Redacting someone who is not erased is refused too.
    await endSessionsOf(admin.id, admin.id);
    const r2 = await refusal(() =>
      db().execute(
        sql`UPDATE admin_log SET subject_email = 'erased-000000000000@erased.invalid' WHERE subject_user_id = ${admin.id}`,
      ),
    );
    expect(r2.message).toContain("append-only");
    expect((await searchPeople(u!.email))[0]).toMatchObject({ id: who.id, erasedAt: expect.anything() });
  });

  it("sums the photo storage each organisation uses", async () => {
    const f = await makeFixture("console-storage");
    const empty = await makeFixture("console-storage-none");
    const [a, b] = await db()
      .insert(s.sightings)
      .values([sightingValues(f), sightingValues(f)])
      .returning();
    for (const [sightingId, sizeBytes] of [
      [a!.id, 1_500_000],
      [a!.id, 250_000],
      [b!.id, 2_000_000],
    ] as const) {
      const id = crypto.randomUUID();
      await db()
        .insert(s.photos)
        .values({
          id,
          sightingId,
          eventId: f.event.id,
          storageKey: `test/${id}.jpg`,
          contentType: "image/jpeg",
          sizeBytes,
          sha256: "b".repeat(64),
        });
    }
    const storage = await photoStorageByOrganisation();
    expect(storage.find((o) => o.id === f.org.id)).toMatchObject({ photos: 3, bytes: 3_750_000 });
    expect(storage.find((o) => o.id === empty.org.id)).toMatchObject({ photos: 0, bytes: 0 });
  });

  it("lists every event of an organisation with its members", async () => {
    const f = await makeFixture("console-members");
    const other = await person("console-members-other");
    await db()
      .insert(s.eventMembers)
      .values([
        { eventId: f.event.id, userId: f.user.id, role: "volunteer" },
        { eventId: f.event.id, userId: other.id, role: "coordinator", taxonGroups: ["birds"] },
      ]);
    const [quiet] = await db()
      .insert(s.events)
      .values({
        organisationId: f.org.id,
        slug: "event-console-members-2",
        name: "Quiet event",
        status: "draft",
        startsAt: new Date("2026-05-01T05:00:00Z"),
        endsAt: new Date("2026-05-02T05:00:00Z"),
        timeZone: "Europe/London",
        area: f.event.area,
      })
      .returning();
    const events = await organisationEventMembers(f.org.id);
    expect(events.map((e) => [e.eventName, e.members.map((m) => [m.email, m.role, m.taxonGroups])])).toEqual([
      [
        f.event.name,
        [
          [other.email, "coordinator", ["birds"]],
          [f.user.email, "volunteer", []],
        ],
      ],
      [quiet!.name, []],
    ]);
  });

  it("checks every service the site depends on, the map tiles too", async () => {
    const health = await serviceHealth();
    expect(health.database.ok).toBe(true);
    expect(health.storage.ok).toBe(true); // the S3 fake of the test set-up
    expect(health.tiles.origin).toMatch(/^https?:\/\/[^/]+$/);
    // The map tiles: the local tile fake answers with a picture; a closed port or a page that is no picture does not.
    const tiles = await startTileFake({ port: 0 });
    const port = (tiles.address() as AddressInfo).port;
    try {
      expect(await tilesReachable(`http://127.0.0.1:${port}/tiles/{z}/{x}/{y}.png`)).toBe(true);
      expect(await tilesReachable(`http://127.0.0.1:${port}/nothing/{z}/{x}/{y}`)).toBe(false);
    } finally {
      await new Promise((resolve) => tiles.close(resolve));
    }
    expect(await tilesReachable(`http://127.0.0.1:${port}/tiles/{z}/{x}/{y}.png`)).toBe(false);
  });
});
