import "server-only";
import { and, asc, eq, inArray, lte, or, sql } from "drizzle-orm";
import { getDb } from "../client";
import { emailOutbox, workerRuns } from "../schema";

export type OutboxMail = {
  to: string;
  kind: string;
  locale: string;
  subject: string;
  text: string;
  html?: string;
  sendAfter?: Date;
};

export async function enqueueMail(mails: OutboxMail[], tx = getDb()): Promise<void> {
  if (!mails.length) return;
  await tx.insert(emailOutbox).values(
    mails.map((m) => ({
      toAddress: m.to,
      kind: m.kind,
      locale: m.locale,
      subject: m.subject,
      textBody: m.text,
      htmlBody: m.html ?? null,
      sendAfter: m.sendAfter ?? new Date(),
    })),
  );
}

/**
 * Claims due mails (queued, or failed with tries left and their back-off passed) so that
 * two workers never send the same one: FOR UPDATE SKIP LOCKED inside one UPDATE.
 */
export async function claimDueMails(limit: number, maxAttempts: number) {
  const db = getDb();
  const due = db
    .select({ id: emailOutbox.id })
    .from(emailOutbox)
    .where(
      and(
        or(
          eq(emailOutbox.status, "queued"),
          and(eq(emailOutbox.status, "failed"), sql`${emailOutbox.attempts} < ${maxAttempts}`),
        ),
        lte(emailOutbox.sendAfter, sql`now()`),
      ),
    )
    .orderBy(asc(emailOutbox.sendAfter))
    .limit(limit)
    .for("update", { skipLocked: true });
  return db
    .update(emailOutbox)
    .set({ status: "sending", attempts: sql`${emailOutbox.attempts} + 1`, sendAfter: sql`now()` }) // sendAfter doubles as "claimed at"
    .where(inArray(emailOutbox.id, due))
    .returning();
}

export async function markMailSent(id: number): Promise<void> {
  await getDb()
    .update(emailOutbox)
    .set({ status: "sent", sentAt: new Date(), lastError: null })
    .where(eq(emailOutbox.id, id));
}

export async function markMailFailed(id: number, error: string, retryAt: Date): Promise<void> {
  await getDb()
    .update(emailOutbox)
    .set({ status: "failed", lastError: error.slice(0, 500), sendAfter: retryAt })
    .where(eq(emailOutbox.id, id));
}

/** Mails stuck in "sending" (a worker died mid-send) go back to the queue. */
export async function requeueStaleMails(olderThan: Date): Promise<void> {
  await getDb()
    .update(emailOutbox)
    .set({ status: "queued" })
    .where(and(eq(emailOutbox.status, "sending"), lte(emailOutbox.sendAfter, olderThan)));
}

/** The worker's round just ended (its summary, or the error that stopped it): shown on the admin console. */
export async function recordWorkerRun(worker: string, summary: string, error: string | null): Promise<void> {
  const row = { worker, lastRunAt: new Date(), summary, lastError: error };
  await getDb()
    .insert(workerRuns)
    .values(row)
    .onConflictDoUpdate({ target: workerRuns.worker, set: { lastRunAt: row.lastRunAt, summary, lastError: error } });
}
