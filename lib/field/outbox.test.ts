import "fake-indexeddb/auto";
import { randomUUID } from "node:crypto";
import { describe, expect, it } from "vitest";
import type { SightingRecord } from "@/lib/sync/records";
import { openFieldDb } from "./db";
import {
  applyAcks,
  cancelSession,
  deleteUnsent,
  eventRecords,
  makeDueNow,
  refuseBatch,
  releaseBatch,
  resetInFlight,
  takeBatch,
  withdrawSighting,
} from "./outbox";
import { InvalidRecord, saveSession, saveSighting } from "./save";

// The outbox over IndexedDB (fake-indexeddb: an in-memory implementation of the
// IndexedDB API, run through the real idb wrapper and our real outbox code).
const EVENT = "11111111-1111-4111-8111-111111111111";

function sighting(over: Partial<SightingRecord> = {}): SightingRecord {
  return {
    id: randomUUID(),
    sessionId: null,
    taxonId: randomUUID(),
    description: "",
    count: 2,
    countIsEstimate: false,
    observedAt: "2026-12-02T10:00:00.000Z",
    latitude: 53.301,
    longitude: -2.095,
    accuracyM: 8,
    zoneId: null,
    notes: "",
    photoIds: [],
    ...over,
  };
}

const freshDb = () => openFieldDb(`test-${randomUUID()}`);

