import { beforeAll, describe, expect, it } from "vitest";
import { getPublicEventBySlug, listPublicEvents, listZones, speciesListSummary } from "@/db/queries/events";
import { seedDemo } from "@/db/seed/demo";
import { DEMO_EVENT } from "@/db/seed/demo-scenario";
import * as s from "@/db/schema";
import { db, makeFixture } from "./helpers";

beforeAll(async () => {
  await seedDemo(db() as never);
});

describe("event queries for the home and event pages", () => {
  it("lists the demo event with its zone and species counts, and leaves drafts out", async () => {
    const f = await makeFixture("draft-check");
    await db()
      .insert(s.events)
      .values({
        organisationId: f.org.id,
        slug: "still-a-draft",
        name: "Still a draft",
        status: "draft",
        startsAt: new Date("2027-01-01T00:00:00Z"),
        endsAt: new Date("2027-01-02T00:00:00Z"),
        timeZone: "UTC",
      });
    const events = await listPublicEvents();
    expect(events.find((e) => e.slug === "still-a-draft")).toBeUndefined();
    expect(events.find((e) => e.slug === DEMO_EVENT.slug)).toMatchObject({
      name: DEMO_EVENT.name,
      organisationName: "Friends of Harrowmere Vale",
      zoneCount: 4,
      speciesCount: 150,
      status: "closed",
    });
    expect(events.find((e) => e.slug === "event-draft-check")).toMatchObject({ zoneCount: 1, speciesCount: 0 });
  });

  it("gives an event's zones with areas in hectares, and its species by group", async () => {
    const event = await getPublicEventBySlug(DEMO_EVENT.slug);
    expect(event?.timeZone).toBe("Europe/London");
    const zones = await listZones(event!.id);
    expect(zones.map((z) => z.name)).toEqual([
      "Alder Fringe",
      "Beechwood Heart",
      "Harrowmere Meadow",
      "Millpond Margin",
    ]);
    // Alder Fringe spans 0.0025° of longitude (about 171 m at 52.1° N) by 0.006° of latitude
    // (about 667 m): about 11.4 ha.
    expect(zones[0]!.areaHa).toBeGreaterThan(11);
    expect(zones[0]!.areaHa).toBeLessThan(12);
    const species = await speciesListSummary(event!.id);
    expect(species.total).toBe(150);
    expect(species.sensitive).toBe(3); // two restricted taxa and one generalised
    expect(species.byGroup.find((g) => g.group === "birds")?.count).toBe(45);
  });

  it("finds no public event for an unknown slug", async () => {
    expect(await getPublicEventBySlug("no-such-event")).toBeNull();
  });
});
