import { eq, inArray, sql } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { findUserById } from "@/db/queries/auth";
import { refreshCheckMarks } from "@/db/queries/check-marks";
import {
  bulkApprove,
  bulkPreview,
  decide,
  queueCounts,
  reviewQueue,
  sightingDetail,
  undoDecision,
} from "@/db/queries/review";
import { composeDigests } from "@/db/queries/review-digest";
import * as s from "@/db/schema";
import { ApiError, errorStatus } from "@/lib/http/errors";
import { renderDigest } from "@/server/review/digest-mail";
import { queueFilters } from "@/lib/review/filters";
import { reviewPermitFor } from "@/server/review/permit";
import { db, makeFixture, lonLat, refusal, sightingValues } from "./helpers";
import type { EventRole, TaxonGroup } from "@/lib/domain";

// The review desk's data layer and its guard, on the real database: who may review what,
// decisions appended to the history with the state kept in step, optimistic concurrency,
// bulk approve of a confirmed number, the queue's pages, and the volunteer's digest.
let f: Awaited<ReturnType<typeof makeFixture>>;
let other: Awaited<ReturnType<typeof makeFixture>>;
let plant: string;
const people: Record<string, string> = {};
const birds: string[] = [];
const plants: string[] = [];
const noFilters = queueFilters.parse({});

async function person(key: string, eventId: string, role: EventRole, groups: TaxonGroup[] = []) {
  const [u] = await db()
    .insert(s.users)
    .values({ email: `${key}@desk.example.org`, name: key, locale: "fr" })
    .returning();
  await db().insert(s.eventMembers).values({ eventId, userId: u!.id, role, taxonGroups: groups });
  people[key] = u!.id;
  return (await findUserById(u!.id))!;
}

const scopeOf = async (key: string, eventId = f.event.id) =>
  (await reviewPermitFor((await findUserById(people[key]!))!, eventId, "en")).scope;
const stateOf = async (id: string) => (await db().select().from(s.sightings).where(eq(s.sightings.id, id)))[0]!;

beforeAll(async () => {
  f = await makeFixture("desk");
  other = await makeFixture("desk-other");
  const [p] = await db()
    .insert(s.taxa)
    .values({ scientificName: "Plantus deskensis", taxonGroup: "vascular_plants" })
    .returning();
  plant = p!.id;
  await db()
    .insert(s.eventSpecies)
    .values([
      { eventId: f.event.id, taxonId: f.taxon.id },
      { eventId: f.event.id, taxonId: plant },
    ]);
  await db().insert(s.eventMembers).values({ eventId: f.event.id, userId: f.user.id, role: "volunteer" });
  await person("all", f.event.id, "coordinator");
  await person("birder", f.event.id, "coordinator", ["birds"]);
  await person("elsewhere", other.event.id, "coordinator");
  await person("volunteer2", f.event.id, "volunteer");
  const rows = [];
  for (let i = 0; i < 30; i++) {
    const row = sightingValues(f, {
      observedAt: new Date(Date.parse("2026-06-20T06:00:00Z") + i * 3_600_000),
      location: lonLat(0.1 + i * 0.01, 0.2),
    });
    birds.push(row.id);
    rows.push(row);
  }
  for (let i = 0; i < 5; i++) {
    const row = sightingValues(f, {
      taxonId: plant,
      userId: people.volunteer2!,
      observedAt: new Date(Date.parse("2026-06-20T06:30:00Z") + i * 3_600_000),
    });
    plants.push(row.id);
    rows.push(row);
  }
  await db().insert(s.sightings).values(rows);
  await refreshCheckMarks(
    db(),
    rows.map((r) => r.id),
  );
});

