// The mail worker: gathers review decisions into digests and drains the e-mail outbox,
// every MAIL_WORKER_INTERVAL_MS, until stopped (SIGINT/SIGTERM). Started by scripts/start.sh;
// can run on its own machine, several at once (claims use SKIP LOCKED).
//   npx tsx --require ./scripts/no-server-only.cjs scripts/mail-worker.mts [--once]
import { recordWorkerRun } from "../db/queries/mail-queue";
import { composeDigests } from "../db/queries/review-digest";
import { env } from "../lib/env";
import { drainOutbox } from "../server/mail/queue";
import { renderDigest } from "../server/review/digest-mail";

const once = process.argv.includes("--once");
let stopping = false;
for (const signal of ["SIGINT", "SIGTERM"] as const)
  process.on(signal, () => {
    stopping = true;
  });

async function tick() {
  const digests = await composeDigests(env().REVIEW_DIGEST_DELAY_SECONDS, renderDigest);
  const { sent, failed } = await drainOutbox();
  await recordWorkerRun("mail", `digests ${digests}, sent ${sent}, failed ${failed}`, null);
  if (digests || sent || failed)
    console.log(`[mail-worker] ${new Date().toISOString()} digests ${digests}, sent ${sent}, failed ${failed}`);
}

console.log(
  `[mail-worker] started: digest window ${env().REVIEW_DIGEST_DELAY_SECONDS} s, every ${env().MAIL_WORKER_INTERVAL_MS} ms, SMTP ${env().SMTP_HOST}:${env().SMTP_PORT}`,
);
do {
  try {
    await tick();
  } catch (err) {
    console.error("[mail-worker] round failed; retrying next round:", (err as Error).message);
    await recordWorkerRun("mail", "", (err as Error).message).catch(() => undefined);
  }
  if (once) break;
  const until = Date.now() + env().MAIL_WORKER_INTERVAL_MS;
  while (!stopping && Date.now() < until) await new Promise((r) => setTimeout(r, Math.min(250, until - Date.now())));
} while (!stopping);
process.exit(0);
