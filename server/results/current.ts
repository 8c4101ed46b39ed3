import "server-only";
import path from "node:path";
import { Worker } from "node:worker_threads";
import { loadResultsInputParts, resultsKey } from "@/db/queries/results";
import { computeResults, warmResults, type Results, type ResultsInput } from "@/lib/results/compute";
import { forgetBootstraps } from "@/lib/results/compare";

// The event's current results, computed once per change and shared by every reader in
// this process (the organiser, coordinators polling, the results page). The key comes
// from the database (lib db/queries/results.ts resultsKey), so a change made through
// any instance is seen at once; each instance computes at most once per change.
//
// Speed: the first read after a change computes everything except the bootstraps that
// only draw intervals (the Hill curves' bands and the zone × zone table's intervals;
// rules.hill.bands false, the page says they are coming); those are then computed in a
// worker thread and the entry replaced when they arrive, if nothing changed meanwhile. The
// comparison's bootstrap stays on the first read: its verdicts need it. A change ends the
// worker of the one before (one worker per event). The abundance side's bootstraps are
// drawn from the counts while the complete sessions are still being read (warmResults).
// Publishing reads its own inputs and reuses these full results only when its input is the
// same (resultsWithBands).
// `input`: what the full results (with their bands) were computed from, kept for publishing (resultsWithBands).
type Entry = { key: string; results: Results; json: string; input?: ResultsInput };
const cache = new Map<string, Entry>();
const inflight = new Map<string, Promise<Entry>>();
const MAX_EVENTS = 20;

function store(eventId: string, entry: Entry): void {
  cache.delete(eventId);
  cache.set(eventId, entry);
  if (cache.size > MAX_EVENTS) cache.delete(cache.keys().next().value!);
}

/**
 * The full results in a worker thread (TypeScript through tsx, present wherever the app runs).
 * `cancel` ends the thread: its answer would be for data that has changed since.
 */
function computeInWorker(input: ResultsInput): { result: Promise<string>; cancel: () => void } {
  const worker = new Worker(
    `require("tsx/cjs/api").register(); require(${JSON.stringify(path.join(process.cwd(), "lib/results/bands-worker.ts"))});`,
    { eval: true },
  );
  const result = new Promise<string>((resolve, reject) => {
    worker.once("message", (json: string) => {
      resolve(json);
      void worker.terminate();
    });
    worker.once("error", reject);
    worker.once("exit", (code) => reject(new Error(`results worker exited (${code})`)));
    worker.postMessage(input);
  });
  return { result, cancel: () => void worker.terminate() };
}

/** At most one worker per event: a newer change ends the worker of an older one. */
const workers = new Map<string, { key: string; cancel: () => void }>();

function addBands(eventId: string, key: string, input: ResultsInput): void {
  const running = workers.get(eventId);
  if (running?.key === key) return;
  running?.cancel();
  const job = computeInWorker(input);
  const mine = { key, cancel: job.cancel };
  workers.set(eventId, mine);
  job.result
    .catch(() => (workers.get(eventId) === mine ? JSON.stringify(computeResults(input)) : null))
    .then((json) => {
      if (json && cache.get(eventId)?.key === key)
        store(eventId, { key, results: JSON.parse(json) as Results, json, input });
    })
    .catch(() => undefined)
    .finally(() => {
      if (workers.get(eventId) === mine) workers.delete(eventId);
    });
}

export async function currentResults(eventId: string, options: { bands?: "later" | "now" } = {}): Promise<Entry> {
  const key = await resultsKey(eventId);
  const hit = cache.get(eventId);
  if (hit && hit.key === key) return hit;
  const flightKey = `${eventId}|${key}`;
  let pending = inflight.get(flightKey);
  if (!pending) {
    pending = (async () => {
      // The worker of an older change would only compete for the cores: end it now.
      const stale = workers.get(eventId);
      if (stale && stale.key !== key) {
        stale.cancel();
        workers.delete(eventId);
      }
      // While the database reads the complete sessions (the longest query), the counts
      // alone already give the abundance side's bootstraps: draw them meanwhile (kept, so
      // computeResults finds them; no number changes).
      const parts = loadResultsInputParts(eventId);
      warmResults(await parts.counted);
      const input = await parts.full;
      const now = options.bands === "now";
      const results = computeResults(input, { bands: now });
      const entry: Entry = { key, results, json: JSON.stringify(results), ...(now ? { input } : {}) };
      store(eventId, entry);
      if (!now) addBands(eventId, key, input);
      return entry;
    })().finally(() => inflight.delete(flightKey));
    inflight.set(flightKey, pending);
  }
  return pending;
}

/**
 * The event's full results (Hill bands and zone intervals included) as this process last computed
 * them, with the input they came from; null until the worker's bands have arrived. Publishing reuses
 * them when its own input is the same (the same input and seeds give the same numbers).
 */
export function resultsWithBands(eventId: string): { input: ResultsInput; json: string } | null {
  const e = cache.get(eventId);
  return e?.input && e.results.rules.hill.bands ? { input: e.input, json: e.json } : null;
}

/** For the benchmark's cold figure: forget every cached result and kept replicate, and end every worker, as after a restart. */
export function forgetResults(): void {
  cache.clear();
  forgetBootstraps();
  for (const w of workers.values()) w.cancel();
  workers.clear();
}
