import { eq, sql } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import * as schema from "@/db/schema";
import { seedDemo } from "@/db/seed/demo";
import { DEMO_EVENT } from "@/db/seed/demo-scenario";
import { REVIEW_CASES, reviewCaseId } from "@/db/seed/review-cases";
import { reviewOpen } from "@/lib/time/review-period";
import { db } from "./helpers";

describe("demo scenario seed", () => {
  it("is deterministic and idempotent: a second run changes nothing", async () => {
    const first = await seedDemo(db() as never);
    const snapshot = await db().execute(
      sql`SELECT md5(string_agg(id::text || review_state || count, ',' ORDER BY id)) AS h FROM sightings WHERE event_id = (SELECT id FROM events WHERE slug = ${DEMO_EVENT.slug})`,
    );
    const second = await seedDemo(db() as never);
    const again = await db().execute(
      sql`SELECT md5(string_agg(id::text || review_state || count, ',' ORDER BY id)) AS h FROM sightings WHERE event_id = (SELECT id FROM events WHERE slug = ${DEMO_EVENT.slug})`,
    );
    expect(second).toEqual(first);
    expect(again.rows[0]).toEqual(snapshot.rows[0]);
    expect(first.sightings).toBeGreaterThanOrEqual(200);
    expect(first.sessions).toBeGreaterThanOrEqual(20);
    for (const state of schema.reviewState.enumValues) expect(first.byState[state], state).toBeGreaterThan(0);
  });

  it("has the event, its four zones, about 150 taxa named in three languages and two sensitive taxa", async () => {
    const { rows } = await db().execute<{ zones: string[]; taxa: number; named: number; sensitive: number }>(sql`
      SELECT (SELECT array_agg(z.name || ':' || z.habitat ORDER BY z.name) FROM zones z JOIN events e ON e.id = z.event_id WHERE e.slug = ${DEMO_EVENT.slug}) AS zones,
             (SELECT count(*) FROM event_species es JOIN events e ON e.id = es.event_id WHERE e.slug = ${DEMO_EVENT.slug})::int AS taxa,
             (SELECT count(*) FROM (SELECT n.taxon_id FROM taxon_names n JOIN event_species es ON es.taxon_id = n.taxon_id JOIN events e ON e.id = es.event_id
               WHERE e.slug = ${DEMO_EVENT.slug} GROUP BY n.taxon_id HAVING count(DISTINCT n.locale) = 3) x)::int AS named,
             (SELECT count(*) FROM taxa t JOIN event_species es ON es.taxon_id = t.id JOIN events e ON e.id = es.event_id
               WHERE e.slug = ${DEMO_EVENT.slug} AND t.sensitivity = 'restricted')::int AS sensitive`);
    // Scoped to the demo event's list: other test files add shared taxa of their own.
    expect(rows[0]).toEqual({
      zones: ["Alder Fringe:edge", "Beechwood Heart:interior", "Harrowmere Meadow:interior", "Millpond Margin:edge"],
      taxa: 150,
      named: 150,
      sensitive: 2,
    });
  });

  it("places every sighting inside its zone and inside the event area, within the event's 48 hours (but the crafted review cases)", async () => {
    const crafted = REVIEW_CASES.map((c) => reviewCaseId(c.key));
    const { rows } = await db().execute<{
      outside_zone: number;
      outside_area: number;
      outside_time: number;
      zones_outside_area: number;
    }>(sql`
      SELECT count(*) FILTER (WHERE NOT ST_Within(s.location, z.geom))::int AS outside_zone,
             count(*) FILTER (WHERE NOT ST_Within(s.location, e.area))::int AS outside_area,
             count(*) FILTER (WHERE s.observed_at NOT BETWEEN e.starts_at AND e.ends_at)::int AS outside_time,
             (SELECT count(*) FROM zones z2 WHERE z2.event_id = e.id AND NOT ST_Within(z2.geom, e.area))::int AS zones_outside_area
      FROM sightings s JOIN zones z ON z.id = s.zone_id JOIN events e ON e.id = s.event_id
      WHERE e.slug = ${DEMO_EVENT.slug} AND NOT s.id = ANY(${`{${crafted.join(",")}}`}::uuid[]) GROUP BY e.id`);
    expect(rows[0]).toEqual({ outside_zone: 0, outside_area: 0, outside_time: 0, zones_outside_area: 0 });
  });

  it("keeps the closed event's review open until the next midsummer, so its returned records can be answered", async () => {
    await seedDemo(db() as never);
    const [event] = await db().select().from(schema.events).where(eq(schema.events.slug, DEMO_EVENT.slug));
    expect(event!.status).toBe("closed");
    expect(reviewOpen(event!, new Date("2026-12-03T12:00:00Z"))).toBe(true);
    expect(reviewOpen(event!, new Date("2027-06-20T12:00:00Z"))).toBe(false);
  });

  it("keeps each sighting's state in step with its latest review decision", async () => {
    const { rows } = await db().execute<{ n: number }>(sql`
      SELECT count(*)::int AS n FROM sightings s
      LEFT JOIN LATERAL (SELECT to_state FROM reviews r WHERE r.sighting_id = s.id ORDER BY decided_at DESC, id DESC LIMIT 1) last ON true
      JOIN events e ON e.id = s.event_id
      WHERE e.slug = ${DEMO_EVENT.slug} AND s.review_state <> coalesce(last.to_state, 'pending')`);
    expect(rows[0]!.n).toBe(0);
  });

  it("has a pending crafted sighting raising each check mark, and unmarked sightings too", async () => {
    const { rows } = await db().execute<{ mark: string; n: number }>(sql`
      SELECT m.mark::text AS mark, count(*)::int AS n FROM sightings s JOIN events e ON e.id = s.event_id
      CROSS JOIN LATERAL unnest(s.check_marks) AS m(mark)
      WHERE e.slug = ${DEMO_EVENT.slug} AND s.review_state = 'pending' GROUP BY 1`);
    const byMark = Object.fromEntries(rows.map((r) => [r.mark, r.n]));
    for (const mark of schema.checkMark.enumValues) expect(byMark[mark], mark).toBeGreaterThan(0);
    const clean = await db().execute<{ n: number }>(sql`
      SELECT count(*)::int AS n FROM sightings s JOIN events e ON e.id = s.event_id WHERE e.slug = ${DEMO_EVENT.slug} AND cardinality(s.check_marks) = 0`);
    expect(clean.rows[0]!.n).toBeGreaterThan(200);
  });
});
