import { and, eq, sql } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { ingestBatch } from "@/db/queries/sync";
import * as s from "@/db/schema";
import { db, makeFixture, polygonSql } from "./helpers";

// The server half of the field log's sync, against the real database: what a phone sends
// and what it is told back, and what ends up stored.
type Fixture = Awaited<ReturnType<typeof makeFixture>>;
let f: Fixture;
let other: typeof s.users.$inferSelect;
let wetZone: typeof s.zones.$inferSelect;

const session = (over: Record<string, unknown> = {}) => ({
  id: crypto.randomUUID(), zoneId: f.zone.id, kind: "timed_count", startedAt: "2026-06-20T08:00:00Z",
  endedAt: "2026-06-20T08:30:00Z", allSpeciesNoted: true, distanceM: null, notes: "", ...over,
});
const sighting = (over: Record<string, unknown> = {}) => ({
  id: crypto.randomUUID(), sessionId: null, taxonId: f.taxon.id, description: "", count: 2, countIsEstimate: false,
  observedAt: "2026-06-20T08:10:00Z", latitude: 0.2, longitude: 0.2, accuracyM: 8.3, zoneId: null, notes: "", photoIds: [], ...over,
});
const ingest = (sessions: unknown[], sightings: unknown[], who = f.user.id, locale: "en" | "es" | "fr" = "en", eventId = f.event.id) =>
  ingestBatch({ userId: who, isAdmin: false, eventId, locale, sessions, sightings, now: new Date("2026-06-21T00:00:00Z") });
const countOf = async (table: typeof s.sightings | typeof s.countSessions, userId: string) =>
  (await db().select({ n: sql<number>`count(*)::int` }).from(table).where(eq(table.userId, userId)))[0]!.n;

beforeAll(async () => {
  f = await makeFixture("sync");
  [other] = await db().insert(s.users).values({ email: "sync-other@example.org" }).returning() as [typeof s.users.$inferSelect];
  await db().insert(s.eventMembers).values([{ eventId: f.event.id, userId: f.user.id, role: "volunteer" }, { eventId: f.event.id, userId: other.id, role: "volunteer" }]);
  [wetZone] = await db().insert(s.zones).values({
    eventId: f.event.id, name: "Wet corner", habitat: "wetland", geom: polygonSql([[0.6, 0.6], [0.9, 0.6], [0.9, 0.9], [0.6, 0.9], [0.6, 0.6]]),
  }).returning() as [typeof s.zones.$inferSelect];
});

