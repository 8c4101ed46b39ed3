import { Workbox } from "workbox-window";
import { CHANGE_CHANNEL, LAST_LOCALE_KEY, PAGE_CACHE, SYNC_TAG } from "./sw-constants";

// The page's side of the offline machinery: registering the service worker (workbox-window),
// asking for Background Sync, and telling other tabs that the outbox changed.

let registered: Promise<ServiceWorkerRegistration | undefined> | undefined;

export function registerServiceWorker(locale: string): Promise<ServiceWorkerRegistration | undefined> {
  if (typeof window === "undefined" || !("serviceWorker" in navigator)) return Promise.resolve(undefined);
  registered ??= new Workbox("/sw.js", { scope: "/" }).register().catch(() => undefined);
  // Remember the language, so the installed app opens the field log in it when offline.
  void caches
    ?.open(PAGE_CACHE)
    .then((c) => c.put(LAST_LOCALE_KEY, new Response(locale)))
    .catch(() => undefined);
  return registered;
}

/** Asks the browser to run the outbox when the network is back, even with the page closed (where supported). */
export async function requestBackgroundSync(): Promise<void> {
  try {
    const reg = await navigator.serviceWorker?.ready;
    const sync = (reg as (ServiceWorkerRegistration & { sync?: { register(tag: string): Promise<void> } }) | undefined)
      ?.sync;
    await sync?.register(SYNC_TAG);
  } catch {
    // Not supported, or not allowed: the page's own triggers still run.
  }
}

let channel: BroadcastChannel | undefined;
function getChannel() {
  if (typeof BroadcastChannel === "undefined") return undefined;
  channel ??= new BroadcastChannel(CHANGE_CHANNEL);
  return channel;
}

const LOCAL_EVENT = "ecotone-field-changed";

/** Tells this tab (a BroadcastChannel never delivers to its sender) and every other tab. */
export function announceChange() {
  getChannel()?.postMessage("changed");
  window.dispatchEvent(new Event(LOCAL_EVENT));
}

/** Tells the other tabs only: this tab already shows its own change (a save puts its record in the list itself). */
export function announceToOtherTabs() {
  getChannel()?.postMessage("changed");
}

export function onChange(listener: () => void): () => void {
  const ch = getChannel();
  const onSw = (e: MessageEvent) => {
    if ((e.data as { type?: string } | null)?.type === "ecotone-synced") listener();
  };
  ch?.addEventListener("message", listener);
  window.addEventListener(LOCAL_EVENT, listener);
  navigator.serviceWorker?.addEventListener("message", onSw);
  return () => {
    ch?.removeEventListener("message", listener);
    window.removeEventListener(LOCAL_EVENT, listener);
    navigator.serviceWorker?.removeEventListener("message", onSw);
  };
}
