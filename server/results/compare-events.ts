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

// This event beside an earlier event of the same site (db/queries/results.ts
// earlierEventsOfSite), computed once per change of either event and kept in this process.
const cache = new Map<string, { key: string; comparison: EventComparison }>();
const MAX_PAIRS = 20;

export type EventBeside = { id: string; name: string; startsAt: Date };

/**
 * The earlier events that may be compared, and the comparison with the chosen one (the
 * newest when none is chosen, or the choice is not among them).
 */
export async function comparisonWithEarlier(
  event: EventBeside,
  chosenId?: string,
): Promise<{ candidates: EarlierEvent[]; chosen: EarlierEvent | null; comparison: EventComparison | null }> {
  const candidates = await earlierEventsOfSite(event.id);
  const chosen = candidates.find((c) => c.id === chosenId) ?? candidates[0] ?? null;
  if (!chosen) return { candidates, chosen: null, comparison: null };
  const [keyNow, keyThen] = await Promise.all([resultsKey(event.id), resultsKey(chosen.id)]);
  const pair = `${event.id}|${chosen.id}`;
  const key = `${keyNow}#${keyThen}`;
  const hit = cache.get(pair);
  if (hit?.key === key) return { candidates, chosen, comparison: hit.comparison };
  const [now, then] = await Promise.all([
    loadResultsInput(event.id, { pending: false }),
    loadResultsInput(chosen.id, { pending: false }),
  ]);
  const comparison = compareEvents(
    { id: event.id, name: event.name, startsAt: new Date(event.startsAt).toISOString(), input: now },
    { id: chosen.id, name: chosen.name, startsAt: new Date(chosen.startsAt).toISOString(), input: then },
  );
  cache.delete(pair);
  cache.set(pair, { key, comparison });
  if (cache.size > MAX_PAIRS) cache.delete(cache.keys().next().value!);
  return { candidates, chosen, comparison };
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
