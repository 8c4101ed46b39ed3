import { api, ApiClientError } from "@/lib/http/client";
import type { SyncResponse } from "@/lib/sync/acks";
import type { MineResponse, MySighting } from "@/lib/sync/mine";
import type { SightingRecord } from "@/lib/sync/records";
import { backoffDelay } from "./backoff";
import type { FieldDatabase } from "./db";
import { applyAcks, batchBody, refuseBatch, releaseBatch, resetInFlight, takeBatch } from "./outbox";
import type { EventPack, LocalPhoto, LocalSighting, MineItem, StoredPack, TransientProblem } from "./types";

// Sending the outbox: one sender at a time per device (Web Locks, shared by the tabs and
// the service worker), batches of sessions and sightings, then photos of acknowledged
// sightings, then a fresh list of the person's own records with their review states.
// Runs in a page and in the service worker (Background Sync): no React, no DOM.

export type SyncReport = {
  ran: boolean;
  sent: number;
  refused: number;
  photosSent: number;
  problem?: TransientProblem;
};

const LOCK = "ecotone-field-sync";
const MAX_ROUNDS = 20;

type LockManagerLike = {
  request<T>(name: string, opts: { ifAvailable: boolean }, cb: (lock: unknown) => Promise<T>): Promise<T>;
};

async function withLock<T>(fallback: T, fn: () => Promise<T>): Promise<T> {
  const locks = (globalThis.navigator as { locks?: LockManagerLike } | undefined)?.locks;
  if (!locks) return fn();
  return locks.request(LOCK, { ifAvailable: true }, async (lock) => (lock ? fn() : fallback));
}

function problemFor(status: number): TransientProblem | null {
  if (status === 401) return "signin";
  if (status === 429) return "busy";
  if (status >= 500 || status === 408) return "server";
  return null;
}

/** The reason kept with a refused record: the server's message and the first field at fault. */
function refusalText(error: ApiClientError): string {
  const field = error.fields[0];
  return (
    [error.message, field ? `${field.field}: ${field.message}` : null].filter(Boolean).join(" — ") ||
    `HTTP ${error.status}`
  );
}

/** No answer, or a 2xx answer cut off before its body was read: the server may have acted. */
const noAnswer = (error: ApiClientError) => error.code === "network";
const cutAnswer = (error: ApiClientError) => error.code === "unreadable" && error.status >= 200 && error.status < 300;

// The photo handlers' answers (app/api/events/[eventId]/photos/schema.ts).
type PhotoPlan = { outcome: "upload"; uploadUrl: string; headers: Record<string, string> } | { outcome: "already_had" };

// A request that hangs must not hold the outbox: give up and try again later.
const API_TIMEOUT_MS = 60_000;
const UPLOAD_TIMEOUT_MS = 180_000;
const timeout = (ms: number) => (typeof AbortSignal.timeout === "function" ? AbortSignal.timeout(ms) : undefined);

/** Sends what is due for one event. `onProgress` runs after each stored batch and photo, so the screen can follow. */
export async function syncEvent(
  db: FieldDatabase,
  eventId: string,
  now: () => number = Date.now,
  onProgress?: () => void,
): Promise<SyncReport> {
  return withLock<SyncReport>({ ran: false, sent: 0, refused: 0, photosSent: 0 }, async () => {
    await resetInFlight(db); // we hold the lock: anything "sending" is left over from a crash
    const report: SyncReport = { ran: true, sent: 0, refused: 0, photosSent: 0 };
    for (let round = 0; round < MAX_ROUNDS; round++) {
      const batch = await takeBatch(db, eventId, now());
      if (batch.sessions.length + batch.sightings.length === 0) break;
      const res = await api.call<SyncResponse>(`/api/events/${eventId}/sync`, {
        method: "POST",
        body: batchBody(batch),
        signal: timeout(API_TIMEOUT_MS),
      });
      if (!res.ok && noAnswer(res.error)) {
        await releaseBatch(db, batch, "offline", now());
        report.problem = "offline";
        return report;
      }
      if (res.ok || cutAnswer(res.error)) {
        // A cut answer acknowledges nothing: every record of the batch waits and goes again.
        const r = await applyAcks(db, batch, res.ok ? res.data.acks : [], now());
        report.sent += r.sent;
        report.refused += r.refused;
        onProgress?.();
        continue;
      }
      const problem = problemFor(res.error.status);
      if (problem) {
        await releaseBatch(db, batch, problem, now());
        report.problem = problem;
        return report;
      }
      await refuseBatch(db, batch, refusalText(res.error));
      report.refused += batch.sessions.length + batch.sightings.length;
    }
    const photos = await sendPhotos(db, eventId, now, onProgress);
    report.photosSent = photos.sent;
    if (photos.problem) {
      report.problem = photos.problem;
      return report;
    }
    // Always one request at least, so the report tells whether the server answers at all.
    await refreshMine(db, eventId).catch(() => {
      report.problem = "offline";
    });
    return report;
  });
}

