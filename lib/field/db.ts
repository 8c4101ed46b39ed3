import { openDB, type DBSchema, type IDBPDatabase } from "idb";
import type { LocalPhoto, LocalSession, LocalSighting, StoredMine, StoredPack } from "./types";

// The device's store (IndexedDB through idb). One database per browser profile; records
// carry their event id. Nothing here is deleted until the server has acknowledged it, and
// acknowledged records are kept (as "sent") so the volunteer sees their day.
export const FIELD_DB_NAME = "ecotone-field";
const VERSION = 1;

export interface FieldDb extends DBSchema {
  packs: { key: string; value: StoredPack };
  sessions: { key: string; value: LocalSession; indexes: { byEvent: string } };
  sightings: { key: string; value: LocalSighting; indexes: { byEvent: string } };
  photos: { key: string; value: LocalPhoto; indexes: { byEvent: string; bySighting: string } };
  mine: { key: string; value: StoredMine };
  meta: { key: string; value: unknown };
}

export type FieldDatabase = IDBPDatabase<FieldDb>;

let opening: Promise<FieldDatabase> | undefined;

export function openFieldDb(name = FIELD_DB_NAME): Promise<FieldDatabase> {
  const open = () =>
    openDB<FieldDb>(name, VERSION, {
      upgrade(db) {
        db.createObjectStore("packs", { keyPath: "eventId" });
        db.createObjectStore("sessions", { keyPath: "id" }).createIndex("byEvent", "eventId");
        db.createObjectStore("sightings", { keyPath: "id" }).createIndex("byEvent", "eventId");
        const photos = db.createObjectStore("photos", { keyPath: "id" });
        photos.createIndex("byEvent", "eventId");
        photos.createIndex("bySighting", "sightingId");
        db.createObjectStore("mine", { keyPath: "eventId" });
        db.createObjectStore("meta");
      },
    });
  if (name !== FIELD_DB_NAME) return open();
  opening ??= open().catch((err) => {
    opening = undefined;
    throw err;
  });
  return opening;
}
