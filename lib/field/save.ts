import type { SessionRecord, SightingRecord } from "@/lib/sync/records";
import type { FieldDatabase } from "./db";
import type { LocalPhoto, LocalSession, LocalSighting } from "./types";

// Saving on the phone: every record is validated with the same zod schemas the server uses
// and written to the outbox (lib/field/outbox.ts) in one IndexedDB transaction. The pages
// use this module; the service worker, which only sends, does not. The schemas (and zod with
// them) are fetched at the first save, not with the field log's first load (issue 18); the
// event log asks for them when it opens (loadSchemas), so the save itself does not wait.

type Schemas = typeof import("@/lib/sync/records");
let schemas: Schemas | null = null;

/** The record schemas, loaded once; once loaded, a save starts its transaction at once, as before. */
export const loadSchemas = async (): Promise<Schemas> => (schemas ??= await import("@/lib/sync/records"));

export class InvalidRecord extends Error {
  constructor(readonly issues: { field: string; code: string }[]) {
    super("invalid_record");
  }
}

function check<T>(
  schema: {
    safeParse(
      v: unknown,
    ): { success: true; data: T } | { success: false; error: { issues: { path: PropertyKey[]; code: string }[] } };
  },
  value: unknown,
): T {
  const parsed = schema.safeParse(value);
  if (!parsed.success)
    throw new InvalidRecord(parsed.error.issues.map((i) => ({ field: i.path.map(String).join("."), code: i.code })));
  return parsed.data;
}

/** Saves (or replaces, after an edit) a count session; it waits to be sent. */
export async function saveSession(
  db: FieldDatabase,
  eventId: string,
  input: SessionRecord,
  now = Date.now(),
): Promise<LocalSession> {
  const { sessionRecord } = schemas ?? (await loadSchemas());
  const record = check<SessionRecord>(sessionRecord, input);
  const tx = db.transaction("sessions", "readwrite");
  const before = await tx.store.get(record.id);
  const entry: LocalSession = {
    kind: "session",
    id: record.id,
    eventId,
    record,
    state: "waiting",
    rev: (before?.rev ?? 0) + 1,
    attempts: 0,
    nextTryAt: 0,
    savedAt: before?.savedAt ?? now,
  };
  await tx.store.put(entry);
  await tx.done;
  return entry;
}

/** Saves (or replaces, after an edit) a sighting, and its new photos, in one transaction. */
export async function saveSighting(
  db: FieldDatabase,
  eventId: string,
  input: SightingRecord,
  taxonLabel: string,
  photos: Omit<LocalPhoto, "state" | "attempts" | "nextTryAt" | "savedAt" | "eventId" | "sightingId">[] = [],
  now = Date.now(),
): Promise<LocalSighting> {
  const { sightingRecord } = schemas ?? (await loadSchemas());
  const record = check<SightingRecord>(sightingRecord, {
    ...input,
    photoIds: [...new Set([...(input.photoIds ?? []), ...photos.map((p) => p.id)])],
  });
  const tx = db.transaction(["sightings", "photos"], "readwrite");
  const store = tx.objectStore("sightings");
  const before = await store.get(record.id);
  const entry: LocalSighting = {
    ...(before ?? {}),
    kind: "sighting",
    id: record.id,
    eventId,
    record,
    taxonLabel,
    state: "waiting",
    rev: (before?.rev ?? 0) + 1,
    attempts: 0,
    nextTryAt: 0,
    problem: undefined,
    reason: undefined,
    field: undefined,
    sendingRev: undefined,
    savedAt: before?.savedAt ?? now,
  };
  await store.put(entry);
  for (const p of photos) {
    await tx
      .objectStore("photos")
      .put({ ...p, eventId, sightingId: record.id, state: "waiting", attempts: 0, nextTryAt: 0, savedAt: now });
  }
  await tx.done;
  return entry;
}

/**
 * Cancels a count session: its sightings on the phone become sightings outside a session,
 * in the same transaction. A session the server never had simply goes; one it has goes out
 * again marked cancelled (the server then detaches the sightings it holds, too). A waiting
 * sighting is sent without the session; a sent one is not sent again for this.
 */
