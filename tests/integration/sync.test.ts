import { and, eq, sql } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { findUserById } from "@/db/queries/auth";
import { ingestBatch } from "@/db/queries/sync";
import * as s from "@/db/schema";
import { ApiError } from "@/lib/http/errors";
import { catalogues } from "@/lib/i18n/translator";
import { REFUSAL_CODES } from "@/lib/sync/acks";
import type { SessionRecord, SightingRecord } from "@/lib/sync/records";
import { eventPermitFor } from "@/server/auth/guard";
import { answerBatch } from "@/server/sync/answer";
import { db, makeFixture, polygonSql, syncSession, syncSighting } from "./helpers";

// The server half of the field log's sync, against the real database, in its two layers:
// the data layer (db/queries/sync.ts) takes parsed records and answers with outcome codes;
// the handler's part (the guard, then server/sync/answer.ts) parses each record and answers
// the phone with acknowledgements whose reasons are in the person's language.
type Fixture = Awaited<ReturnType<typeof makeFixture>>;
let f: Fixture;
let other: typeof s.users.$inferSelect;
let wetZone: typeof s.zones.$inferSelect;
const NOW = new Date("2026-06-21T00:00:00Z");

const session = (over: Record<string, unknown> = {}): SessionRecord => syncSession(f.zone.id, over);
const sighting = (over: Record<string, unknown> = {}): SightingRecord => syncSighting(f.taxon.id, over);
const indexed = <R>(records: R[]) => records.map((record, index) => ({ index, record }));
/** The data layer alone: typed records in, outcome codes out. */
const ingest = (sessions: SessionRecord[], sightings: SightingRecord[], who = f.user.id) =>
  ingestBatch({
    userId: who,
    eventId: f.event.id,
    sessions: indexed(sessions),
    sightings: indexed(sightings),
    now: NOW,
  });
/** As the sync handler answers after its guard: raw records in, translated acknowledgements out. */
async function answer(sessions: unknown[], sightings: unknown[], who = f.user.id, locale: "en" | "es" | "fr" = "en") {
  const user = (await findUserById(who))!;
  await eventPermitFor(user, f.event.id, "volunteer");
  return answerBatch({ userId: who, eventId: f.event.id, locale, now: NOW }, { sessions, sightings });
}
const countOf = async (table: typeof s.sightings | typeof s.countSessions, userId: string) =>
  (
    await db()
      .select({ n: sql<number>`count(*)::int` })
      .from(table)
      .where(eq(table.userId, userId))
  )[0]!.n;

beforeAll(async () => {
  f = await makeFixture("sync");
  [other] = (await db().insert(s.users).values({ email: "sync-other@example.org" }).returning()) as [
    typeof s.users.$inferSelect,
  ];
  await db()
    .insert(s.eventMembers)
    .values([
      { eventId: f.event.id, userId: f.user.id, role: "volunteer" },
      { eventId: f.event.id, userId: other.id, role: "volunteer" },
    ]);
  [wetZone] = (await db()
    .insert(s.zones)
    .values({
      eventId: f.event.id,
      name: "Wet corner",
      habitat: "wetland",
      geom: polygonSql([
        [0.6, 0.6],
        [0.9, 0.6],
        [0.9, 0.9],
        [0.6, 0.9],
        [0.6, 0.6],
      ]),
    })
    .returning()) as [typeof s.zones.$inferSelect];
});

