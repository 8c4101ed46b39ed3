// Between events of one site (issue 14): the earlier events a results page may put beside
// this one (same organisation, not a draft, ended before, overlapping area), and the
// comparison over the real aggregation (approved records only; pending ones wait).
import { sql } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { getReport } from "@/db/queries/reports";
import { earlierEventsOfSite } from "@/db/queries/results";
import { publishReport } from "@/server/results/publish";
import { seedDemo } from "@/db/seed/demo";
import { DEMO_EVENT, EARLIER_EVENT } from "@/db/seed/demo-scenario";
import * as s from "@/db/schema";
import { comparisonWithEarlier, liveBesideEarlier } from "@/server/results/compare-events";
import { db, makeFixture, polygonSql, sightingValues } from "./helpers";

const square = (x: number, y: number, size: number): [number, number][] => [
  [x, y],
  [x + size, y],
  [x + size, y + size],
  [x, y + size],
  [x, y],
];

async function otherEvent(
  f: Awaited<ReturnType<typeof makeFixture>>,
  tag: string,
  over: Partial<Omit<typeof s.events.$inferInsert, "area">>,
  ring: [number, number][] = square(0.2, 0.2, 1),
) {
  const [e] = await db()
    .insert(s.events)
    .values({
      organisationId: f.org.id,
      slug: `event-${tag}`,
      name: `Event ${tag}`,
      status: "closed",
      startsAt: new Date("2025-06-21T05:00:00Z"),
      endsAt: new Date("2025-06-23T05:00:00Z"),
      timeZone: "Europe/London",
      ...over,
      area: polygonSql(ring),
    })
    .returning();
  return e!;
}