/** Photos go after their sighting is acknowledged: register, PUT the bytes to the presigned URL, confirm. */
async function sendPhotos(
  db: FieldDatabase,
  eventId: string,
  now: () => number,
  onProgress?: () => void,
): Promise<{ sent: number; problem?: TransientProblem }> {
  const photos = (await db.getAllFromIndex("photos", "byEvent", eventId)).filter(
    (p) => p.state === "waiting" && p.nextTryAt <= now(),
  );
  let sent = 0;
  for (const photo of photos) {
    const sighting = await db.get("sightings", photo.sightingId);
    if (!sighting?.sentAt) continue; // the server does not have the sighting yet
    await db.put("photos", { ...photo, state: "sending" });
    const outcome = await uploadPhoto(eventId, photo);
    const current = (await db.get("photos", photo.id)) ?? photo;
    if (outcome.ok) {
      sent++;
      await db.put("photos", {
        ...current,
        state: "sent",
        sentAt: now(),
        attempts: 0,
        nextTryAt: 0,
        problem: undefined,
        reason: undefined,
      });
      onProgress?.();
    } else if (outcome.refused !== undefined) {
      await db.put("photos", { ...current, state: "failed", reason: outcome.refused, problem: undefined });
    } else {
      const attempts = current.attempts + 1;
      await db.put("photos", {
        ...current,
        state: "waiting",
        attempts,
        nextTryAt: now() + backoffDelay(attempts),
        problem: outcome.problem,
      });
      return { sent, problem: outcome.problem };
    }
  }
  return { sent };
}

type UploadOutcome =
  | { ok: true }
  | { ok: false; refused: string; problem?: undefined }
  | { ok: false; refused?: undefined; problem: TransientProblem };

async function uploadPhoto(eventId: string, photo: LocalPhoto): Promise<UploadOutcome> {
  const fail = (error: ApiClientError): UploadOutcome => {
    if (noAnswer(error)) return { ok: false, problem: "offline" };
    const problem = problemFor(error.status);
    return problem ? { ok: false, problem } : { ok: false, refused: refusalText(error) };
  };
  const meta = {
    id: photo.id,
    sightingId: photo.sightingId,
    contentType: photo.contentType,
    sizeBytes: photo.sizeBytes,
    sha256: photo.sha256,
    width: photo.width,
    height: photo.height,
  };
  const start = await api.call<PhotoPlan>(`/api/events/${eventId}/photos`, {
    method: "POST",
    body: meta,
    signal: timeout(API_TIMEOUT_MS),
  });
  if (!start.ok) return cutAnswer(start.error) ? { ok: false, problem: "offline" } : fail(start.error);
  const plan = start.data;
  if (plan.outcome === "already_had") return { ok: true };
  // The bytes go to the photo store's presigned URL: not one of our handlers, so a plain fetch.
  let put: Response;
  try {
    put = await fetch(plan.uploadUrl, {
      method: "PUT",
      headers: plan.headers,
      body: photo.blob,
      credentials: "omit",
      signal: timeout(UPLOAD_TIMEOUT_MS),
    });
  } catch {
    return { ok: false, problem: "offline" };
  }
  if (!put.ok)
    return put.status >= 500 ? { ok: false, problem: "server" } : { ok: false, refused: `HTTP ${put.status}` };
  const confirm = await api.call(`/api/events/${eventId}/photos/${photo.id}/confirm`, {
    method: "POST",
    body: {},
    signal: timeout(UPLOAD_TIMEOUT_MS),
  });
  // A cut answer after a 2xx: the server has the photo (it says "already had" next time).
  if (!confirm.ok && !cutAnswer(confirm.error)) return fail(confirm.error);
  return { ok: true };
}

/**
 * A sighting record out of one row of GET …/sightings/mine (the server's own answer, typed
 * by lib/sync/mine.ts), or null when a row lacks what a record needs. Checked by hand, not
 * with the record schema: this runs in the service worker too, which stays free of the
 * validation library (lib/field/save.ts validates what the person saves).
 */
function mineRecord(x: MySighting): SightingRecord | null {
  const finite = (v: unknown): v is number => typeof v === "number" && Number.isFinite(v);
  if (typeof x.id !== "string" || typeof x.observedAt !== "string" || Number.isNaN(Date.parse(x.observedAt)))
    return null;
  if (!finite(x.count) || !finite(x.latitude) || !finite(x.longitude) || !finite(x.accuracyM)) return null;
  if (!x.taxonId && !x.description) return null; // unidentified records carry a description
  return {
    id: x.id,
    sessionId: x.sessionId ?? null,
    taxonId: x.taxonId ?? null,
    description: x.description ?? "",
    count: x.count,
    countIsEstimate: Boolean(x.countIsEstimate),
    observedAt: x.observedAt,
    latitude: x.latitude,
    longitude: x.longitude,
    accuracyM: x.accuracyM,
    zoneId: x.zoneId ?? null,
    notes: x.notes ?? "",
    photoIds: [],
  };
}