describe("a sync batch", () => {
  it("stores the good records and refuses the bad one alone, with its reason and field", async () => {
    const sess = session();
    const good1 = sighting({ sessionId: sess.id, zoneId: wetZone.id }); // device guessed the wrong zone
    const good2 = sighting({ latitude: 0.7, longitude: 0.7, taxonId: null, description: "small brown moth" });
    const badTaxon = sighting({ taxonId: crypto.randomUUID() });
    const badCount = sighting({ count: 0 });
    const acks = await ingest([sess], [good1, badTaxon, good2, badCount]);

    expect(acks.map((a) => [a.kind, a.index, a.outcome])).toEqual([
      ["session", 0, "created"], ["sighting", 0, "created"], ["sighting", 1, "refused"], ["sighting", 2, "created"], ["sighting", 3, "refused"],
    ]);
    expect(acks[2]).toMatchObject({ id: badTaxon.id, field: "taxonId", reason: expect.stringMatching(/species is not known/) });
    expect(acks[4]).toMatchObject({ id: badCount.id, field: "count", reason: "Must be at least 1." });

    const stored = await db().select({ id: s.sightings.id, zoneId: s.sightings.zoneId, sessionId: s.sightings.sessionId, state: s.sightings.reviewState })
      .from(s.sightings).where(eq(s.sightings.userId, f.user.id));
    expect(stored).toHaveLength(2);
    // The server decides the zone with PostGIS, whatever the device guessed.
    expect(stored.find((r) => r.id === good1.id)).toMatchObject({ zoneId: f.zone.id, sessionId: sess.id, state: "pending" });
    expect(stored.find((r) => r.id === good2.id)).toMatchObject({ zoneId: wetZone.id });
    // The reviewers' check marks are computed in the same transaction (the fixture's taxon is not on the species list).
    const [marked] = await db().select({ marks: s.sightings.checkMarks }).from(s.sightings).where(eq(s.sightings.id, good1.id));
    expect(marked!.marks).toEqual(["not_on_list", "photo_missing"]);
    expect(await countOf(s.countSessions, f.user.id)).toBe(1);

    // The same batch resent (a lost answer): nothing more is stored, each record is "already had".
    const again = await ingest([sess], [good1, badTaxon, good2, badCount]);
    expect(again.map((a) => a.outcome)).toEqual(["already_had", "already_had", "refused", "already_had", "refused"]);
    expect(await countOf(s.sightings, f.user.id)).toBe(2);
    expect(await countOf(s.countSessions, f.user.id)).toBe(1);
  });

  it("answers in the person's language", async () => {
    const [ack] = await ingest([], [sighting({ taxonId: null, description: "  " })], f.user.id, "es");
    expect(ack).toMatchObject({ outcome: "refused", field: "description", reason: "Un avistamiento sin identificar necesita una descripción." });
  });

  it("lets the owner end a session sent when it started, and refuses a session of a kind the event does not use", async () => {
    const started = session({ endedAt: null, allSpeciesNoted: false });
    expect((await ingest([started], []))[0]!.outcome).toBe("created");
    expect((await ingest([{ ...started, endedAt: "2026-06-20T09:00:00Z", allSpeciesNoted: true }], []))[0]!.outcome).toBe("updated");
    const [row] = await db().select().from(s.countSessions).where(eq(s.countSessions.id, started.id));
    expect(row!.allSpeciesNoted).toBe(true);
    await db().update(s.events).set({ sessionKinds: ["walk"] }).where(eq(s.events.id, f.event.id));
    try {
      expect((await ingest([session()], []))[0]).toMatchObject({ outcome: "refused", field: "kind" });
    } finally {
      await db().update(s.events).set({ sessionKinds: ["timed_count", "walk", "plot_search"] }).where(eq(s.events.id, f.event.id));
    }
  });

  it("refuses every record for an event that is not open, and from a person who is not a member", async () => {
    const before = await countOf(s.sightings, f.user.id);
    await db().update(s.events).set({ status: "closed" }).where(eq(s.events.id, f.event.id));
    try {
      const acks = await ingest([session()], [sighting()]);
      expect(acks.map((a) => [a.outcome, a.field])).toEqual([["refused", "eventId"], ["refused", "eventId"]]);
      expect(acks[1]!.reason).toMatch(/not open/);
    } finally {
      await db().update(s.events).set({ status: "open" }).where(eq(s.events.id, f.event.id));
    }
    const [stranger] = await db().insert(s.users).values({ email: "sync-stranger@example.org" }).returning();
    const acks = await ingest([], [sighting()], stranger!.id);
    expect(acks[0]).toMatchObject({ outcome: "refused", field: "eventId", reason: expect.stringMatching(/not a member/) });
    expect(await countOf(s.sightings, stranger!.id)).toBe(0);
    expect(await countOf(s.sightings, f.user.id)).toBe(before);
  });

  it("never overwrites another person's record that has the same id, nor accepts their session", async () => {
    const mine = sighting({ count: 3 });
    await ingest([], [mine]);
    const theirSession = session();
    await ingest([theirSession], [], other.id);
    const acks = await ingest([], [{ ...mine, count: 99 }], other.id);
    expect(acks.map((a) => [a.outcome, a.field])).toEqual([["refused", "id"]]);
    expect((await ingest([], [sighting({ sessionId: theirSession.id })]))[0]).toMatchObject({ outcome: "refused", field: "sessionId" });
    const [row] = await db().select().from(s.sightings).where(eq(s.sightings.id, mine.id));
    expect(row).toMatchObject({ userId: f.user.id, count: 3 });
    const sameContent = await ingest([], [mine], other.id);
    expect(sameContent[0]).toMatchObject({ outcome: "refused", field: "id" });
  });

  it("refuses a changed resend of a sighting that nobody returned", async () => {
    const rec = sighting();
    await ingest([], [rec]);
    expect((await ingest([], [{ ...rec, count: 5 }]))[0]).toMatchObject({ outcome: "refused", field: "id" });
  });

  it("takes the answer to a returned sighting: back to pending, one history row, version bumped; a stale answer is refused", async () => {
    const rec = sighting({ count: 1 });
    await ingest([], [rec]);
    const [coordinator] = await db().insert(s.users).values({ email: "sync-coord@example.org" }).returning();
    await db().update(s.sightings).set({ reviewState: "returned", version: 2 }).where(eq(s.sightings.id, rec.id));
    await db().insert(s.reviews).values({ sightingId: rec.id, reviewerId: coordinator!.id, fromState: "pending", toState: "returned", message: "How many exactly?" });

    const stale = await ingest([], [{ ...rec, count: 4, answer: { toVersion: 1, message: "Four" } }]);
    expect(stale[0]).toMatchObject({ outcome: "refused", field: "answer.toVersion", reason: expect.stringMatching(/version 2/) });

    const answer = { ...rec, count: 4, answer: { toVersion: 2, message: "Four, seen together" } };
    expect((await ingest([], [answer]))[0]).toMatchObject({ outcome: "updated", reviewState: "pending" });
    const [row] = await db().select().from(s.sightings).where(eq(s.sightings.id, rec.id));
    expect(row).toMatchObject({ count: 4, reviewState: "pending", version: 3 });
    const history = await db().select().from(s.reviews).where(and(eq(s.reviews.sightingId, rec.id), eq(s.reviews.reviewerId, f.user.id)));
    expect(history).toEqual([expect.objectContaining({ fromState: "returned", toState: "pending", message: "Four, seen together" })]);

    // The answer resent after a lost acknowledgement changes nothing.
    expect((await ingest([], [answer]))[0]).toMatchObject({ outcome: "already_had", reviewState: "pending" });
    expect(await db().select().from(s.reviews).where(eq(s.reviews.sightingId, rec.id))).toHaveLength(2);
  });
});
