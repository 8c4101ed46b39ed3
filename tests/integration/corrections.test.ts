import { and, asc, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { decide, type ReviewScope } from "@/db/queries/review";
import { ingestBatch } from "@/db/queries/sync";
import * as s from "@/db/schema";
import type { SightingRecord } from "@/lib/sync/records";
import { answerBatch } from "@/server/sync/answer";
import { db, makeFixture, refusal, syncSighting } from "./helpers";

// Issue 15, "records a volunteer can put right": corrections of sent sightings are new
// versions (the previous values kept, the history row saying what changed), withdrawals
// leave the results, and answers and corrections are taken through the review period,
// also after the event has closed.
type Fixture = Awaited<ReturnType<typeof makeFixture>>;
let f: Fixture;
let coordinator: string;
let scope: ReviewScope;
const NOW = new Date("2026-06-21T00:00:00Z");

const sighting = (over: Record<string, unknown> = {}): SightingRecord =>
  syncSighting(f.taxon.id, { accuracyM: 8, ...over });
const ingest = (records: SightingRecord[], now = NOW, eventId = f.event.id) =>
  ingestBatch({
    userId: f.user.id,
    eventId,
    sessions: [],
    sightings: records.map((record, index) => ({ index, record })),
    now,
  });
const row = async (id: string) => (await db().select().from(s.sightings).where(eq(s.sightings.id, id)))[0]!;
const results = async (eventId = f.event.id) =>
  (
    await db()
      .select()
      .from(s.resultTaxonCounts)
      .where(and(eq(s.resultTaxonCounts.eventId, eventId), eq(s.resultTaxonCounts.taxonId, f.taxon.id)))
  ).reduce((n, r) => ({ individuals: n.individuals + Number(r.individuals), sightings: n.sightings + r.sightings }), {
    individuals: 0,
    sightings: 0,
  });
const history = async (id: string) =>
  db().select().from(s.reviews).where(eq(s.reviews.sightingId, id)).orderBy(asc(s.reviews.id));

beforeAll(async () => {
  f = await makeFixture("corrections");
  const [c] = await db().insert(s.users).values({ email: "corrections-coord@example.org" }).returning();
  coordinator = c!.id;
  await db()
    .insert(s.eventMembers)
    .values([
      { eventId: f.event.id, userId: f.user.id, role: "volunteer" },
      { eventId: f.event.id, userId: coordinator, role: "coordinator" },
    ]);
  scope = { eventId: f.event.id, taxonGroups: [], locale: "en" };
});

describe("a correction of a sent sighting", () => {
  it("is a new version: the previous values kept, a history row saying what changed; resent, it changes nothing", async () => {
    const rec = sighting();
    expect((await ingest([rec]))[0]).toMatchObject({ outcome: "created", reviewState: "pending" });

    // Without the correction flag a changed resend is still refused.
    expect((await ingest([{ ...rec, count: 3 }]))[0]).toMatchObject({ outcome: "refused", code: "changed_after_send" });

    const corrected = { ...rec, count: 5, notes: "two more behind the hedge", correction: { toVersion: 1 } };
    expect((await ingest([corrected]))[0]).toMatchObject({ outcome: "updated", reviewState: "pending" });
    const now = await row(rec.id);
    expect(now).toMatchObject({ count: 5, notes: "two more behind the hedge", version: 2, reviewState: "pending" });

    const versions = await db().select().from(s.sightingVersions).where(eq(s.sightingVersions.sightingId, rec.id));
    expect(versions).toHaveLength(1);
    expect(versions[0]).toMatchObject({ version: 1, count: 2, notes: "", taxonId: f.taxon.id });

    const [h] = await history(rec.id);
    expect(h).toMatchObject({ reviewerId: f.user.id, fromState: "pending", toState: "pending", reason: "corrected" });
    expect(h!.message).toContain("count: 2 → 5");
    expect(h!.message).toContain("notes: — → two more behind the hedge");

    // The same correction resent (a lost acknowledgement) stores nothing more.
    expect((await ingest([corrected]))[0]).toMatchObject({ outcome: "already_had", reviewState: "pending" });
    expect(await history(rec.id)).toHaveLength(1);

    // A correction of a version a coordinator has since moved on from is refused, naming the version.
    expect((await ingest([{ ...rec, count: 6, correction: { toVersion: 1 } }]))[0]).toMatchObject({
      outcome: "refused",
      code: "stale_version",
      field: "correction.toVersion",
      values: { version: 2 },
    });

    // Earlier versions are history: never changed.
    expect(
      (
        await refusal(() =>
          db().update(s.sightingVersions).set({ count: 9 }).where(eq(s.sightingVersions.sightingId, rec.id)),
        )
      ).message,
    ).toMatch(/append-only/);
  });

  it("after approval sends the record back to review, and it leaves the results until approved again", async () => {
    const before = await results();
    const rec = sighting({ count: 4 });
    await ingest([rec]);
    expect(await decide(scope, coordinator, rec.id, { action: "approve", version: 1 })).toMatchObject({
      outcome: "ok",
    });
    expect(await results()).toEqual({ individuals: before.individuals + 4, sightings: before.sightings + 1 });

    expect((await ingest([{ ...rec, count: 7, correction: { toVersion: 2 } }]))[0]).toMatchObject({
      outcome: "updated",
      reviewState: "pending",
    });
    expect(await row(rec.id)).toMatchObject({ reviewState: "pending", count: 7, version: 3 });
    expect(await results()).toEqual(before);
    const rows = await history(rec.id);
    expect(rows.map((r) => [r.fromState, r.toState])).toEqual([
      ["pending", "approved"],
      ["approved", "pending"],
    ]);
  });
});

describe("an answer", () => {
  it("is taken when it changes nothing but says something, and its resend changes nothing more", async () => {
    const rec = sighting();
    await ingest([rec]);
    await decide(scope, coordinator, rec.id, { action: "return", version: 1, message: "Are you sure of the count?" });
    const answered = { ...rec, answer: { toVersion: 2, message: "Yes, two together" } };
    expect((await ingest([answered]))[0]).toMatchObject({ outcome: "updated", reviewState: "pending" });
    expect((await ingest([answered]))[0]).toMatchObject({ outcome: "already_had", reviewState: "pending" });
    const rows = await history(rec.id);
    expect(rows.map((r) => [r.toState, r.message])).toEqual([
      ["returned", "Are you sure of the count?"],
      ["pending", "Yes, two together"],
    ]);
    // Nothing changed, so no earlier version to keep.
    expect(await db().select().from(s.sightingVersions).where(eq(s.sightingVersions.sightingId, rec.id))).toHaveLength(
      0,
    );
  });
});

describe("a withdrawal", () => {
  it("takes a pending sighting out of review and of the results; it can never be approved again", async () => {
    const before = await results();
    const rec = sighting({ count: 3 });
    await ingest([rec]);
    expect((await ingest([{ ...rec, withdrawal: { toVersion: 1 } }]))[0]).toMatchObject({
      outcome: "updated",
      reviewState: "rejected",
    });
    const now = await row(rec.id);
    expect(now.reviewState).toBe("rejected");
    expect(now.withdrawnAt).not.toBeNull();
    expect((await history(rec.id))[0]).toMatchObject({
      fromState: "pending",
      toState: "rejected",
      reason: "withdrawn",
    });
    // Resent: already had. Corrected afterwards: refused.
    expect((await ingest([{ ...rec, withdrawal: { toVersion: 1 } }]))[0]).toMatchObject({ outcome: "already_had" });
    expect((await ingest([{ ...rec, count: 8, correction: { toVersion: 2 } }]))[0]).toMatchObject({
      code: "not_correctable",
    });
    // The database itself refuses approving a withdrawn sighting, so the results never count it.
    expect(
      (await refusal(() => db().update(s.sightings).set({ reviewState: "approved" }).where(eq(s.sightings.id, rec.id))))
        .constraint,
    ).toBe("sightings_withdrawn_not_approved");
    expect(await results()).toEqual(before);
  });

  it("is refused for an approved sighting (correct it instead)", async () => {
    const rec = sighting();
    await ingest([rec]);
    await decide(scope, coordinator, rec.id, { action: "approve", version: 1 });
    expect((await ingest([{ ...rec, withdrawal: { toVersion: 2 } }]))[0]).toMatchObject({
      outcome: "refused",
      code: "not_withdrawable",
      field: "withdrawal",
    });
  });
});

describe("the review period", () => {
  it("takes answers and corrections after the event closes, until review closes (default 30 days after the end)", async () => {
    const g = await makeFixture("review-period");
    await db().insert(s.eventMembers).values({ eventId: g.event.id, userId: f.user.id, role: "volunteer" });
    const rec = sighting({ taxonId: g.taxon.id });
    await ingest([rec], NOW, g.event.id);
    await decide({ eventId: g.event.id, taxonGroups: [], locale: "en" }, coordinator, rec.id, {
      action: "return",
      version: 1,
      message: "How many were there?",
    });
    await db().update(s.events).set({ status: "closed" }).where(eq(s.events.id, g.event.id));

    // The event ended 2026-06-22T05:00Z; ten days later review is still open.
    const later = new Date("2026-07-02T00:00:00Z");
    const fresh = sighting({ taxonId: g.taxon.id });
    const answered = { ...rec, count: 3, answer: { toVersion: 2, message: "Three" } };
    const { answer: _answer, ...three } = answered;
    const acks = await ingestBatch({
      userId: f.user.id,
      eventId: g.event.id,
      sessions: [],
      sightings: [
        { index: 0, record: answered },
        { index: 1, record: fresh },
      ],
      now: later,
    });
    expect(acks).toMatchObject([
      { index: 0, outcome: "updated", reviewState: "pending" },
      { index: 1, outcome: "refused", code: "event_not_open" }, // new records only while open
    ]);
    expect(await db().select().from(s.sightings).where(eq(s.sightings.id, fresh.id))).toHaveLength(0);

    // A correction ten days later too; 31 days after the end everything is refused.
    expect((await ingest([{ ...three, count: 4, correction: { toVersion: 3 } }], later, g.event.id))[0]).toMatchObject({
      outcome: "updated",
    });
    const tooLate = new Date("2026-07-23T06:00:00Z");
    expect(
      (await ingest([{ ...three, count: 5, correction: { toVersion: 4 } }], tooLate, g.event.id))[0],
    ).toMatchObject({ outcome: "refused", code: "event_not_open" });

    // The organiser may keep review open longer.
    await db()
      .update(s.events)
      .set({ reviewClosesAt: new Date("2026-08-31T00:00:00Z") })
      .where(eq(s.events.id, g.event.id));
    const acked = await answerBatch(
      { userId: f.user.id, eventId: g.event.id, locale: "es", now: tooLate },
      { sessions: [], sightings: [{ ...three, count: 5, correction: { toVersion: 4 } }] },
    );
    expect(acked[0]).toMatchObject({ outcome: "updated", reviewState: "pending" });
    // A refusal in the person's language.
    const [closed] = await answerBatch(
      { userId: f.user.id, eventId: g.event.id, locale: "es", now: tooLate },
      { sessions: [], sightings: [sighting({ taxonId: g.taxon.id })] },
    );
    expect(closed).toMatchObject({ outcome: "refused", field: "eventId" });
    expect(closed!.reason).toMatch(/evento/);
  });
});
