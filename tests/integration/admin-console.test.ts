import { eq, sql } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { auditLog, endSessionsOf, mailQueueState, retryMail, searchPeople, setAccountLocked } from "@/db/queries/admin";
import { sessionVersionOf } from "@/db/queries/auth";
import { recordWorkerRun } from "@/db/queries/mail-queue";
import * as s from "@/db/schema";
import { db, refusal } from "./helpers";

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
});