describe("who may review", () => {
  it("refuses a coordinator of another event and a volunteer with 403", async () => {
    for (const key of ["elsewhere", "volunteer2"]) {
      const err = await reviewPermitFor((await findUserById(people[key]!))!, f.event.id, "en").catch((e: unknown) => e);
      expect(err, key).toBeInstanceOf(ApiError);
      expect(errorStatus[(err as ApiError).code], key).toBe(403);
    }
  });

  it("shows a coordinator limited to birds only bird sightings, and refuses them a plant with 403", async () => {
    const birder = await scopeOf("birder");
    expect(birder.taxonGroups).toEqual(["birds"]);
    const page = await reviewQueue(birder, noFilters, null, 200);
    expect(page.items.map((i) => i.id).sort()).toEqual([...birds].sort());
    expect(new Set(page.items.map((i) => i.taxonGroup))).toEqual(new Set(["birds"]));
    expect((await queueCounts(birder, noFilters)).pending).toBe(30);

    expect((await sightingDetail(birder, plants[0]!)).check).toBe("forbidden");
    const refused = await decide(birder, people.birder!, plants[0]!, { action: "approve", version: 1 });
    expect(refused).toEqual({ outcome: "forbidden" });
    expect(errorStatus[refused.outcome as "forbidden"]).toBe(403);
    expect((await stateOf(plants[0]!)).reviewState).toBe("pending");
    // Nor may they move a bird into another group by re-identifying it.
    expect(
      await decide(birder, people.birder!, birds[29]!, { action: "reidentify", version: 1, taxonId: plant }),
    ).toEqual({ outcome: "bad_taxon", why: "out_of_scope" });

    const all = await scopeOf("all");
    expect((await reviewQueue(all, noFilters, null, 200)).items).toHaveLength(35);
  });

  it("answers a sighting of another event as not found, not as a decision", async () => {
    const [foreign] = await db().insert(s.sightings).values(sightingValues(other)).returning();
    expect(await decide(await scopeOf("all"), people.all!, foreign!.id, { action: "approve", version: 1 })).toEqual({
      outcome: "not_found",
    });
  });
});

describe("decisions", () => {
  it("gives exactly one winner and one clear conflict when two coordinators decide one sighting at once", async () => {
    const [all, birder] = [await scopeOf("all"), await scopeOf("birder")];
    const id = birds[0]!;
    const results = await Promise.all([
      decide(all, people.all!, id, { action: "approve", version: 1 }),
      decide(birder, people.birder!, id, { action: "reject", version: 1, reason: "misidentified" }),
    ]);
    const outcomes = results.map((r) => r.outcome).sort();
    expect(outcomes).toEqual(["conflict", "ok"]);
    const winner = results.find((r) => r.outcome === "ok")!;
    const loser = results.find((r) => r.outcome === "conflict")!;
    const row = await stateOf(id);
    expect(row.version).toBe(2);
    expect(loser).toEqual({ outcome: "conflict", current: { reviewState: row.reviewState, version: 2 } });
    expect(winner).toMatchObject({ sighting: { reviewState: row.reviewState, version: 2 } });
    const history = await db().select().from(s.reviews).where(eq(s.reviews.sightingId, id));
    expect(history).toHaveLength(1);
    expect(history[0]!.toState).toBe(row.reviewState);
  });

  it("stores a rejection's reason, a returned sighting's question and a re-identification with the original taxon in the history", async () => {
    const all = await scopeOf("all");
    expect(
      await decide(all, people.all!, birds[1]!, {
        action: "reject",
        version: 1,
        reason: "duplicate",
        message: "Same bird as the one at 07:00.",
      }),
    ).toMatchObject({ outcome: "ok" });
    expect(
      await decide(all, people.all!, birds[2]!, {
        action: "return",
        version: 1,
        message: "Was this seen or only heard?",
      }),
    ).toMatchObject({ outcome: "ok" });
    expect(
      await decide(all, people.all!, birds[3]!, { action: "reidentify", version: 1, taxonId: plant }),
    ).toMatchObject({ outcome: "ok", sighting: { taxonId: plant, reviewState: "pending", version: 2 } });
    // The same decision twice (with the version seen before) is a conflict, never a silent overwrite.
    expect(await decide(all, people.all!, birds[2]!, { action: "approve", version: 1 })).toEqual({
      outcome: "conflict",
      current: { reviewState: "returned", version: 2 },
    });
    expect(await decide(all, people.all!, birds[2]!, { action: "return", version: 2, message: "again?" })).toEqual({
      outcome: "unchanged",
    });

    const rows = await db()
      .select()
      .from(s.reviews)
      .where(inArray(s.reviews.sightingId, [birds[1]!, birds[2]!, birds[3]!]));
    const by = Object.fromEntries(rows.map((r) => [r.sightingId, r]));
    expect(by[birds[1]!]).toMatchObject({
      fromState: "pending",
      toState: "rejected",
      reason: "duplicate",
      message: "Same bird as the one at 07:00.",
      reviewerId: people.all,
    });
    expect(by[birds[2]!]).toMatchObject({ toState: "returned", message: "Was this seen or only heard?" });
    expect(by[birds[3]!]).toMatchObject({
      fromState: "pending",
      toState: "pending",
      fromTaxonId: f.taxon.id,
      toTaxonId: plant,
    });
    expect((await stateOf(birds[1]!)).reviewState).toBe("rejected");
    expect((await stateOf(birds[2]!)).reviewState).toBe("returned");

    const detail = await sightingDetail(all, birds[3]!);
    expect(detail.check).toBe("ok");
    if (detail.check === "ok") {
      expect(detail.history).toHaveLength(1);
      expect(detail.history[0]).toMatchObject({
        fromTaxon: "Testus desk",
        toTaxon: "Plantus deskensis",
        reviewerName: "all",
      });
      expect(detail.sighting.scientificName).toBe("Plantus deskensis");
      expect(detail.map.zones).toHaveLength(1);
      expect(detail.nearby.length).toBeGreaterThan(0);
    }
  });

  it("bulk-approves a filtered selection only when the confirmed number still matches", async () => {
    const birder = await scopeOf("birder");
    const filters = queueFilters.parse({ from: "2026-06-21", to: "2026-06-21" }); // 24 hours of birds, one an hour
    const before = await queueCounts(birder, filters);
    const every = [...new Set((await bulkPreview(birder, filters, [])).marks.map((m) => m.mark))];
    expect(before.pending).toBeGreaterThan(10);
    expect(await bulkApprove(birder, people.birder!, filters, before.pending - 1, every)).toEqual({
      outcome: "count_changed",
      count: before.pending,
    });
    expect((await queueCounts(birder, filters)).pending).toBe(before.pending);
    expect(await bulkApprove(birder, people.birder!, filters, before.pending, every)).toEqual({
      outcome: "ok",
      approved: before.pending,
    });
    const after = await queueCounts(birder, filters);
    expect(after.pending).toBe(0);
    expect(after.approved).toBe(before.approved + before.pending);
  });

  it("only ever adds to the reviews table: earlier rows stay as they were, and the database refuses edits", async () => {
    const snapshot = await db().select().from(s.reviews).orderBy(s.reviews.id);
    await decide(await scopeOf("all"), people.all!, plants[1]!, { action: "approve", version: 1 });
    const later = await db().select().from(s.reviews).orderBy(s.reviews.id);
    expect(later.length).toBe(snapshot.length + 1);
    expect(later.slice(0, snapshot.length)).toEqual(snapshot);
    const first = snapshot[0]!;
    expect(
      await refusal(() => db().update(s.reviews).set({ reason: "changed" }).where(eq(s.reviews.id, first.id))),
    ).toMatchObject({ code: "23000" });
    expect(await refusal(() => db().delete(s.reviews).where(eq(s.reviews.id, first.id)))).toMatchObject({
      code: "23000",
    });
    // Every sighting's state is the last decision's.
    const { rows } = await db().execute<{ n: number }>(sql`
      SELECT count(*)::int AS n FROM sightings x
      LEFT JOIN LATERAL (SELECT to_state FROM reviews r WHERE r.sighting_id = x.id ORDER BY r.id DESC LIMIT 1) last ON true
      WHERE x.event_id = ${f.event.id} AND x.review_state <> coalesce(last.to_state, 'pending')`);
    expect(rows[0]!.n).toBe(0);
  });
});

