import { beforeAll, describe, expect, it } from "vitest";
import { listMySightings } from "@/db/queries/my-sightings";
import * as s from "@/db/schema";
import { db, makeFixture, sightingValues } from "./helpers";

type Fixture = Awaited<ReturnType<typeof makeFixture>>;
let f: Fixture;

beforeAll(async () => {
  f = await makeFixture("mine");
});

describe("a volunteer's own sightings", () => {
  it("come with version and review state, the question of a returned one and the reason of a rejected one, and nobody else's", async () => {
    const [coordinator] = await db().insert(s.users).values({ email: "mine-coord@example.org" }).returning();
    const [other] = await db().insert(s.users).values({ email: "mine-other@example.org" }).returning();
    const returned = sightingValues(f, {
      observedAt: new Date("2026-06-20T10:00:00Z"),
      reviewState: "returned",
      version: 3,
    });
    const rejected = sightingValues(f, {
      observedAt: new Date("2026-06-20T09:00:00Z"),
      reviewState: "rejected",
      version: 2,
      count: 7,
      countIsEstimate: true,
    });
    const pending = sightingValues(f, { observedAt: new Date("2026-06-20T08:00:00Z") });
    await db()
      .insert(s.sightings)
      .values([returned, rejected, pending, sightingValues(f, { userId: other!.id })]);
    await db()
      .insert(s.reviews)
      .values([
        {
          sightingId: returned.id,
          eventId: f.event.id,
          reviewerId: coordinator!.id,
          fromState: "pending",
          toState: "returned",
          message: "Was it perched or flying?",
          decidedAt: new Date("2026-06-20T11:00:00Z"),
        },
        {
          sightingId: returned.id,
          eventId: f.event.id,
          reviewerId: f.user.id,
          fromState: "returned",
          toState: "pending",
          message: "Perched",
          decidedAt: new Date("2026-06-20T12:00:00Z"),
        },
        {
          sightingId: returned.id,
          eventId: f.event.id,
          reviewerId: coordinator!.id,
          fromState: "pending",
          toState: "returned",
          message: "Which tree?",
          decidedAt: new Date("2026-06-20T13:00:00Z"),
        },
        {
          sightingId: rejected.id,
          eventId: f.event.id,
          reviewerId: coordinator!.id,
          fromState: "pending",
          toState: "rejected",
          reason: "Outside the event area",
          decidedAt: new Date("2026-06-20T11:00:00Z"),
        },
      ]);

    const mine = await listMySightings(f.user.id, f.event.id);
    expect(mine.map((m) => m.id)).toEqual([returned.id, rejected.id, pending.id]);
    expect(mine[0]).toMatchObject({
      reviewState: "returned",
      version: 3,
      question: "Which tree?",
      rejectionReason: null,
      taxonId: f.taxon.id,
      scientificName: "Testus mine",
    });
    expect(mine[1]).toMatchObject({
      reviewState: "rejected",
      rejectionReason: "Outside the event area",
      question: null,
      count: 7,
      countIsEstimate: true,
    });
    expect(mine[2]).toMatchObject({
      reviewState: "pending",
      version: 1,
      question: null,
      rejectionReason: null,
      observedAt: "2026-06-20T08:00:00.000Z",
      latitude: 0.2,
      longitude: 0.2,
      photoIds: [],
    });
  });
});
