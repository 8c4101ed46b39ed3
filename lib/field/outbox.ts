import type { SyncAck } from "@/lib/sync/acks";
import { MAX_BATCH_RECORDS } from "@/lib/sync/limits";
import type { SessionRecord, SightingRecord } from "@/lib/sync/records";
import { backoffDelay } from "./backoff";
import type { FieldDatabase } from "./db";
import type { LocalPhoto, LocalSession, LocalSighting, TransientProblem } from "./types";

// The outbox: every record waits here (IndexedDB) after lib/field/save.ts validated and
// stored it, and is sent by lib/field/sync.ts. No validation library here: the service
// worker sends from this module and must stay small.

export async function cancelSession(db: FieldDatabase, id: string): Promise<{ detached: number } | null> {
  const tx = db.transaction(["sessions", "sightings"], "readwrite");
  const sessions = tx.objectStore("sessions");
  const before = await sessions.get(id);
  if (!before || before.record.cancelled) {
    await tx.done;
    return null;
  }
  let detached = 0;
  const sightingStore = tx.objectStore("sightings");
  for (const s of await sightingStore.index("byEvent").getAll(before.eventId)) {
    if (s.record.sessionId !== id) continue;
    detached++;
    const record = { ...s.record, sessionId: null };
    // A sent sighting changes only here (the server detaches its copy); anything else is sent as it is now.
    await sightingStore.put(s.state === "sent" ? { ...s, record } : { ...s, record, rev: s.rev + 1 });
  }
  if (!before.sentAt && before.state !== "sending") await sessions.delete(id);
  else
    await sessions.put({
      ...before,
      record: { ...before.record, cancelled: true },
      ...AGAIN,
      rev: before.rev + 1,
    });
  await tx.done;
  return { detached };
}

/**
 * Withdraws a sent sighting (pending or returned): the record goes out again with a
 * withdrawal of the version the server last said it had; the server takes it out of review
 * and of the results.
 */
export async function withdrawSighting(db: FieldDatabase, id: string): Promise<LocalSighting | null> {
  const tx = db.transaction("sightings", "readwrite");
  const before = await tx.store.get(id);
  if (!before || !before.sentAt) {
    await tx.done;
    return null;
  }
  const { answer: _a, correction: _c, ...rest } = before.record;
  const entry: LocalSighting = {
    ...before,
    record: { ...rest, withdrawal: { toVersion: before.serverVersion ?? 1 } },
    ...AGAIN,
    rev: before.rev + 1,
  };
  await tx.store.put(entry);
  await tx.done;
  return entry;
}

/**
 * Deletes a record that never reached the server (waiting or refused), with its photos.
 * A record the server has is never deleted here: withdraw it instead.
 */
export async function deleteUnsent(db: FieldDatabase, kind: "session" | "sighting", id: string): Promise<boolean> {
  const tx = db.transaction(["sessions", "sightings", "photos"], "readwrite");
  const store = tx.objectStore(kind === "session" ? "sessions" : "sightings");
  const before = await store.get(id);
  const unsent = before && !before.sentAt && before.state !== "sending" && before.state !== "sent";
  if (unsent) {
    await store.delete(id);
    if (kind === "sighting") {
      const photos = tx.objectStore("photos");
      for (const p of await photos.getAll()) if (p.sightingId === id) await photos.delete(p.id);
    }
  }
  await tx.done;
  return Boolean(unsent);
}

export type Batch = { sessions: LocalSession[]; sightings: LocalSighting[] };

/**
 * Takes the records that are due and marks them "sending", in one transaction so two
 * senders never take the same record. Sessions go first: a sighting may point at one.
 */
export async function takeBatch(
  db: FieldDatabase,
  eventId: string,
  now = Date.now(),
  max = MAX_BATCH_RECORDS,
): Promise<Batch> {
  // Short transactions (issue 18): both reads at once, the writes queued without waiting on
  // each, so a save on the same stores never waits long behind the sender.
  const tx = db.transaction(["sessions", "sightings"], "readwrite");
  const due = <T extends LocalSession | LocalSighting>(r: T) => r.state === "waiting" && r.nextTryAt <= now;
  const [allSessions, allSightings] = await Promise.all([
    tx.objectStore("sessions").index("byEvent").getAll(eventId),
    tx.objectStore("sightings").index("byEvent").getAll(eventId),
  ]);
  const sessions = allSessions
    .filter(due)
    .sort((a, b) => a.savedAt - b.savedAt)
    .slice(0, max)
    .map((s) => ({ ...s, state: "sending" as const, sendingRev: s.rev }));
  const sightings = allSightings
    .filter(due)
    .sort((a, b) => a.savedAt - b.savedAt)
    .slice(0, max - sessions.length)
    .map((s) => ({ ...s, state: "sending" as const, sendingRev: s.rev }));
  await Promise.all([
    ...sessions.map((s) => tx.objectStore("sessions").put(s)),
    ...sightings.map((s) => tx.objectStore("sightings").put(s)),
    tx.done,
  ]);
  return { sessions, sightings };
}