describe("the queue", () => {
  it("pages through every sighting once, newest or oldest first, with stable cursors", async () => {
    const all = await scopeOf("all");
    for (const order of ["newest", "oldest"] as const) {
      const seen: string[] = [];
      let cursor: string | null = null;
      do {
        const page: Awaited<ReturnType<typeof reviewQueue>> = await reviewQueue(
          all,
          { ...noFilters, order },
          cursor,
          7,
        );
        seen.push(...page.items.map((i) => i.id));
        cursor = page.nextCursor;
      } while (cursor);
      expect(new Set(seen).size).toBe(35);
      expect(seen).toHaveLength(35);
      const times = await db()
        .select({ id: s.sightings.id, at: s.sightings.observedAt })
        .from(s.sightings)
        .where(inArray(s.sightings.id, seen));
      const at = new Map(times.map((t) => [t.id, t.at.getTime()]));
      const ordered = seen.map((id) => at.get(id)!);
      expect(ordered).toEqual([...ordered].sort((a, b) => (order === "newest" ? b - a : a - b)));
    }
  });

  it("filters by state, check mark, volunteer, zone, photo and taxon group", async () => {
    const all = await scopeOf("all");
    const ids = async (q: Record<string, string>) =>
      (await reviewQueue(all, queueFilters.parse(q), null, 200)).items.map((i) => i.id).sort();
    expect(await ids({ state: "returned" })).toEqual([birds[2]!]);
    expect(await ids({ volunteer: people.volunteer2!, state: "pending" })).toEqual(
      plants.filter((p) => p !== plants[1]).sort(),
    );
    expect(await ids({ group: "vascular_plants" })).toEqual([...plants, birds[3]!].sort());
    expect(await ids({ zone: "none" })).toEqual([]);
    expect(await ids({ photo: "yes" })).toEqual([]);
    expect((await ids({ photo: "no" })).length).toBe(35);
    // Points from x = 0.1 to 0.39; the event area is the unit square, so none is outside it.
    expect(await ids({ marks: "outside_area" })).toEqual([]);
    const [far] = await db()
      .insert(s.sightings)
      .values(sightingValues(f, { location: lonLat(2, 2), zoneId: null, observedAt: new Date("2026-06-21T23:59:00Z") }))
      .returning();
    await refreshCheckMarks(db(), [far!.id]);
    expect(await ids({ marks: "outside_area" })).toEqual([far!.id]);
    expect(await ids({ marks: "outside_area,poor_accuracy" })).toEqual([]);
    expect(await ids({ zone: "none" })).toEqual([far!.id]);
  });
});