describe("field outbox", () => {
  it("refuses to queue a record the server would refuse, naming the field", async () => {
    const db = await freshDb();
    await expect(saveSighting(db, EVENT, sighting({ count: 0 }), "Mallard")).rejects.toThrow(InvalidRecord);
    const err = (await saveSighting(db, EVENT, sighting({ latitude: 91 }), "Mallard").catch(
      (e: unknown) => e,
    )) as InvalidRecord;
    expect(err.issues[0]?.field).toBe("latitude");
    expect((await eventRecords(db, EVENT)).sightings).toHaveLength(0);
  });

  it("keeps a saved record waiting, then sending, then sent once acknowledged", async () => {
    const db = await freshDb();
    const session = await saveSession(db, EVENT, {
      id: randomUUID(),
      zoneId: null,
      kind: "walk",
      startedAt: "2026-12-02T09:00:00Z",
      endedAt: null,
      allSpeciesNoted: false,
      distanceM: null,
      notes: "",
    });
    const s = await saveSighting(db, EVENT, sighting({ sessionId: session.id }), "Mallard");
    expect(s.state).toBe("waiting");

    const batch = await takeBatch(db, EVENT);
    expect(batch.sessions.map((x) => x.id)).toEqual([session.id]);
    expect(batch.sightings.map((x) => x.id)).toEqual([s.id]);
    expect((await db.get("sightings", s.id))?.state).toBe("sending");
    // A second sender finds nothing to take.
    const second = await takeBatch(db, EVENT);
    expect(second.sessions.length + second.sightings.length).toBe(0);

    await applyAcks(db, batch, [
      { kind: "session", id: session.id, index: 0, outcome: "created" },
      { kind: "sighting", id: s.id, index: 0, outcome: "created", reviewState: "pending" },
    ]);
    expect((await db.get("sessions", session.id))?.state).toBe("sent");
    const sent = await db.get("sightings", s.id);
    expect(sent?.state).toBe("sent");
    expect(sent?.reviewState).toBe("pending");
    const again = await takeBatch(db, EVENT);
    expect(again.sightings).toHaveLength(0);
  });

  it("cancels a session: its sightings lose the session; an unsent one goes, a sent one goes out cancelled", async () => {
    const db = await freshDb();
    const base = {
      zoneId: null,
      kind: "timed_count" as const,
      startedAt: "2026-12-02T09:00:00Z",
      endedAt: null,
      allSpeciesNoted: false,
      distanceM: null,
      notes: "",
    };
    // Never sent: it simply goes, and its waiting sighting will be sent without it.
    const unsent = await saveSession(db, EVENT, { ...base, id: randomUUID() });
    const a = await saveSighting(db, EVENT, sighting({ sessionId: unsent.id }), "Mallard");
    expect(await cancelSession(db, unsent.id)).toEqual({ detached: 1 });
    expect(await db.get("sessions", unsent.id)).toBeUndefined();
    expect((await db.get("sightings", a.id))?.record.sessionId).toBeNull();

    // Sent with a sent sighting: the session goes out again, cancelled; the sighting is not resent.
    const sent = await saveSession(db, EVENT, { ...base, id: randomUUID() });
    const b = await saveSighting(db, EVENT, sighting({ sessionId: sent.id }), "Grey heron");
    const batch = await takeBatch(db, EVENT);
    await applyAcks(db, batch, [
      { kind: "session", id: sent.id, index: 0, outcome: "created" },
      ...batch.sightings.map((x, index) => ({
        kind: "sighting" as const,
        id: x.id,
        index,
        outcome: "created" as const,
      })),
    ]);
    expect(await cancelSession(db, sent.id)).toEqual({ detached: 1 });
    const after = await db.get("sessions", sent.id);
    expect(after).toMatchObject({ state: "waiting", record: { cancelled: true } });
    expect(await db.get("sightings", b.id)).toMatchObject({ state: "sent", record: { sessionId: null } });
    const next = await takeBatch(db, EVENT);
    expect(next.sessions.map((x) => x.id)).toEqual([sent.id]);
    expect(next.sightings).toHaveLength(0);
    // Cancelling twice does nothing more.
    expect(await cancelSession(db, sent.id)).toBeNull();
  });

  it("keeps a refused record visible with its reason, and sends the rest", async () => {
    const db = await freshDb();
    const good = await saveSighting(db, EVENT, sighting(), "Mallard", [], 1);
    const bad = await saveSighting(db, EVENT, sighting(), "Grey heron", [], 2);
    const batch = await takeBatch(db, EVENT);
    await applyAcks(db, batch, [
      { kind: "sighting", id: good.id, index: 0, outcome: "already_had" },
      {
        kind: "sighting",
        id: bad.id,
        index: 1,
        outcome: "refused",
        reason: "This taxon is not known.",
        field: "taxonId",
      },
    ]);
    expect((await db.get("sightings", good.id))?.state).toBe("sent");
    const refused = await db.get("sightings", bad.id);
    expect(refused).toMatchObject({ state: "failed", reason: "This taxon is not known.", field: "taxonId" });
    // Editing the refused record queues it again.
    await saveSighting(db, EVENT, { ...refused!.record, taxonId: randomUUID() }, "Grey heron");
    expect((await db.get("sightings", bad.id))?.state).toBe("waiting");
  });

  it("sends an edit made while the earlier version was in flight", async () => {
    const db = await freshDb();
    const s = await saveSighting(db, EVENT, sighting(), "Mallard");
    const batch = await takeBatch(db, EVENT);
    await saveSighting(db, EVENT, { ...s.record, count: 5 }, "Mallard");
    await applyAcks(db, batch, [{ kind: "sighting", id: s.id, index: 0, outcome: "created" }]);
    const after = await db.get("sightings", s.id);
    expect(after?.state).toBe("waiting");
    expect(after?.record.count).toBe(5);
    const next = await takeBatch(db, EVENT);
    expect(next.sightings[0]?.record.count).toBe(5);
  });

  it("waits longer after each failed try, and goes at once when the network returns", async () => {
    const db = await freshDb();
    const s = await saveSighting(db, EVENT, sighting(), "Mallard");
    const now = 1_000_000;
    await releaseBatch(db, await takeBatch(db, EVENT, now), "offline", now, () => 1);
    let r = await db.get("sightings", s.id);
    expect(r).toMatchObject({ state: "waiting", attempts: 1, problem: "offline", nextTryAt: now + 5_000 });
    expect((await takeBatch(db, EVENT, now + 1_000)).sightings).toHaveLength(0);
    await releaseBatch(db, await takeBatch(db, EVENT, now + 5_000), "server", now + 5_000, () => 1);
    r = await db.get("sightings", s.id);
    expect(r).toMatchObject({ attempts: 2, nextTryAt: now + 5_000 + 10_000 });
    await makeDueNow(db, EVENT);
    expect((await takeBatch(db, EVENT, now + 5_001)).sightings).toHaveLength(1);
  });

  it("puts records left sending by a crash back in the queue, and treats a missing answer as a failed try", async () => {
    const db = await freshDb();
    const a = await saveSighting(db, EVENT, sighting(), "Mallard", [], 1);
    const b = await saveSighting(db, EVENT, sighting(), "Mallard", [], 2);
    const batch = await takeBatch(db, EVENT);
    await applyAcks(db, batch, [{ kind: "sighting", id: a.id, index: 0, outcome: "created" }]);
    expect(await db.get("sightings", b.id)).toMatchObject({ state: "waiting", attempts: 1 });
    await makeDueNow(db);
    await takeBatch(db, EVENT);
    expect((await db.get("sightings", b.id))?.state).toBe("sending");
    await resetInFlight(db);
    expect((await db.get("sightings", b.id))?.state).toBe("waiting");
    expect((await db.get("sightings", a.id))?.state).toBe("sent");
  });

  it("ignores an answer whose id does not match the record at that position", async () => {
    const db = await freshDb();
    const s = await saveSighting(db, EVENT, sighting(), "Mallard");
    const batch = await takeBatch(db, EVENT);
    await applyAcks(db, batch, [{ kind: "sighting", id: randomUUID(), index: 0, outcome: "created" }], 10);
    expect((await db.get("sightings", s.id))?.state).toBe("waiting");
  });

  it("shows the server's reason on every record of a batch refused whole, but keeps an edit made meanwhile waiting", async () => {
    const db = await freshDb();
    const session = await saveSession(db, EVENT, {
      id: randomUUID(),
      zoneId: null,
      kind: "walk",
      startedAt: "2026-12-02T09:00:00Z",
      endedAt: null,
      allSpeciesNoted: false,
      distanceM: null,
      notes: "",
    });
    const a = await saveSighting(db, EVENT, sighting(), "Mallard", [], 1);
    const b = await saveSighting(db, EVENT, sighting(), "Mallard", [], 2);
    const batch = await takeBatch(db, EVENT);
    await saveSighting(db, EVENT, { ...b.record, count: 7 }, "Mallard");
    await refuseBatch(db, batch, "You are not allowed to do this.");
    expect(await db.get("sessions", session.id)).toMatchObject({
      state: "failed",
      reason: "You are not allowed to do this.",
    });
    expect(await db.get("sightings", a.id)).toMatchObject({
      state: "failed",
      reason: "You are not allowed to do this.",
      sendingRev: undefined,
    });
    expect(await db.get("sightings", b.id)).toMatchObject({ state: "waiting", record: { count: 7 } });
  });

  it("counts what the server stored and refused, and updates the review state it tells", async () => {
    const db = await freshDb();
    const a = await saveSighting(db, EVENT, sighting(), "Mallard", [], 1);
    const b = await saveSighting(db, EVENT, sighting(), "Mallard", [], 2);
    const batch = await takeBatch(db, EVENT);
    const counts = await applyAcks(db, batch, [
      { kind: "sighting", id: b.id, index: 1, outcome: "refused", reason: "No.", field: "id" },
      { kind: "sighting", id: a.id, index: 0, outcome: "already_had", reviewState: "approved" },
    ]);
    expect(counts).toEqual({ sent: 1, refused: 1 });
    expect(await db.get("sightings", a.id)).toMatchObject({ state: "sent", reviewState: "approved" });
  });
});

