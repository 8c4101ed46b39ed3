import "server-only";
import { connect } from "node:net";
import { checkDatabase } from "@/db/queries/health";
import { env } from "@/lib/env";
import { bucketReachable } from "@/server/storage/s3";

// The admin console's health view: is each service the site depends on reachable now?

/** Opens a TCP connection to the SMTP server and waits for its greeting (a 220 line). */
export function smtpReachable(timeoutMs = 3000): Promise<boolean> {
  const { SMTP_HOST, SMTP_PORT } = env();
  return new Promise((resolve) => {
    const socket = connect({ host: SMTP_HOST, port: SMTP_PORT });
    const done = (ok: boolean) => {
      socket.destroy();
      resolve(ok);
    };
    socket.setTimeout(timeoutMs, () => done(false));
    socket.once("error", () => done(false));
    socket.once("data", (chunk) => {
      socket.write("QUIT\r\n");
      done(chunk.toString("latin1").startsWith("220"));
    });
  });
}

export async function serviceHealth() {
  const started = Date.now();
  const [database, smtp, storage] = await Promise.all([checkDatabase(), smtpReachable(), bucketReachable()]);
  return {
    database: database.ok ? { ok: true as const, latencyMs: database.latencyMs } : { ok: false as const },
    smtp: { ok: smtp, host: `${env().SMTP_HOST}:${env().SMTP_PORT}` },
    storage: { ok: storage, bucket: env().S3_BUCKET },
    checkedInMs: Date.now() - started,
  };
}