describe("the volunteer's digest", () => {
  it("waits for the digest window, then gathers all the volunteer's decisions into one mail in their language", async () => {
    await db().update(s.users).set({ locale: "en" }).where(eq(s.users.id, f.user.id));
    expect(await composeDigests(3600, renderDigest)).toBe(0); // decisions are minutes old, the window an hour
    expect(await composeDigests(0, renderDigest)).toBeGreaterThanOrEqual(2); // the fixture's volunteer and volunteer2
    const mails = await db().select().from(s.emailOutbox).where(eq(s.emailOutbox.toAddress, f.user.email));
    expect(mails).toHaveLength(1);
    const mail = mails[0]!;
    expect(mail.kind).toBe("review_digest");
    expect(mail.subject).toMatch(/review decisions on your sightings/);
    expect(mail.textBody).toMatch(/Rejected: Testus desk .*Reason: Duplicate of another record/);
    expect(mail.textBody).toMatch(/Returned with a question: .*Question: Was this seen or only heard\?/);
    expect(mail.textBody).toMatch(/Re-identified: .*Recorded as Testus desk, now Plantus deskensis/);
    expect(mail.textBody).toMatch(/Approved: /);
    expect(mail.textBody).toMatch(/Europe\/London time/);
    const notices = await db().select().from(s.reviewNotices).where(eq(s.reviewNotices.volunteerId, f.user.id));
    expect(notices.every((n) => n.digestId === mail.id)).toBe(true);
    // Nothing left to gather: a second round makes no second mail.
    expect(await composeDigests(0, renderDigest)).toBe(0);
    const fr = await db()
      .select()
      .from(s.emailOutbox)
      .where(eq(s.emailOutbox.toAddress, "volunteer2@desk.example.org"));
    expect(fr[0]!.subject).toMatch(/décision/);
  });
});

