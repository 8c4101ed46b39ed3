/// <reference lib="webworker" />
// The service worker (bundled by scripts/build-sw.mjs during `next build`, written to
// public/sw.js). It precaches the app's static files, keeps the field log pages for use
// without a network, and sends the outbox through Background Sync where the browser has it.
import { clientsClaim } from "workbox-core";
import { cleanupOutdatedCaches, precacheAndRoute, type PrecacheEntry } from "workbox-precaching";
import { registerRoute } from "workbox-routing";
import { CacheFirst, NetworkFirst } from "workbox-strategies";
import { openFieldDb } from "./db";
import { eventsWithPending } from "./outbox";
import { LAST_LOCALE_KEY, PAGE_CACHE, SYNC_TAG, TILE_CACHE, TILE_PATH } from "./sw-constants";
import { syncEvent } from "./sync";

declare const self: ServiceWorkerGlobalScope & { __WB_MANIFEST: (PrecacheEntry | string)[] };

const FIELD_PAGE = /^\/(en|es|fr)\/field\/?$/;
const FIELD_PAGES = ["/en/field", "/es/field", "/fr/field"];

self.skipWaiting();
clientsClaim();
cleanupOutdatedCaches();

// The field log page itself: the network first (so the page is current when there is
// signal), the last good copy when there is none. The copy keeps its own response headers,
// so the Content-Security-Policy in the cache names the same nonce as the cached page's
// scripts. Redirects (to sign-in) and errors are never kept.
const keepGoodPages = {
  cacheWillUpdate: async ({ response }: { response: Response }) =>
    response.ok && response.type === "basic" && !response.redirected ? response : null,
  cacheKeyWillBeUsed: async ({ request }: { request: Request }) => {
    const url = new URL(request.url);
    return `${url.origin}${url.pathname.replace(/\/$/, "")}`;
  },
};
registerRoute(
  ({ request, url }) =>
    request.mode === "navigate" && url.origin === self.location.origin && FIELD_PAGE.test(url.pathname),
  new NetworkFirst({ cacheName: PAGE_CACHE, networkTimeoutSeconds: 4, plugins: [keepGoodPages] }),
);

// The installed app starts at /field (no locale). Online the locale routing answers;
// offline, the field log page in the language used last (remembered by the page in the
// same cache under LAST_LOCALE_KEY), else any language kept.
registerRoute(
  ({ request, url }) => request.mode === "navigate" && url.origin === self.location.origin && url.pathname === "/field",
  async ({ request, url }) => {
    try {
      return await fetch(request);
    } catch {
      const cache = await caches.open(PAGE_CACHE);
      const last = await (await cache.match(LAST_LOCALE_KEY))?.text();
      for (const path of [`/${last}/field`, ...FIELD_PAGES]) {
        if (await cache.match(new URL(path, self.location.origin).href))
          return Response.redirect(`${path}${url.search}`, 302);
      }
      return Response.error();
    }
  },
);

// The base map's tiles (any tile server, MAP_TILE_URL): from the cache first, which the field
// log fills with the event area's tiles (lib/field/tiles.ts); a tile not kept comes from the
// network and is kept too (only good, CORS-readable answers: CacheFirst keeps status 200).
registerRoute(
  ({ request, url }) =>
    request.destination === "image" && url.origin !== self.location.origin && TILE_PATH.test(url.pathname),
  new CacheFirst({ cacheName: TILE_CACHE }),
);

// Registered after the page route, so the page route wins for the field log pages.
precacheAndRoute(self.__WB_MANIFEST, { ignoreURLParametersMatching: [/^utm_/, /^v$/] });

// On install, fetch the field log page in every language, so it opens offline even in a
// language not visited yet. A page that does not come back clean (signed out: a redirect)
// is dropped rather than kept: a page from an older build would ask for files this
// version no longer precaches.
self.addEventListener("install", (event) => {
  event.waitUntil(
    (async () => {
      const cache = await caches.open(PAGE_CACHE);
      await Promise.all(
        FIELD_PAGES.map(async (path) => {
          const key = new URL(path, self.location.origin).href;
          try {
            const res = await fetch(path, { credentials: "same-origin", redirect: "manual", cache: "no-store" });
            if (res.ok && res.type === "basic") await cache.put(key, res);
            else await cache.delete(key);
          } catch {
            // Offline during install: keep what is there.
          }
        }),
      );
    })(),
  );
});

async function notifyPages() {
  for (const client of await self.clients.matchAll({ type: "window" })) client.postMessage({ type: "ecotone-synced" });
}

async function syncAll(): Promise<void> {
  const db = await openFieldDb();
  let problem = false;
  for (const eventId of await eventsWithPending(db)) {
    const report = await syncEvent(db, eventId, Date.now, () => void notifyPages());
    if (report.problem) problem = true;
  }
  await notifyPages();
  // Failing the event asks the browser to try again later, with its own back-off.
  if (problem) throw new Error("outbox not empty yet");
}

self.addEventListener("sync", (event) => {
  const e = event as ExtendableEvent & { tag: string };
  if (e.tag === SYNC_TAG) e.waitUntil(syncAll());
});
