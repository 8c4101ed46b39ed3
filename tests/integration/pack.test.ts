import { eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { getEventPack } from "@/db/queries/pack";
import * as s from "@/db/schema";
import { jsonWithEtag } from "@/lib/http/etag";
import { db, makeFixture } from "./helpers";

type Fixture = Awaited<ReturnType<typeof makeFixture>>;
let f: Fixture;
let offList: typeof s.taxa.$inferSelect;
// Files share the test database, and the demo seed's test counts taxa named in exactly three
// languages and restricted taxa: this file's taxa have four languages and are not restricted.

beforeAll(async () => {
  f = await makeFixture("pack");
  await db()
    .update(s.events)
    .set({ languages: ["en", "fr"] })
    .where(eq(s.events.id, f.event.id));
  await db().insert(s.eventSpecies).values({ eventId: f.event.id, taxonId: f.taxon.id });
  await db()
    .insert(s.taxonNames)
    .values([
      { taxonId: f.taxon.id, locale: "en", name: "Test bird" },
      { taxonId: f.taxon.id, locale: "fr", name: "Oiseau test" },
      { taxonId: f.taxon.id, locale: "es", name: "Ave de prueba" },
      { taxonId: f.taxon.id, locale: "de", name: "Testvogel" },
    ]);
  [offList] = (await db()
    .insert(s.taxa)
    .values({ scientificName: "Offlistus packi", taxonGroup: "fungi", sensitivity: "generalised" })
    .returning()) as [typeof s.taxa.$inferSelect];
});

describe("the event pack", () => {
  it("holds the settings, the zones as an RFC 7946 FeatureCollection and the species with names in the event's languages", async () => {
    const pack = (await getEventPack(f.event.id))!;
    expect(pack.event).toMatchObject({
      id: f.event.id,
      status: "open",
      timeZone: "Europe/London",
      languages: ["en", "fr"],
      accuracyLimitM: 100,
      sessionKinds: ["timed_count", "walk", "plot_search"],
      photoRules: { requiredForSensitive: true, requiredOffList: true },
      startsAt: "2026-06-20T05:00:00.000Z",
    });
    expect(pack.zones.type).toBe("FeatureCollection");
    const [zone] = pack.zones.features;
    expect(zone).toMatchObject({
      type: "Feature",
      id: f.zone.id,
      properties: { name: "Zone A", habitat: "edge" },
      geometry: { type: "Polygon" },
    });
    // RFC 7946 section 3.1.6: the exterior ring is counter-clockwise (positive signed area), first = last position.
    const ring = (zone!.geometry.coordinates as number[][][])[0]!;
    expect(ring[0]).toEqual(ring.at(-1));
    const signedArea = ring.slice(1).reduce((sum, [x, y], i) => sum + (ring[i]![0]! * y! - x! * ring[i]![1]!), 0) / 2;
    expect(signedArea).toBeGreaterThan(0);

    const bird = pack.species.find((t) => t.id === f.taxon.id);
    expect(bird).toMatchObject({
      onList: true,
      sensitivity: "open",
      taxonGroup: "birds",
      names: { en: "Test bird", fr: "Oiseau test" },
    });
    expect(Object.keys(bird!.names)).toEqual(["en", "fr"]);
    expect(pack.species.find((t) => t.id === offList.id)).toMatchObject({
      onList: false,
      sensitivity: "generalised",
      names: {},
    });
    expect(pack.species.findIndex((t) => t.id === f.taxon.id)).toBeLessThan(
      pack.species.findIndex((t) => t.id === offList.id),
    );
  });

  it("answers 304 to the same ETag, and a new ETag once the event changes", async () => {
    const url = `http://localhost/api/events/${f.event.id}/pack`;
    const first = jsonWithEtag(new Request(url), await getEventPack(f.event.id));
    expect(first.status).toBe(200);
    const etag = first.headers.get("etag")!;
    expect(etag).toMatch(/^"[\w-]{43}"$/); // strong: no W/ prefix
    expect((await first.json()).event.id).toBe(f.event.id);

    const again = jsonWithEtag(
      new Request(url, { headers: { "if-none-match": etag } }),
      await getEventPack(f.event.id),
    );
    expect(again.status).toBe(304);
    expect(await again.text()).toBe("");
    expect(again.headers.get("etag")).toBe(etag);

    await db().update(s.zones).set({ name: "Zone A (north)" }).where(eq(s.zones.id, f.zone.id));
    const changed = jsonWithEtag(
      new Request(url, { headers: { "if-none-match": etag } }),
      await getEventPack(f.event.id),
    );
    expect(changed.status).toBe(200);
    expect(changed.headers.get("etag")).not.toBe(etag);
  });

  it("names the event's most-recorded open taxa, most first, leaving out rejected records and sensitive taxa", async () => {
    const [other] = (await db()
      .insert(s.taxa)
      .values({ scientificName: "Secondus packi", taxonGroup: "birds" })
      .returning()) as [typeof s.taxa.$inferSelect];
    const at = (taxonId: string, reviewState: "pending" | "rejected" = "pending") => ({
      id: crypto.randomUUID(),
      eventId: f.event.id,
      userId: f.user.id,
      taxonId,
      count: 1,
      observedAt: new Date("2026-06-20T08:00:00Z"),
      location: { longitude: 0.2, latitude: 0.2 },
      accuracyM: 5,
      reviewState,
    });
    await db()
      .insert(s.sightings)
      .values([
        at(f.taxon.id),
        at(other!.id),
        at(other!.id),
        at(f.taxon.id, "rejected"),
        at(f.taxon.id, "rejected"),
        at(offList.id),
        at(offList.id),
        at(offList.id),
      ]);
    const pack = (await getEventPack(f.event.id))!;
    expect(pack.mostRecorded).toEqual([other!.id, f.taxon.id]);
  });

  it("is null for an unknown event", async () => {
    expect(await getEventPack(crypto.randomUUID())).toBeNull();
  });
});