describe("undo and the bulk rule", () => {
  // Four bird sightings by volunteer2, far enough apart to be no duplicates: three without a
  // check mark, one observed after the event (outside its dates).
  const clean: string[] = [];
  let flagged = "";
  let bird2 = "";
  beforeAll(async () => {
    const rows = [0, 1, 2, 3].map((k) =>
      sightingValues(f, {
        userId: people.volunteer2!,
        observedAt: new Date(k === 3 ? "2026-06-23T10:00:00Z" : Date.parse("2026-06-21T19:00:00Z") + k * 1_800_000),
        location: lonLat(0.6 + k * 0.05, 0.7),
      }),
    );
    await db().insert(s.sightings).values(rows);
    await refreshCheckMarks(
      db(),
      rows.map((r) => r.id),
    );
    clean.push(...rows.slice(0, 3).map((r) => r.id));
    flagged = rows[3]!.id;
    const [t] = await db().insert(s.taxa).values({ scientificName: "Testus alter", taxonGroup: "birds" }).returning();
    bird2 = t!.id;
  });
  const mine = () => queueFilters.parse({ volunteer: people.volunteer2!, group: "birds" });

  it("bulk approval leaves a flagged sighting pending unless its mark is included, and says how many and which marks", async () => {
    const birder = await scopeOf("birder");
    expect((await stateOf(flagged)).checkMarks).toEqual(["outside_dates"]);
    expect(await bulkPreview(birder, mine(), [])).toEqual({
      matching: 4,
      count: 3,
      leftOut: 1,
      marks: [{ mark: "outside_dates", n: 1 }],
    });
    // The server holds to the rule whatever the client counted.
    expect(await bulkApprove(birder, people.birder!, mine(), 4)).toEqual({ outcome: "count_changed", count: 3 });
    expect(await bulkApprove(birder, people.birder!, mine(), 3)).toEqual({ outcome: "ok", approved: 3 });
    for (const id of clean) expect((await stateOf(id)).reviewState).toBe("approved");
    expect((await stateOf(flagged)).reviewState).toBe("pending");
    // Included explicitly, it goes too.
    expect(await bulkPreview(birder, mine(), ["outside_dates"])).toMatchObject({ matching: 1, count: 1, leftOut: 0 });
    expect(await bulkApprove(birder, people.birder!, mine(), 1, ["outside_dates"])).toEqual({
      outcome: "ok",
      approved: 1,
    });
    expect((await stateOf(flagged)).reviewState).toBe("approved");
  });

  it("undoes a decision with a new row that restores the state and taxon, never editing the history", async () => {
    const all = await scopeOf("all");
    const id = clean[0]!;
    const before = await stateOf(id);
    expect(before.reviewState).toBe("approved"); // bulk-approved above
    const history = await db().select().from(s.reviews).where(eq(s.reviews.sightingId, id)).orderBy(s.reviews.id);
    const lastId = history[history.length - 1]!.id;
    // A stale version is a conflict; a decision that is not the latest cannot be undone.
    expect(await undoDecision(all, people.all!, id, lastId, before.version - 1)).toMatchObject({
      outcome: "conflict",
    });
    const undone = await undoDecision(all, people.all!, id, lastId, before.version);
    expect(undone).toMatchObject({
      outcome: "ok",
      sighting: { reviewState: "pending", version: before.version + 1, taxonId: f.taxon.id },
    });
    const after = await db().select().from(s.reviews).where(eq(s.reviews.sightingId, id)).orderBy(s.reviews.id);
    expect(after.slice(0, history.length)).toEqual(history);
    expect(after[history.length]).toMatchObject({
      reviewerId: people.all,
      fromState: "approved",
      toState: "pending",
      undoesId: lastId,
    });
    expect((await stateOf(id)).reviewState).toBe("pending");
    // The volunteer had not been mailed the approval yet: its notice is withdrawn, and the undo adds none.
    const notices = await db()
      .select()
      .from(s.reviewNotices)
      .where(inArray(s.reviewNotices.reviewId, [lastId, after[history.length]!.id]));
    expect(notices).toEqual([]);
    // Undoing the same decision again is refused: the undo is now the latest.
    expect(await undoDecision(all, people.all!, id, lastId, before.version + 1)).toEqual({ outcome: "not_last" });
    expect(await undoDecision(all, people.all!, id, 999_999_999, before.version + 1)).toEqual({
      outcome: "unknown_review",
    });
  });

  it("re-identifies and approves in one decision, which another coordinator of the group can undo later", async () => {
    const all = await scopeOf("all");
    const id = clean[1]!;
    await undoDecision(all, people.all!, id, (await lastReview(id)).id, (await stateOf(id)).version); // back to pending
    const v = (await stateOf(id)).version;
    const count = (await db().select().from(s.reviews).where(eq(s.reviews.sightingId, id))).length;
    const res = await decide(all, people.all!, id, { action: "reidentify", version: v, taxonId: bird2, approve: true });
    expect(res).toMatchObject({ outcome: "ok", sighting: { reviewState: "approved", taxonId: bird2, version: v + 1 } });
    expect((await db().select().from(s.reviews).where(eq(s.reviews.sightingId, id))).length).toBe(count + 1);
    expect(await lastReview(id)).toMatchObject({
      fromState: "pending",
      toState: "approved",
      fromTaxonId: f.taxon.id,
      toTaxonId: bird2,
    });
    // Later, from the history, the birds coordinator undoes it: pending again, the first taxon back.
    const birder = await scopeOf("birder");
    const undone = await undoDecision(birder, people.birder!, id, (await lastReview(id)).id, v + 1);
    expect(undone).toMatchObject({ outcome: "ok", sighting: { reviewState: "pending", taxonId: f.taxon.id } });
    expect(await lastReview(id)).toMatchObject({
      reviewerId: people.birder,
      toState: "pending",
      toTaxonId: f.taxon.id,
    });
    // A coordinator of another event cannot undo anything here.
    expect(
      await undoDecision(
        await scopeOf("elsewhere", other.event.id),
        people.elsewhere!,
        id,
        (await lastReview(id)).id,
        v + 2,
      ),
    ).toEqual({ outcome: "not_found" });
  });
});

async function lastReview(sightingId: string) {
  const rows = await db().select().from(s.reviews).where(eq(s.reviews.sightingId, sightingId)).orderBy(s.reviews.id);
  return rows[rows.length - 1]!;
}
