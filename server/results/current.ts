import "server-only";
import { loadResultsInput, resultsKey } from "@/db/queries/results";
import { computeResults, type Results } from "@/lib/results/compute";

// The event's current results, computed once per change and shared by every reader in
// this process (the organiser, coordinators polling, the results page). The key comes
// from the database (lib db/queries/results.ts resultsKey), so a change made through
// any instance is seen at once; each instance computes at most once per change.
type Entry = { key: string; results: Results; json: string };
const cache = new Map<string, Entry>();
const inflight = new Map<string, Promise<Entry>>();
const MAX_EVENTS = 20;

export async function currentResults(eventId: string): Promise<Entry> {
  const key = await resultsKey(eventId);
  const hit = cache.get(eventId);
  if (hit && hit.key === key) return hit;
  const flightKey = `${eventId}|${key}`;
  let pending = inflight.get(flightKey);
  if (!pending) {
    pending = (async () => {
      const results = computeResults(await loadResultsInput(eventId));
      const entry = { key, results, json: JSON.stringify(results) };
      cache.delete(eventId);
      cache.set(eventId, entry);
      if (cache.size > MAX_EVENTS) cache.delete(cache.keys().next().value!);
      return entry;
    })().finally(() => inflight.delete(flightKey));
    inflight.set(flightKey, pending);
  }
  return pending;
}

/** For the benchmark's cold figure: forget every cached result. */
export function forgetResults(): void {
  cache.clear();
}
