import "server-only";
import { claimDueMails, markMailFailed, markMailSent, requeueStaleMails } from "@/db/queries/mail-queue";
import { sendMail } from "@/server/mail/transport";

export const MAX_ATTEMPTS = 8;

/** Back-off after the n-th failed try: 1, 2, 4 … minutes, capped at 2 hours. */
export function retryDelayMs(attempt: number): number {
  return Math.min(2 ** Math.max(0, attempt - 1), 120) * 60_000;
}

/**
 * Sends what is due in the e-mail outbox. A failed send stays in the table with its
 * reason and is retried later; nothing that led to the mail is ever rolled back.
 */
export async function drainOutbox(limit = 50): Promise<{ sent: number; failed: number }> {
  await requeueStaleMails(new Date(Date.now() - 10 * 60_000));
  const mails = await claimDueMails(limit, MAX_ATTEMPTS);
  let sent = 0;
  let failed = 0;
  for (const m of mails) {
    try {
      await sendMail({ to: m.toAddress, subject: m.subject, text: m.textBody, html: m.htmlBody ?? undefined });
      await markMailSent(m.id);
      sent++;
    } catch (err) {
      failed++;
      await markMailFailed(m.id, (err as Error).message, new Date(Date.now() + retryDelayMs(m.attempts)));
    }
  }
  return { sent, failed };
}
