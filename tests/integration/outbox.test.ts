import { eq, sql } from "drizzle-orm";
import { afterAll, describe, expect, it } from "vitest";
import { enqueueMail } from "@/db/queries/mail-queue";
import { emailOutbox } from "@/db/schema";
import { drainOutbox } from "@/server/mail/queue";
import { MailCatcher } from "../support/mail-catcher";
import { db } from "./helpers";

// SMTP_PORT for this project is set in vitest.config.mts; nothing listens there until
// the catcher starts, which is the outage.
const port = Number(process.env.SMTP_PORT);
const catcher = new MailCatcher(port);
afterAll(() => catcher.stop());

describe("e-mail outbox", () => {
  it("survives an SMTP outage: mails wait with their reason and are delivered when the server is back", async () => {
    const to = `outage-${Date.now()}@example.org`;
    await enqueueMail([
      { to, kind: "test", locale: "en", subject: "First", text: "one" },
      { to, kind: "test", locale: "en", subject: "Second", text: "two" },
    ]);
    // Other test files leave mails of their own in the queue: drain (bounded) until these two were tried.
    const down = await drainOutbox();
    expect(down.sent).toBe(0);
    expect(down.failed).toBeGreaterThanOrEqual(1);
    let waiting = await db().select().from(emailOutbox).where(eq(emailOutbox.toAddress, to));
    for (let i = 0; i < 20 && waiting.some((m) => m.status === "queued"); i++) {
      expect((await drainOutbox()).sent).toBe(0);
      waiting = await db().select().from(emailOutbox).where(eq(emailOutbox.toAddress, to));
    }
    expect(waiting.map((m) => m.status)).toEqual(["failed", "failed"]);
    expect(waiting[0]!.lastError).toMatch(/ECONNREFUSED|connect/i);
    expect(waiting[0]!.sendAfter.getTime()).toBeGreaterThan(Date.now()); // backed off

    await catcher.start();
    // Let the back-off pass, as the clock would.
    await db()
      .update(emailOutbox)
      .set({ sendAfter: sql`now() - interval '1 second'` })
      .where(eq(emailOutbox.toAddress, to));
    const up = await drainOutbox();
    expect(up.sent).toBeGreaterThanOrEqual(2);
    const delivered = await catcher.waitFor(to, (m) => m.subject === "Second");
    expect(delivered.text.trim()).toBe("two");
    const done = await db().select().from(emailOutbox).where(eq(emailOutbox.toAddress, to));
    expect(done.map((m) => [m.status, m.attempts])).toEqual([
      ["sent", 2],
      ["sent", 2],
    ]);

    // Sent mails are not sent again.
    const again = await drainOutbox();
    expect(again.sent).toBe(0);
    expect(catcher.mails.filter((m) => m.to.includes(to))).toHaveLength(2);
  });
});