export function batchBody(batch: Batch): { sessions: SessionRecord[]; sightings: SightingRecord[] } {
  return { sessions: batch.sessions.map((s) => s.record), sightings: batch.sightings.map((s) => s.record) };
}

const STORED = new Set(["created", "already_had", "updated"]);

type Taken = LocalSession | LocalSighting;

/**
 * The one way a batch's records change after it went out: each record of the batch is read
 * again (it may have been edited meanwhile) and `next` says what it becomes, or null to
 * leave it as it is. One transaction for the whole batch.
 */
async function settleBatch(db: FieldDatabase, batch: Batch, next: (current: Taken, taken: Taken) => Taken | null) {
  const tx = db.transaction(["sessions", "sightings"], "readwrite");
  const taken = [...batch.sessions, ...batch.sightings];
  const storeOf = (t: Taken) =>
    tx.objectStore(t.kind === "session" ? "sessions" : "sightings") as unknown as {
      get(id: string): Promise<Taken | undefined>;
      put(v: Taken): Promise<unknown>;
    };
  // Every read at once, then every write at once: two round trips, however large the batch.
  const current = await Promise.all(taken.map((t) => storeOf(t).get(t.id)));
  const writes: Promise<unknown>[] = [];
  for (const [i, t] of taken.entries()) {
    const changed = current[i] ? next(current[i]!, t) : null;
    if (changed) writes.push(storeOf(t).put(changed));
  }
  await Promise.all([...writes, tx.done]);
}

/** A record still in flight goes back to waiting, to be tried again after a back-off. */
function tryLater<T extends Taken>(
  current: T,
  problem: TransientProblem,
  now: number,
  random?: () => number,
): T | null {
  if (current.state !== "sending") return null; // edited meanwhile: it already waits, as the edit
  const attempts = current.attempts + 1;
  return {
    ...current,
    state: "waiting",
    sendingRev: undefined,
    attempts,
    nextTryAt: now + backoffDelay(attempts, random),
    problem,
  };
}

/**
 * Applies the server's answer. Only acknowledged records leave the outbox (as "sent"); a
 * refused one is "failed" with its reason; a record edited while its batch was in flight
 * goes back to "waiting" so the edit is sent too; a record without an answer waits again.
 */
export async function applyAcks(
  db: FieldDatabase,
  batch: Batch,
  acks: SyncAck[],
  now = Date.now(),
): Promise<{ sent: number; refused: number }> {
  const answers = new Map<string, SyncAck>();
  for (const ack of acks) {
    const taken = (ack.kind === "session" ? batch.sessions : batch.sightings)[ack.index];
    const key = `${ack.kind}:${taken?.id}`;
    if (taken && (ack.id === null || ack.id === taken.id) && !answers.has(key)) answers.set(key, ack);
  }
  let sent = 0;
  let refused = 0;
  await settleBatch(db, batch, (current, taken) => {
    const ack = answers.get(`${taken.kind}:${taken.id}`);
    if (!ack) return tryLater(current, "server", now);
    const edited = current.rev !== taken.sendingRev;
    if (!STORED.has(ack.outcome)) {
      refused++;
      return edited
        ? { ...current, state: "waiting", sendingRev: undefined }
        : {
            ...current,
            state: "failed",
            sendingRev: undefined,
            reason: ack.reason ?? "",
            field: ack.field,
            problem: undefined,
          };
    }
    sent++;
    const next: Taken = edited
      ? { ...current, state: "waiting", sendingRev: undefined, attempts: 0, nextTryAt: 0 }
      : {
          ...current,
          state: "sent",
          sendingRev: undefined,
          attempts: 0,
          nextTryAt: 0,
          problem: undefined,
          reason: undefined,
          field: undefined,
          sentAt: now,
        };
    if (next.kind === "sighting") {
      if (ack.reviewState) next.reviewState = ack.reviewState;
      // The answer went with this version; a later edit is a new conversation.
      if (!edited && next.record.answer) next.question = undefined;
      if (!edited && next.record.withdrawal) next.withdrawn = true;
    }
    return next;
  });
  return { sent, refused };
}