describe("between events of one site", () => {
  it("offers only earlier, non-draft events of the organisation whose area overlaps, newest first", async () => {
    const f = await makeFixture("site-candidates");
    const last = await otherEvent(f, "site-2025", {});
    const older = await otherEvent(f, "site-2024", {
      startsAt: new Date("2024-06-22T05:00:00Z"),
      endsAt: new Date("2024-06-24T05:00:00Z"),
    });
    await otherEvent(f, "site-draft", { status: "draft" });
    await otherEvent(f, "site-elsewhere", {}, square(5, 5, 1));
    await otherEvent(f, "site-later", {
      startsAt: new Date("2027-06-19T05:00:00Z"),
      endsAt: new Date("2027-06-21T05:00:00Z"),
    });
    const stranger = await makeFixture("site-stranger"); // another organisation, same square
    expect(stranger.event.id).not.toBe(f.event.id);
    expect((await earlierEventsOfSite(f.event.id)).map((e) => e.id)).toEqual([last.id, older.id]);
  });

  it("puts this year beside last year at equal coverage, says 'more' only with an interval above 0, and leaves pending records out", async () => {
    const f = await makeFixture("site-compare");
    const last = await otherEvent(f, "site-compare-2025", {});
    const taxa = await db()
      .insert(s.taxa)
      .values(
        Array.from({ length: 40 }, (_, i) => ({ scientificName: `Comparia s${i}`, taxonGroup: "birds" as const })),
      )
      .returning();
    // This year 40 species, 3 to 7 individuals each; last year 12 of them. Invented counts.
    await db()
      .insert(s.sightings)
      .values([
        ...taxa.map((t, i) => sightingValues(f, { taxonId: t.id, count: 3 + (i % 5), reviewState: "approved" })),
        ...taxa.slice(0, 12).map((t, i) =>
          sightingValues(f, {
            eventId: last.id,
            zoneId: null,
            taxonId: t.id,
            count: 3 + (i % 5),
            reviewState: "approved",
            observedAt: new Date("2025-06-21T09:00:00Z"),
          }),
        ),
        // Pending: not in either event's numbers.
        sightingValues(f, { eventId: last.id, zoneId: null, taxonId: taxa[30]!.id, count: 50, reviewState: "pending" }),
      ]);
    const r = await comparisonWithEarlier({ id: f.event.id, name: f.event.name, startsAt: f.event.startsAt });
    expect(r.chosen?.id).toBe(last.id);
    const c = r.comparison!;
    expect(c.events.map((e) => [e.name, e.observed])).toEqual([
      [f.event.name, 40],
      [last.name, 12],
    ]);
    expect(c.sentence).toMatchObject({ a: f.event.id, b: last.id, verdict: "more" });
    expect(c.sentence!.lower).toBeGreaterThan(0);
    // A choice that is not a candidate falls back to the newest candidate.
    const again = await comparisonWithEarlier(
      { id: f.event.id, name: f.event.name, startsAt: f.event.startsAt },
      "00000000-0000-4000-8000-000000000000",
    );
    expect(again.chosen?.id).toBe(last.id);
    expect(again.comparison).toEqual(c);
  });

  it("the live board puts the running event beside last year's by the same rule, at most a minute old", async () => {
    const f = await makeFixture("site-live");
    expect(await liveBesideEarlier(f.event.id)).toBeNull(); // no earlier event of the site yet
    const last = await otherEvent(f, "site-live-2025", {});
    const taxa = await db()
      .insert(s.taxa)
      .values(Array.from({ length: 30 }, (_, i) => ({ scientificName: `Vivax s${i}`, taxonGroup: "birds" as const })))
      .returning();
    // This year 25 species, 3 to 7 individuals each; last year 10 of them. Invented counts.
    await db()
      .insert(s.sightings)
      .values([
        ...taxa
          .slice(0, 25)
          .map((t, i) => sightingValues(f, { taxonId: t.id, count: 3 + (i % 5), reviewState: "approved" })),
        ...taxa.slice(0, 10).map((t, i) =>
          sightingValues(f, {
            eventId: last.id,
            zoneId: null,
            taxonId: t.id,
            count: 3 + (i % 5),
            reviewState: "approved",
            observedAt: new Date("2025-06-21T09:00:00Z"),
          }),
        ),
      ]);
    const live = (await liveBesideEarlier(f.event.id))!;
    expect(live.earlier.id).toBe(last.id);
    // The results page's numbers and verdict.
    const page = await comparisonWithEarlier({ id: f.event.id, name: f.event.name, startsAt: f.event.startsAt });
    expect(live.comparison).toEqual(page.comparison);
    expect(live.comparison.events.map((e) => e.observed)).toEqual([25, 10]);
    expect(live.comparison.sentence).toMatchObject({ a: f.event.id, b: last.id, verdict: "more" });
    expect(live.comparison.sentence!.lower).toBeGreaterThan(0);
    // A record comes in: the board keeps the comparison of a moment ago (with its time) for up
    // to a minute; the results page computes it again at once.
    await db()
      .insert(s.sightings)
      .values(sightingValues(f, { taxonId: taxa[29]!.id, count: 4, reviewState: "approved" }));
    const soon = (await liveBesideEarlier(f.event.id))!;
    expect(soon.at).toBe(live.at);
    expect(soon.comparison.events[0]!.observed).toBe(25);
    const fresh = await comparisonWithEarlier({ id: f.event.id, name: f.event.name, startsAt: f.event.startsAt });
    expect(fresh.comparison!.events[0]!.observed).toBe(26);
    // Once the kept comparison is too old, the board still gets it at once and a new one is
    // computed behind it.
    await db()
      .insert(s.sightings)
      .values(sightingValues(f, { taxonId: taxa[28]!.id, count: 2, reviewState: "approved" }));
    const ev = { id: f.event.id, name: f.event.name, startsAt: f.event.startsAt };
    const old = await comparisonWithEarlier(ev, undefined, { staleMs: 0 });
    expect(old.comparison!.events[0]!.observed).toBe(26);
    await expect
      .poll(
        async () => (await comparisonWithEarlier(ev, undefined, { staleMs: 60_000 })).comparison!.events[0]!.observed,
      )
      .toBe(27);
  });

  it("the demo's midsummer count finds last year's count of the reserve and compares them on complete sessions", async () => {
    await seedDemo(db() as never);
    const { rows } = await db().execute<{ id: string; name: string; starts_at: string }>(
      sql`SELECT id, name, starts_at FROM events WHERE slug = ${DEMO_EVENT.slug}`,
    );
    const now = rows[0]!;
    const r = await comparisonWithEarlier({ id: now.id, name: now.name, startsAt: new Date(now.starts_at) });
    expect(r.candidates.map((c) => c.name)).toEqual([EARLIER_EVENT.name]);
    const c = r.comparison!;
    // The demo counts fungi as presence only, so both years are compared on complete sessions.
    expect(c.kind).toBe("incidence");
    expect(c.events[1]).toMatchObject({ name: EARLIER_EVENT.name });
    expect(c.events[1]!.observed).toBeGreaterThan(10);
    expect(c.leftOut).toEqual([]);
    expect(c.sentence).toMatchObject({ a: now.id, b: c.events[1]!.id });

    // A report freezes the comparison it was published with, and its page shows it.
    const organiser = await db().execute<{ id: string }>(
      sql`SELECT id FROM users WHERE email = 'organiser@example.org'`,
    );
    const v = await publishReport(now.id, organiser.rows[0]!.id, { confirmPending: true, notify: false });
    const report = await getReport(now.id, v.version);
    expect(report?.besideEarlier?.earlier.name).toBe(EARLIER_EVENT.name);
    expect(report?.besideEarlier?.comparison).toEqual(c);
  });
});