/** The person's own sightings with their review state; returned ones carry the coordinator's question. */
export async function refreshMine(db: FieldDatabase, eventId: string): Promise<MineItem[] | null> {
  const res = await api.call<MineResponse>(`/api/events/${eventId}/sightings/mine`, { cache: "no-store" });
  if (!res.ok) {
    if (noAnswer(res.error) || cutAnswer(res.error)) throw res.error;
    return null;
  }
  const raw = res.data.sightings;
  const items: MineItem[] = raw.map((x) => ({
    id: x.id,
    reviewState: x.reviewState,
    version: x.version,
    question: x.question,
    taxonId: x.taxonId,
    count: x.count,
    observedAt: x.observedAt,
    rejectionReason: x.rejectionReason,
    withdrawn: x.withdrawn,
  }));
  await db.put("mine", { eventId, fetchedAt: Date.now(), items });
  const stored = await db.get("packs", eventId);
  const locale = (globalThis.document?.documentElement.lang || globalThis.navigator?.language || "en").slice(0, 2);
  // Which records change: found with one read-only read of the event's sightings, so the
  // read-write transaction below is short and only there when something changed (a save on
  // the same store never waits behind a long write of every record, issue 18).
  const before = new Map((await db.getAllFromIndex("sightings", "byEvent", eventId)).map((s) => [s.id, s]));
  const changes = items.flatMap((item, i) => {
    const local = before.get(item.id);
    const next = local ? mineState(local, item) : null;
    return !local || next ? [{ item, row: raw[i]! }] : [];
  });
  if (changes.length === 0) return items;
  const tx = db.transaction("sightings", "readwrite");
  const current = await Promise.all(changes.map((c) => tx.store.get(c.item.id)));
  const writes: Promise<unknown>[] = [];
  for (const [i, { item, row }] of changes.entries()) {
    const local = current[i];
    if (!local) {
      // Sent from another phone, or before this one was cleared: kept as a sent record so
      // its review state shows, and a returned one can be answered from here.
      const record = mineRecord(row);
      if (!record) continue;
      const species = stored?.pack.species.find((sp) => sp.id === record.taxonId);
      const label = species
        ? (species.names[locale] ?? species.names.en ?? species.scientificName)
        : (row.scientificName ?? record.description);
      const at = Date.parse(record.observedAt);
      writes.push(
        tx.store.put({
          kind: "sighting",
          id: item.id,
          eventId,
          state: "sent",
          rev: 0,
          attempts: 0,
          nextTryAt: 0,
          savedAt: at,
          sentAt: at,
          record,
          taxonLabel: label,
          reviewState: item.reviewState,
          serverVersion: item.version,
          question: item.reviewState === "returned" ? (item.question ?? undefined) : undefined,
          rejectionReason: item.rejectionReason ?? undefined,
          withdrawn: item.withdrawn,
        }),
      );
      continue;
    }
    // A local edit waiting to go out keeps its own text; the states still update.
    const next = mineState(local, item);
    if (next) writes.push(tx.store.put(next));
  }
  await Promise.all([...writes, tx.done]);
  return items;
}

/** A local sighting with the server's review state applied, or null when nothing changes. */
function mineState(local: LocalSighting, item: MineItem): LocalSighting | null {
  const next: LocalSighting = {
    ...local,
    reviewState: item.reviewState,
    serverVersion: item.version,
    rejectionReason: item.rejectionReason ?? undefined,
    withdrawn: item.withdrawn,
    question:
      item.reviewState === "returned"
        ? (item.question ?? local.question)
        : local.record.answer
          ? local.question
          : undefined,
  };
  const same =
    next.reviewState === local.reviewState &&
    next.serverVersion === local.serverVersion &&
    next.rejectionReason === local.rejectionReason &&
    next.withdrawn === local.withdrawn &&
    next.question === local.question;
  return same ? null : next;
}

/** Downloads the event pack when it changed (ETag), and keeps it for offline use. */
export async function refreshPack(
  db: FieldDatabase,
  eventId: string,
): Promise<{ changed: boolean; pack: StoredPack | null }> {
  const stored = await db.get("packs", eventId);
  let res: Awaited<ReturnType<typeof api.getIfChanged<EventPack>>>;
  try {
    res = await api.getIfChanged<EventPack>(`/api/events/${eventId}/pack`, stored?.etag ?? null, { cache: "no-cache" });
  } catch (err) {
    // No answer (or a cut one) is thrown: the caller learns it is offline. A refusal keeps what is stored.
    if (err instanceof ApiClientError && !noAnswer(err) && !cutAnswer(err))
      return { changed: false, pack: stored ?? null };
    throw err;
  }
  if (!res.changed) return { changed: false, pack: stored ?? null };
  const next: StoredPack = { eventId, etag: res.etag, pack: res.data, fetchedAt: Date.now() };
  await db.put("packs", next);
  return { changed: true, pack: next };
}
