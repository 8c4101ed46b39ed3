import { eventsWithPending, makeDueNow } from "./outbox";
import { FIELD_DB_NAME, openFieldDb, type FieldDatabase } from "./db";
import { PAGE_CACHE } from "./sw-constants";
import { syncEvent } from "./sync";

// Signing out on a shared phone: what is still waiting is sent or, if the person says so,
// dropped; then the phone's stored records, photos, event packs and cached field pages go.

const STORES = ["packs", "sessions", "sightings", "photos", "mine", "meta"] as const;

async function existingDb(): Promise<FieldDatabase | null> {
  if (typeof indexedDB === "undefined") return null;
  // Do not create the database on a device that never opened the field log.
  const list = typeof indexedDB.databases === "function" ? await indexedDB.databases().catch(() => null) : null;
  if (list && !list.some((d) => d.name === FIELD_DB_NAME)) return null;
  return openFieldDb().catch(() => null);
}

/** Records (sessions, sightings, photos) still waiting on this phone, not acknowledged by the server. */
export async function waitingOnDevice(): Promise<number> {
  const db = await existingDb();
  if (!db) return 0;
  let n = 0;
  for (const name of ["sessions", "sightings", "photos"] as const)
    for (const r of await db.getAll(name)) if (r.state === "waiting" || r.state === "sending") n++;
  return n;
}

/** Sends everything waiting now, event by event; returns how many are still waiting after. */
export async function sendWaitingNow(): Promise<number> {
  const db = await existingDb();
  if (!db) return 0;
  for (const eventId of await eventsWithPending(db)) {
    await makeDueNow(db, eventId);
    await syncEvent(db, eventId);
  }
  return waitingOnDevice();
}

/** Empties the phone's field store and its cached field pages. */
export async function clearDevice(): Promise<void> {
  const db = await existingDb();
  if (db) {
    const tx = db.transaction([...STORES], "readwrite");
    await Promise.all([...STORES.map((s) => tx.objectStore(s).clear()), tx.done]);
  }
  if (typeof caches !== "undefined") await caches.delete(PAGE_CACHE).catch(() => false);
}