describe("the sync data layer", () => {
  it("stores the good records and refuses the bad one alone, with its code and field", async () => {
    const sess = session();
    const good1 = sighting({ sessionId: sess.id, zoneId: wetZone.id }); // device guessed the wrong zone
    const good2 = sighting({ latitude: 0.7, longitude: 0.7, taxonId: null, description: "small brown moth" });
    const badTaxon = sighting({ taxonId: crypto.randomUUID() });
    const outcomes = await ingest([sess], [good1, badTaxon, good2]);

    expect(outcomes).toEqual([
      { kind: "session", id: sess.id, index: 0, outcome: "created" },
      { kind: "sighting", id: good1.id, index: 0, outcome: "created", reviewState: "pending" },
      { kind: "sighting", id: badTaxon.id, index: 1, outcome: "refused", code: "unknown_taxon", field: "taxonId" },
      { kind: "sighting", id: good2.id, index: 2, outcome: "created", reviewState: "pending" },
    ]);

    const stored = await db()
      .select({
        id: s.sightings.id,
        zoneId: s.sightings.zoneId,
        sessionId: s.sightings.sessionId,
        state: s.sightings.reviewState,
      })
      .from(s.sightings)
      .where(eq(s.sightings.userId, f.user.id));
    expect(stored).toHaveLength(2);
    // The server decides the zone with PostGIS, whatever the device guessed.
    expect(stored.find((r) => r.id === good1.id)).toMatchObject({
      zoneId: f.zone.id,
      sessionId: sess.id,
      state: "pending",
    });
    expect(stored.find((r) => r.id === good2.id)).toMatchObject({ zoneId: wetZone.id });
    // The reviewers' check marks are computed in the same transaction (the fixture's taxon is not on the species list).
    const [marked] = await db()
      .select({ marks: s.sightings.checkMarks })
      .from(s.sightings)
      .where(eq(s.sightings.id, good1.id));
    expect(marked!.marks).toEqual(["not_on_list", "photo_missing"]);
    expect(await countOf(s.countSessions, f.user.id)).toBe(1);

    // The same batch resent (a lost answer): nothing more is stored, each record is "already had".
    const again = await ingest([sess], [good1, badTaxon, good2]);
    expect(again.map((o) => o.outcome)).toEqual(["already_had", "already_had", "refused", "already_had"]);
    expect(await countOf(s.sightings, f.user.id)).toBe(2);
    expect(await countOf(s.countSessions, f.user.id)).toBe(1);
  });

  it("judges each record by the event's rules, answering a code and the field at fault", async () => {
    const outcomes = await ingest(
      [
        session({ zoneId: crypto.randomUUID() }),
        session({ endedAt: "2026-06-20T07:00:00Z" }),
        session({ endedAt: null, allSpeciesNoted: true }),
      ],
      [
        sighting({ taxonId: null, description: "  " }),
        sighting({ observedAt: "2026-06-22T00:00:00Z" }),
        sighting({ sessionId: crypto.randomUUID() }),
      ],
    );
    expect(outcomes.map((o) => [o.kind, o.index, o.outcome === "refused" ? [o.code, o.field] : o.outcome])).toEqual([
      ["session", 0, ["unknown_zone", "zoneId"]],
      ["session", 1, ["ends_before_start", "endedAt"]],
      ["session", 2, ["complete_needs_end", "allSpeciesNoted"]],
      ["sighting", 0, ["description_required", "description"]],
      ["sighting", 1, ["future_time", "observedAt"]],
      ["sighting", 2, ["unknown_session", "sessionId"]],
    ]);
  });

  it("takes ids in any case and answers in lower case", async () => {
    const sess = session();
    const shouting = { ...sess, id: sess.id.toUpperCase(), zoneId: f.zone.id.toUpperCase() };
    const rec = sighting({ sessionId: sess.id.toUpperCase(), taxonId: f.taxon.id.toUpperCase() });
    const outcomes = await ingest([shouting], [{ ...rec, id: rec.id.toUpperCase() }]);
    expect(outcomes.map((o) => [o.id, o.outcome])).toEqual([
      [sess.id, "created"],
      [rec.id, "created"],
    ]);
  });

  it("lets the owner end a session sent when it started, and refuses a session of a kind the event does not use", async () => {
    const started = session({ endedAt: null, allSpeciesNoted: false });
    expect((await ingest([started], []))[0]!.outcome).toBe("created");
    expect(
      (await ingest([{ ...started, endedAt: "2026-06-20T09:00:00Z", allSpeciesNoted: true }], []))[0]!.outcome,
    ).toBe("updated");
    const [row] = await db().select().from(s.countSessions).where(eq(s.countSessions.id, started.id));
    expect(row!.allSpeciesNoted).toBe(true);
    await db()
      .update(s.events)
      .set({ sessionKinds: ["walk"] })
      .where(eq(s.events.id, f.event.id));
    try {
      expect((await ingest([session()], []))[0]).toMatchObject({
        outcome: "refused",
        code: "kind_not_allowed",
        field: "kind",
      });
    } finally {
      await db()
        .update(s.events)
        .set({ sessionKinds: ["timed_count", "walk", "plot_search"] })
        .where(eq(s.events.id, f.event.id));
    }
  });

  it("stores an edited session (kind, zone, times, distance) as its owner sent it", async () => {
    const first = session({ endedAt: null, allSpeciesNoted: false });
    expect((await ingest([first], []))[0]!.outcome).toBe("created");
    const edited = {
      ...first,
      kind: "walk" as const,
      zoneId: wetZone.id,
      startedAt: "2026-06-20T07:45:00Z",
      endedAt: "2026-06-20T08:50:00Z",
      distanceM: 1234,
      allSpeciesNoted: true,
    };
    expect((await ingest([edited], []))[0]!.outcome).toBe("updated");
    const [row] = await db().select().from(s.countSessions).where(eq(s.countSessions.id, first.id));
    expect(row).toMatchObject({ kind: "walk", zoneId: wetZone.id, distanceM: 1234, allSpeciesNoted: true });
    expect(row!.startedAt.toISOString()).toBe("2026-06-20T07:45:00.000Z");
    expect(row!.endedAt!.toISOString()).toBe("2026-06-20T08:50:00.000Z");
    // Resent as it is, nothing changes.
    expect((await ingest([edited], []))[0]!.outcome).toBe("already_had");
  });

  it("cancels a session: the session goes, its sightings stay without a session; resent, nothing changes", async () => {
    const sess = session();
    const inside = [sighting({ sessionId: sess.id }), sighting({ sessionId: sess.id, count: 4 })];
    const outcomes = await ingest([sess], inside);
    expect(outcomes.map((o) => o.outcome)).toEqual(["created", "created", "created"]);

    // Another person cannot cancel it.
    expect((await ingest([{ ...sess, cancelled: true }], [], other.id))[0]).toMatchObject({
      outcome: "refused",
      code: "id_taken",
    });

    expect((await ingest([{ ...sess, cancelled: true }], []))[0]!.outcome).toBe("updated");
    expect(await db().select().from(s.countSessions).where(eq(s.countSessions.id, sess.id))).toHaveLength(0);
    for (const rec of inside) {
      const [row] = await db().select().from(s.sightings).where(eq(s.sightings.id, rec.id));
      expect(row).toMatchObject({ sessionId: null, count: rec.count, reviewState: "pending" });
    }
    // The same cancellation resent, and the sightings resent as the phone now has them.
    const again = await ingest(
      [{ ...sess, cancelled: true }],
      inside.map((r) => ({ ...r, sessionId: null })),
    );
    expect(again.map((o) => o.outcome)).toEqual(["already_had", "already_had", "already_had"]);
    // A cancelled session the server never had is not created.
    const never = session();
    expect((await ingest([{ ...never, cancelled: true }], []))[0]!.outcome).toBe("already_had");
    expect(await db().select().from(s.countSessions).where(eq(s.countSessions.id, never.id))).toHaveLength(0);
  });

  it("refuses a sighting outside its session's times and a count above the limit, with the phone's own rules", async () => {
    const sess = session(); // 08:00–08:30
    const late = sighting({ sessionId: sess.id, observedAt: "2026-06-20T09:00:00Z" });
    const huge = sighting({ count: 1_000_001 });
    const outcomes = await ingest([sess], [late, huge]);
    expect(outcomes.map((o) => (o.outcome === "refused" ? [o.code, o.field] : o.outcome))).toEqual([
      "created",
      ["outside_session", "observedAt"],
      ["count_too_high", "count"],
    ]);
  });

  it("refuses every record for an event that is not open", async () => {
    const before = await countOf(s.sightings, f.user.id);
    await db().update(s.events).set({ status: "closed" }).where(eq(s.events.id, f.event.id));
    try {
      const outcomes = await ingest([session()], [sighting()]);
      expect(outcomes.map((o) => o.outcome === "refused" && [o.code, o.field])).toEqual([
        ["event_not_open", "eventId"],
        ["event_not_open", "eventId"],
      ]);
    } finally {
      await db().update(s.events).set({ status: "open" }).where(eq(s.events.id, f.event.id));
    }
    expect(await countOf(s.sightings, f.user.id)).toBe(before);
  });

  it("never overwrites another person's record that has the same id, nor accepts their session", async () => {
    const mine = sighting({ count: 3 });
    await ingest([], [mine]);
    const theirSession = session();
    await ingest([theirSession], [], other.id);
    const outcomes = await ingest([], [{ ...mine, count: 99 }], other.id);
    expect(outcomes).toEqual([
      { kind: "sighting", id: mine.id, index: 0, outcome: "refused", code: "id_taken", field: "id" },
    ]);
    expect((await ingest([], [sighting({ sessionId: theirSession.id })]))[0]).toMatchObject({
      outcome: "refused",
      code: "unknown_session",
      field: "sessionId",
    });
    const [row] = await db().select().from(s.sightings).where(eq(s.sightings.id, mine.id));
    expect(row).toMatchObject({ userId: f.user.id, count: 3 });
    const sameContent = await ingest([], [mine], other.id);
    expect(sameContent[0]).toMatchObject({ outcome: "refused", code: "id_taken", field: "id" });
  });

  it("refuses a changed resend of a sighting that nobody returned", async () => {
    const rec = sighting();
    await ingest([], [rec]);
    expect((await ingest([], [{ ...rec, count: 5 }]))[0]).toMatchObject({
      outcome: "refused",
      code: "changed_after_send",
      field: "id",
    });
  });

  it("takes the answer to a returned sighting: back to pending, one history row, version bumped; a stale answer is refused", async () => {
    const rec = sighting({ count: 1 });
    await ingest([], [rec]);
    const [coordinator] = await db().insert(s.users).values({ email: "sync-coord@example.org" }).returning();
    await db().update(s.sightings).set({ reviewState: "returned", version: 2 }).where(eq(s.sightings.id, rec.id));
    await db().insert(s.reviews).values({
      sightingId: rec.id,
      eventId: f.event.id,
      reviewerId: coordinator!.id,
      fromState: "pending",
      toState: "returned",
      message: "How many exactly?",
    });

    const stale = await ingest([], [{ ...rec, count: 4, answer: { toVersion: 1, message: "Four" } }]);
    expect(stale[0]).toMatchObject({
      outcome: "refused",
      code: "stale_version",
      field: "answer.toVersion",
      values: { version: 2 },
    });

    const answered = { ...rec, count: 4, answer: { toVersion: 2, message: "Four, seen together" } };
    expect((await ingest([], [answered]))[0]).toMatchObject({ outcome: "updated", reviewState: "pending" });
    const [row] = await db().select().from(s.sightings).where(eq(s.sightings.id, rec.id));
    expect(row).toMatchObject({ count: 4, reviewState: "pending", version: 3 });
    const history = await db()
      .select()
      .from(s.reviews)
      .where(and(eq(s.reviews.sightingId, rec.id), eq(s.reviews.reviewerId, f.user.id)));
    expect(history).toEqual([
      expect.objectContaining({ fromState: "returned", toState: "pending", message: "Four, seen together" }),
    ]);

    // The answer resent after a lost acknowledgement changes nothing.
    expect((await ingest([], [answered]))[0]).toMatchObject({ outcome: "already_had", reviewState: "pending" });
    expect(await db().select().from(s.reviews).where(eq(s.reviews.sightingId, rec.id))).toHaveLength(2);
    // A sighting no longer returned takes no answer.
    expect((await ingest([], [{ ...answered, count: 5, answer: { toVersion: 3, message: "Five" } }]))[0]).toMatchObject(
      { code: "not_returned", field: "answer" },
    );
  });
});

