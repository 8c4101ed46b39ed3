// Retry delays for the outbox. Exponential back-off with "full jitter" (common practice:
// spreads the retries of many phones that regain signal at once), from 5 s up to 15 min.
export const BACKOFF_BASE_MS = 5_000;
export const BACKOFF_MAX_MS = 15 * 60_000;

/** The wait before the next try after `attempts` failed tries in a row (attempts ≥ 1). */
export function backoffDelay(attempts: number, random: () => number = Math.random): number {
  const n = Math.max(1, Math.floor(attempts));
  const ceiling = Math.min(BACKOFF_MAX_MS, BACKOFF_BASE_MS * 2 ** Math.min(n - 1, 20));
  // Never less than half the ceiling, so a retry is always a real wait.
  return Math.round(ceiling / 2 + (random() * ceiling) / 2);
}
