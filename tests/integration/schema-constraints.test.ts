import { eq, sql } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import * as s from "@/db/schema";
import { db, makeFixture, lonLat, polygonSql, refusal, sightingValues } from "./helpers";

// Each test tries a bad row and expects PostgreSQL itself to refuse it (SQLSTATE codes:
// 23514 check_violation, 23503 foreign_key_violation, 23505 unique_violation,
// 23000 integrity_constraint_violation, 22P02 invalid_text_representation).
let f: Awaited<ReturnType<typeof makeFixture>>;
beforeAll(async () => {
  f = await makeFixture("constraints");
});

describe("sightings", () => {
  it("accepts a valid sighting", async () => {
    const row = sightingValues(f);
    await db().insert(s.sightings).values(row);
    const [back] = await db()
      .select({ x: sql<number>`ST_X(${s.sightings.location})`, state: s.sightings.reviewState })
      .from(s.sightings)
      .where(eq(s.sightings.id, row.id));
    expect(back).toEqual({ x: 0.2, state: "pending" });
  });

  it("writes a point as longitude and latitude in WGS 84 and reads it back the same", async () => {
    const row = sightingValues(f, { location: lonLat(-2.487, 51.403) });
    const [inserted] = await db().insert(s.sightings).values(row).returning({ location: s.sightings.location });
    expect(inserted!.location).toEqual({ longitude: -2.487, latitude: 51.403 });
    const [back] = await db()
      .select({
        location: s.sightings.location,
        srid: sql<number>`ST_SRID(${s.sightings.location})`,
        x: sql<number>`ST_X(${s.sightings.location})`,
      })
      .from(s.sightings)
      .where(eq(s.sightings.id, row.id));
    expect(back).toEqual({ location: { longitude: -2.487, latitude: 51.403 }, srid: 4326, x: -2.487 });
  });

  it("refuses a count of 0", async () => {
    const r = await refusal(() =>
      db()
        .insert(s.sightings)
        .values(sightingValues(f, { count: 0 })),
    );
    expect(r).toMatchObject({ code: "23514", constraint: "sightings_count_positive" });
  });

  it("refuses a negative location accuracy", async () => {
    const r = await refusal(() =>
      db()
        .insert(s.sightings)
        .values(sightingValues(f, { accuracyM: -1 })),
    );
    expect(r).toMatchObject({ code: "23514", constraint: "sightings_accuracy_nonneg" });
  });

  it("refuses a sighting for an unknown event", async () => {
    const r = await refusal(() =>
      db()
        .insert(s.sightings)
        .values(sightingValues(f, { eventId: crypto.randomUUID() })),
    );
    expect(r).toMatchObject({ code: "23503", constraint: "sightings_event_id_events_id_fk" });
  });

  it("refuses a second sighting with the same device-made id", async () => {
    const row = sightingValues(f);
    await db().insert(s.sightings).values(row);
    const r = await refusal(() =>
      db()
        .insert(s.sightings)
        .values({ ...row, count: 2 }),
    );
    // Refused by the key (id, event_id) of the event's partition (migration 0025: sightings_pNN_pkey).
    expect(r).toMatchObject({ code: "23505", constraint: expect.stringMatching(/^sightings_p\d\d_pkey$/) });
    const [kept] = await db().select({ count: s.sightings.count }).from(s.sightings).where(eq(s.sightings.id, row.id));
    expect(kept?.count).toBe(1);
  });

  it("refuses points outside the WGS84 range", async () => {
    for (const [lon, lat] of [
      [181, 10],
      [-180.5, 10],
      [10, 91],
      [10, -90.01],
    ] as const) {
      const r = await refusal(() =>
        db()
          .insert(s.sightings)
          .values(sightingValues(f, { location: lonLat(lon, lat) })),
      );
      expect(r, `(${lon}, ${lat})`).toMatchObject({ code: "23514", constraint: "sightings_location_wgs84" });
    }
  });

  it("refuses an unidentified sighting with no description", async () => {
    const r = await refusal(() =>
      db()
        .insert(s.sightings)
        .values(sightingValues(f, { taxonId: null, description: "  " })),
    );
    expect(r).toMatchObject({ code: "23514", constraint: "sightings_identified_or_described" });
  });

  it("refuses a review state that does not exist", async () => {
    const r = await refusal(() =>
      db()
        .execute(sql`INSERT INTO sightings (id, event_id, user_id, taxon_id, count, observed_at, location, accuracy_m, review_state)
      VALUES (${crypto.randomUUID()}, ${f.event.id}, ${f.user.id}, ${f.taxon.id}, 1, now(), ST_SetSRID(ST_MakePoint(0.1, 0.1), 4326), 5, 'maybe')`),
    );
    expect(r.code).toBe("22P02");
  });
});