/** The whole batch did not go through for a reason that is not the records' fault: wait, then try again. */
export async function releaseBatch(
  db: FieldDatabase,
  batch: Batch,
  problem: TransientProblem,
  now = Date.now(),
  random?: () => number,
) {
  await settleBatch(db, batch, (current) => tryLater(current, problem, now, random));
}

/** The server refused the whole batch (not a member any more, the event closed): each record shows why. */
export async function refuseBatch(db: FieldDatabase, batch: Batch, reason: string) {
  await settleBatch(db, batch, (current) =>
    current.state === "sending"
      ? { ...current, state: "failed", sendingRev: undefined, reason, problem: undefined }
      : null,
  );
}

/**
 * Walks every session, sighting and photo on the device; `next` returns the new value, or null to
 * leave one alone. A read-only pass finds what would change; only those are read again and
 * written, in a short read-write transaction (a save never waits behind a walk of the whole
 * device, issue 18); `next` sees the value as it is in that transaction.
 */
async function rewriteEvery(db: FieldDatabase, next: (v: LocalSession | LocalSighting | LocalPhoto) => object | null) {
  const names = ["sessions", "sightings", "photos"] as const;
  const read = db.transaction(names, "readonly");
  const all = await Promise.all(names.map((name) => read.objectStore(name).getAll()));
  await read.done;
  const found = names.flatMap((name, i) =>
    (all[i] as (LocalSession | LocalSighting | LocalPhoto)[]).filter((v) => next(v)).map((v) => ({ name, id: v.id })),
  );
  if (found.length === 0) return;
  const tx = db.transaction(names, "readwrite");
  const store = (name: (typeof names)[number]) =>
    tx.objectStore(name) as unknown as {
      get(id: string): Promise<LocalSession | LocalSighting | LocalPhoto | undefined>;
      put(v: object): Promise<unknown>;
    };
  const current = await Promise.all(found.map((f) => store(f.name).get(f.id)));
  const writes: Promise<unknown>[] = [];
  for (const [i, f] of found.entries()) {
    const changed = current[i] ? next(current[i]!) : null;
    if (changed) writes.push(store(f.name).put(changed));
  }
  await Promise.all([...writes, tx.done]);
}

/**
 * After a crash or a closed tab, records left "sending" would never move: put them back.
 * Call only while holding the sync lock (lib/field/sync.ts), when nothing is in flight.
 */
export async function resetInFlight(db: FieldDatabase) {
  await rewriteEvery(db, (v) => (v.state === "sending" ? { ...v, state: "waiting", sendingRev: undefined } : null));
}

/** "Try again now": the network came back, or the person asked. */
export async function makeDueNow(db: FieldDatabase, eventId?: string) {
  await rewriteEvery(db, (v) =>
    (!eventId || v.eventId === eventId) && v.state === "waiting" && v.nextTryAt > 0 ? { ...v, nextTryAt: 0 } : null,
  );
}

export async function eventRecords(db: FieldDatabase, eventId: string) {
  const [sessions, sightings, photos] = await Promise.all([
    db.getAllFromIndex("sessions", "byEvent", eventId),
    db.getAllFromIndex("sightings", "byEvent", eventId),
    db.getAllFromIndex("photos", "byEvent", eventId),
  ]);
  return { sessions, sightings, photos };
}

/** Events with anything not yet sent (for the service worker's background sync). */
export async function eventsWithPending(db: FieldDatabase): Promise<string[]> {
  const ids = new Set<string>();
  for (const name of ["sessions", "sightings", "photos"] as const) {
    for (const r of await db.getAll(name)) if (r.state === "waiting" || r.state === "sending") ids.add(r.eventId);
  }
  return [...ids];
} /** A sent record going out again: waiting, tried afresh, any earlier refusal forgotten. */
const AGAIN = {
  state: "waiting",
  attempts: 0,
  nextTryAt: 0,
  problem: undefined,
  reason: undefined,
  field: undefined,
} as const;
