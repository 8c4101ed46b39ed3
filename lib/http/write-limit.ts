import { env } from "@/lib/env";
import { ApiError } from "@/lib/http/errors";

// A per-process sliding-window limit for write handlers: a runaway client (a phone stuck
// in a retry loop, a script) is slowed before it reaches the database. Each app instance
// counts on its own, so behind N instances the effective limit is up to N times higher;
// sign-in limits, which must hold across instances, are kept in PostgreSQL instead.
const windows = new Map<string, number[]>();

export function takeToken(key: string, limit: number, windowMs: number, now = Date.now()): boolean {
  const since = now - windowMs;
  const hits = (windows.get(key) ?? []).filter((t) => t > since);
  if (hits.length >= limit) {
    windows.set(key, hits);
    return false;
  }
  hits.push(now);
  windows.set(key, hits);
  if (windows.size > 50_000) {
    for (const [k, v] of windows) if (!v.some((t) => t > since)) windows.delete(k);
  }
  return true;
}

/** Throws the translated 429 when `key` has used up `limit` calls in the window (times WRITE_LIMIT_SCALE). */
export function limitWrites(key: string, limit = 120, windowMs = 60_000): void {
  if (!takeToken(key, Math.round(limit * env().WRITE_LIMIT_SCALE), windowMs)) throw new ApiError("rate_limited");
}