describe("putting records right on the phone", () => {
  it("deletes a record that never reached the server, with its photos, and never one the server has", async () => {
    const db = await freshDb();
    const waiting = await saveSighting(db, EVENT, sighting(), "Mallard");
    const sent = await saveSighting(db, EVENT, sighting(), "Teal");
    const batch = await takeBatch(db, EVENT, 0);
    await applyAcks(
      db,
      { sessions: [], sightings: batch.sightings.filter((s) => s.id === sent.id) },
      [{ kind: "sighting", id: sent.id, index: 0, outcome: "created", reviewState: "pending" }],
      1,
    );
    await releaseBatch(db, { sessions: [], sightings: batch.sightings.filter((s) => s.id === waiting.id) }, "offline");
    expect(await deleteUnsent(db, "sighting", sent.id)).toBe(false);
    expect(await deleteUnsent(db, "sighting", waiting.id)).toBe(true);
    expect((await eventRecords(db, EVENT)).sightings.map((s) => s.id)).toEqual([sent.id]);
  });

  it("withdraws a sent sighting: it waits again with the version the server had", async () => {
    const db = await freshDb();
    const rec = await saveSighting(db, EVENT, sighting(), "Mallard");
    const batch = await takeBatch(db, EVENT, 0);
    await applyAcks(
      db,
      batch,
      [{ kind: "sighting", id: rec.id, index: 0, outcome: "created", reviewState: "pending" }],
      1,
    );
    const withdrawn = await withdrawSighting(db, rec.id);
    expect(withdrawn).toMatchObject({ state: "waiting", record: { withdrawal: { toVersion: 1 } } });
    const again = await takeBatch(db, EVENT, 2);
    await applyAcks(
      db,
      again,
      [{ kind: "sighting", id: rec.id, index: 0, outcome: "updated", reviewState: "rejected" }],
      3,
    );
    expect(await db.get("sightings", rec.id)).toMatchObject({
      state: "sent",
      reviewState: "rejected",
      withdrawn: true,
    });
  });
});