describe("the sync handler's answer", () => {
  it("parses each record alone: a record that fails its schema is refused alone, in batch order, with the schema's reason", async () => {
    const sess = session();
    const good = sighting({ sessionId: sess.id });
    const badTaxon = sighting({ taxonId: crypto.randomUUID() });
    const badCount = { ...sighting(), count: 0 };
    const acks = await answer([sess, { id: "not-a-uuid" }], [good, badCount, badTaxon]);
    expect(acks).toEqual([
      { kind: "session", id: sess.id, index: 0, outcome: "created" },
      {
        kind: "session",
        id: null,
        index: 1,
        outcome: "refused",
        field: expect.any(String),
        reason: expect.any(String),
      },
      { kind: "sighting", id: good.id, index: 0, outcome: "created", reviewState: "pending" },
      {
        kind: "sighting",
        id: badCount.id,
        index: 1,
        outcome: "refused",
        field: "count",
        reason: "Must be at least 1.",
      },
      {
        kind: "sighting",
        id: badTaxon.id,
        index: 2,
        outcome: "refused",
        field: "taxonId",
        reason: "This species is not known to the server. Choose it again from the species list.",
      },
    ]);
  });

  it("answers in the person's language, with the values the reason names", async () => {
    const [ack] = await answer([], [sighting({ taxonId: null, description: "  " })], f.user.id, "es");
    expect(ack).toMatchObject({
      outcome: "refused",
      field: "description",
      reason: "Un avistamiento sin identificar necesita una descripción.",
    });

    const rec = sighting();
    await answer([], [rec]);
    await db().update(s.sightings).set({ reviewState: "returned", version: 4 }).where(eq(s.sightings.id, rec.id));
    const [stale] = await answer(
      [],
      [{ ...rec, count: 9, answer: { toVersion: 2, message: "Neuf" } }],
      f.user.id,
      "fr",
    );
    expect(stale).toMatchObject({
      outcome: "refused",
      field: "answer.toVersion",
      reason: expect.stringMatching(/version 4/),
    });
  });

  it("lets only members in: a stranger is refused before any record is read", async () => {
    const [stranger] = await db().insert(s.users).values({ email: "sync-stranger@example.org" }).returning();
    const refusal = await answer([], [sighting()], stranger!.id).catch((e: unknown) => e);
    expect(refusal).toBeInstanceOf(ApiError);
    expect((refusal as ApiError).code).toBe("forbidden");
    expect(await countOf(s.sightings, stranger!.id)).toBe(0);
  });

  it("has a reason in every language for every refusal code", () => {
    for (const locale of ["en", "es", "fr"] as const) {
      const reasons = catalogues[locale].FieldSync.reason as Record<string, string>;
      expect(Object.keys(reasons).sort()).toEqual([...REFUSAL_CODES].sort());
    }
  });
});
