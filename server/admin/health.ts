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

/** The base map's tile at zoom 0 (a MAP_TILE_URL template): the service answers with an image. */
export async function tilesReachable(template = env().MAP_TILE_URL, timeoutMs = 3000): Promise<boolean> {
  const url = template.replace("{z}", "0").replace("{x}", "0").replace("{y}", "0");
  try {
    const res = await fetch(url, { signal: AbortSignal.timeout(timeoutMs), cache: "no-store" });
    await res.body?.cancel();
    return res.ok && (res.headers.get("content-type") ?? "").startsWith("image/");
  } catch {
    return false;
  }
}

export async function serviceHealth() {
  const started = Date.now();
  const [database, smtp, storage, tiles] = await Promise.all([
    checkDatabase(),
    smtpReachable(),
    bucketReachable(),
    tilesReachable(),
  ]);
  return {
    database: database.ok ? { ok: true as const, latencyMs: database.latencyMs } : { ok: false as const },
    smtp: { ok: smtp, host: `${env().SMTP_HOST}:${env().SMTP_PORT}` },
    storage: { ok: storage, bucket: env().S3_BUCKET },
    tiles: { ok: tiles, origin: new URL(env().MAP_TILE_URL).origin },
    checkedInMs: Date.now() - started,
  };
}
