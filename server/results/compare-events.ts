import "server-only";
import {
  earlierEventsOfSite,
  eventNameAndStart,
  loadResultsInput,
  resultsKey,
  type EarlierEvent,
} from "@/db/queries/results";
import type { Tx } from "@/db/client";
import { compareEvents, type EventComparison, type ReportBesideEarlier } from "@/lib/results/compare-events";
import type { LiveBeside } from "@/lib/results/live";

// This event beside an earlier event of the same site (db/queries/results.ts
// earlierEventsOfSite), computed once per change of either event and kept in this process.
const cache = new Map<string, { key: string; comparison: EventComparison; at: number }>();
const MAX_PAIRS = 20;

export type EventBeside = { id: string; name: string; startsAt: Date };

/**
 * The earlier events that may be compared, and the comparison with the chosen one (the
 * newest when none is chosen, or the choice is not among them).
 */
export async function comparisonWithEarlier(
  event: EventBeside,
  chosenId?: string,
  options: { staleMs?: number } = {},
): Promise<{
  candidates: EarlierEvent[];
  chosen: EarlierEvent | null;
  comparison: EventComparison | null;
  /** When the comparison was computed (ms since the epoch); 0 without one. */
  at: number;
}> {
  const candidates = await earlierEventsOfSite(event.id);
  const chosen = candidates.find((c) => c.id === chosenId) ?? candidates[0] ?? null;
  if (!chosen) return { candidates, chosen: null, comparison: null, at: 0 };
  const [keyNow, keyThen] = await Promise.all([resultsKey(event.id), resultsKey(chosen.id)]);
  const pair = `${event.id}|${chosen.id}`;
  const key = `${keyNow}#${keyThen}`;
  const hit = cache.get(pair);
  if (hit?.key === key) return { candidates, chosen, comparison: hit.comparison, at: hit.at };
  // `staleMs`: the live board shows the comparison it has although records came in since; once
  // it is that old, a new one is computed in the background (the poll does not wait for it),
  // so a running event is compared at most once per period, not on every poll.
  if (hit && options.staleMs !== undefined) {
    if (Date.now() - hit.at >= options.staleMs) void compute(event, chosen, pair, key).catch(() => undefined);
    return { candidates, chosen, comparison: hit.comparison, at: hit.at };
  }
  const fresh = await compute(event, chosen, pair, key);
  return { candidates, chosen, ...fresh };
}

const computing = new Map<string, Promise<{ comparison: EventComparison; at: number }>>();

/** Computes and keeps the comparison of one pair at one key (one computation per pair and key at a time). */
function compute(
  event: EventBeside,
  chosen: EarlierEvent,
  pair: string,
  key: string,
): Promise<{ comparison: EventComparison; at: number }> {
  const id = `${pair}#${key}`;
  let job = computing.get(id);
  if (!job) {
    job = (async () => {
      const [now, then] = await Promise.all([
        loadResultsInput(event.id, { pending: false }),
        loadResultsInput(chosen.id, { pending: false }),
      ]);
      const comparison = compareEvents(
        { id: event.id, name: event.name, startsAt: new Date(event.startsAt).toISOString(), input: now },
        { id: chosen.id, name: chosen.name, startsAt: new Date(chosen.startsAt).toISOString(), input: then },
      );
      const at = Date.now();
      cache.delete(pair);
      cache.set(pair, { key, comparison, at });
      if (cache.size > MAX_PAIRS) cache.delete(cache.keys().next().value!);
      return { comparison, at };
    })().finally(() => computing.delete(id));
    computing.set(id, job);
  }
  return job;
}

/** How old a comparison the live board may show while records come in. */
export const LIVE_COMPARISON_STALE_MS = 60_000;

/**
 * The live board's comparison: the running event beside the newest earlier event of its
 * site, by the results page's rule, recomputed in the background at most once a minute
 * (LIVE_COMPARISON_STALE_MS); only the first poll waits for it.
 */
export async function liveBesideEarlier(eventId: string): Promise<LiveBeside> {
  const event = await eventNameAndStart(eventId);
  if (!event) return null;
  const { chosen, comparison, at } = await comparisonWithEarlier(
    { id: event.id, name: event.name, startsAt: new Date(event.startsAt) },
    undefined,
    { staleMs: LIVE_COMPARISON_STALE_MS },
  );
  return chosen && comparison ? { earlier: chosen, comparison, at: new Date(at).toISOString() } : null;
}

/**
 * The comparison a report freezes at publishing (and its preview shows): with the newest
 * earlier event of the site, read in the publishing transaction's snapshot; null without one.
 */
export async function besideEarlierForReport(eventId: string, tx: Tx): Promise<ReportBesideEarlier | null> {
  const [earlier] = await earlierEventsOfSite(eventId, tx);
  if (!earlier) return null;
  const event = await eventNameAndStart(eventId, tx);
  if (!event) return null;
  const [now, then] = [
    await loadResultsInput(event.id, { pending: false, db: tx }),
    await loadResultsInput(earlier.id, { pending: false, db: tx }),
  ];
  const comparison = compareEvents(
    { id: event.id, name: event.name, startsAt: new Date(event.startsAt).toISOString(), input: now },
    { id: earlier.id, name: earlier.name, startsAt: new Date(earlier.startsAt).toISOString(), input: then },
  );
  return { earlier, comparison };
}