describe("events and count sessions", () => {
  it("refuses an event that ends before it starts", async () => {
    const r = await refusal(() =>
      db()
        .insert(s.events)
        .values({
          organisationId: f.org.id,
          slug: "backwards",
          name: "Backwards",
          startsAt: new Date("2026-06-22T00:00:00Z"),
          endsAt: new Date("2026-06-20T00:00:00Z"),
          timeZone: "Europe/London",
        }),
    );
    expect(r).toMatchObject({ code: "23514", constraint: "events_ends_after_starts" });
  });

  it("refuses a count session that ends before it starts", async () => {
    const r = await refusal(() =>
      db()
        .insert(s.countSessions)
        .values({
          id: crypto.randomUUID(),
          eventId: f.event.id,
          userId: f.user.id,
          kind: "walk",
          startedAt: new Date("2026-06-20T10:00:00Z"),
          endedAt: new Date("2026-06-20T09:00:00Z"),
        }),
    );
    expect(r).toMatchObject({ code: "23514", constraint: "count_sessions_ends_after_starts" });
  });

  it("refuses a full-list session that has not ended", async () => {
    const r = await refusal(() =>
      db()
        .insert(s.countSessions)
        .values({
          id: crypto.randomUUID(),
          eventId: f.event.id,
          userId: f.user.id,
          kind: "timed_count",
          startedAt: new Date("2026-06-20T10:00:00Z"),
          allSpeciesNoted: true,
        }),
    );
    expect(r).toMatchObject({ code: "23514", constraint: "count_sessions_complete_needs_end" });
  });

  it("refuses a self-intersecting zone polygon", async () => {
    const bowtie: [number, number][] = [
      [0, 0],
      [0.4, 0.4],
      [0.4, 0],
      [0, 0.4],
      [0, 0],
    ];
    const r = await refusal(() =>
      db()
        .insert(s.zones)
        .values({ eventId: f.event.id, name: "Bowtie", habitat: "edge", geom: polygonSql(bowtie) }),
    );
    expect(r).toMatchObject({ code: "23514", constraint: "zones_geom_valid" });
  });

  it("refuses two zones with the same name in one event", async () => {
    const r = await refusal(() =>
      db()
        .insert(s.zones)
        .values({
          eventId: f.event.id,
          name: "Zone A",
          habitat: "interior",
          geom: polygonSql([
            [0.6, 0.6],
            [0.9, 0.6],
            [0.9, 0.9],
            [0.6, 0.6],
          ]),
        }),
    );
    expect(r).toMatchObject({ code: "23505", constraint: "zones_event_name_key" });
  });

  it("refuses a second account with the same e-mail in another case", async () => {
    const r = await refusal(() => db().insert(s.users).values({ email: "CONSTRAINTS@example.org" }));
    expect(r).toMatchObject({ code: "23505", constraint: "users_email_lower_key" });
  });
});

describe("append-only history", () => {
  it("keeps every review decision: UPDATE and DELETE are refused", async () => {
    const row = sightingValues(f);
    await db().insert(s.sightings).values(row);
    const [review] = await db()
      .insert(s.reviews)
      .values({
        sightingId: row.id,
        eventId: row.eventId,
        reviewerId: f.user.id,
        fromState: "pending",
        toState: "approved",
      })
      .returning();
    const upd = await refusal(() =>
      db().update(s.reviews).set({ toState: "rejected" }).where(eq(s.reviews.id, review!.id)),
    );
    expect(upd.code).toBe("23000");
    expect(upd.message).toMatch(/append-only/);
    const del = await refusal(() => db().delete(s.reviews).where(eq(s.reviews.id, review!.id)));
    expect(del.code).toBe("23000");
    const [still] = await db().select().from(s.reviews).where(eq(s.reviews.id, review!.id));
    expect(still?.toState).toBe("approved");
  });

  it("never changes a published report", async () => {
    const inputs = (reportId: string) => ({
      reportId,
      ...{
        recordCount: 0,
        ids: [],
        words: [],
        states: [],
        taxa: [],
        counts: [],
        zones: [],
        sessions: [],
        sessionZones: [],
      },
    });
    // A report's inputs row comes first: the report references it, so a report never stands without its inputs.
    const orphan = await refusal(() =>
      db()
        .insert(s.reports)
        .values({
          eventId: f.event.id,
          version: 1,
          publishedBy: f.user.id,
          engineVersion: "test",
          inputHash: "a".repeat(64),
          results: {},
          methodNotes: {},
        }),
    );
    expect(orphan).toMatchObject({ code: "23503", constraint: "reports_id_report_inputs_report_id_fk" });
    const id = crypto.randomUUID();
    await db().insert(s.reportInputs).values(inputs(id));
    const [report] = await db()
      .insert(s.reports)
      .values({
        id,
        eventId: f.event.id,
        version: 1,
        publishedBy: f.user.id,
        engineVersion: "test",
        inputHash: "a".repeat(64),
        results: { observed: 3 },
        methodNotes: {},
      })
      .returning();
    // Its inputs are as unchangeable as the report, and their arrays must all be as long as the count says.
    const inputsUpd = await refusal(() =>
      db().update(s.reportInputs).set({ recordCount: 0 }).where(eq(s.reportInputs.reportId, id)),
    );
    expect(inputsUpd.code).toBe("23000");
    const inputsDel = await refusal(() => db().delete(s.reportInputs).where(eq(s.reportInputs.reportId, id)));
    expect(inputsDel.code).toBe("23000");
    const short = await refusal(() =>
      db()
        .insert(s.reportInputs)
        .values({ ...inputs(crypto.randomUUID()), recordCount: 1, ids: [crypto.randomUUID()] }),
    );
    expect(short).toMatchObject({ code: "23514", constraint: "report_inputs_lengths" });
    const upd = await refusal(() =>
      db()
        .update(s.reports)
        .set({ results: { observed: 4 } })
        .where(eq(s.reports.id, report!.id)),
    );
    expect(upd.code).toBe("23000");
    const dup = await refusal(() =>
      db()
        .insert(s.reports)
        .values({
          eventId: f.event.id,
          version: 1,
          publishedBy: f.user.id,
          engineVersion: "test",
          inputHash: "b".repeat(64),
          results: {},
          methodNotes: {},
        }),
    );
    expect(dup).toMatchObject({ code: "23505", constraint: "reports_event_version_key" });
  });
});
