import { sql } from "drizzle-orm";
import type { NodePgDatabase } from "drizzle-orm/node-postgres";
import * as s from "../schema";
import { refreshCheckMarks } from "../queries/check-marks";
import { DEMO_AREA, DEMO_ZONES, EARLIER_EVENT } from "./demo-scenario";
import { demoId, seededRandom } from "./random";
import { SEED_TAXA, type SeedTaxon } from "./taxa";

type Tx = Parameters<Parameters<NodePgDatabase<typeof s>["transaction"]>[0]>[0];
const polygonSql = (ring: [number, number][]) =>
  sql`ST_SetSRID(ST_GeomFromGeoJSON(${JSON.stringify({ type: "Polygon", coordinates: [ring] })}), 4326)`;

/**
 * The reserve's count a year earlier (db/seed/demo-scenario.ts EARLIER_EVENT): the same area
 * and zones, complete timed counts only, every record approved. Invented data, from its own
 * seeded generator so this year's records stay exactly as they were. Idempotent.
 */
export async function seedEarlierEvent(
  tx: Tx,
  ids: { orgId: string; people: Map<string, string>; taxonIds: Map<string, string> },
): Promise<void> {
  const rand = seededRandom(20250621);
  const pick = <T>(xs: readonly T[]): T => xs[Math.floor(rand() * xs.length)]!;
  const eventId = demoId("event:earlier");
  const inserted = await tx
    .insert(s.events)
    .values({
      id: eventId,
      organisationId: ids.orgId,
      slug: EARLIER_EVENT.slug,
      name: EARLIER_EVENT.name,
      description: EARLIER_EVENT.description,
      status: EARLIER_EVENT.status,
      startsAt: EARLIER_EVENT.startsAt,
      endsAt: EARLIER_EVENT.endsAt,
      timeZone: EARLIER_EVENT.timeZone,
      languages: EARLIER_EVENT.languages,
      area: polygonSql(DEMO_AREA),
      joinCode: EARLIER_EVENT.joinCode,
      accuracyLimitM: EARLIER_EVENT.accuracyLimitM,
    })
    .onConflictDoNothing()
    .returning({ id: s.events.id });
  if (inserted.length === 0) return; // seeded before: nothing to add

  const zoneIds = new Map<string, string>();
  for (const z of DEMO_ZONES) {
    const id = demoId(`zone:earlier:${z.key}`);
    zoneIds.set(z.key, id);
    await tx
      .insert(s.zones)
      .values({ id, eventId, name: z.name, habitat: z.habitat, description: z.description, geom: polygonSql(z.ring) })
      .onConflictDoNothing();
  }
  await tx
    .insert(s.eventMembers)
    .values([
      { eventId, userId: ids.people.get("organiser")!, role: "organiser" as const },
      ...EARLIER_EVENT.members.map((m) => ({ eventId, userId: ids.people.get(m.key)!, role: m.role })),
    ])
    .onConflictDoNothing();
  await tx
    .insert(s.eventSpecies)
    .values(SEED_TAXA.map((t) => ({ eventId, taxonId: ids.taxonIds.get(t.scientificName)! })))
    .onConflictDoNothing();

  // Two volunteers, eight 20-minute timed counts each, every list full; mostly the common
  // species (a first year, fewer experienced eyes).
  const sessions: (typeof s.countSessions.$inferInsert)[] = [];
  const sightings: (typeof s.sightings.$inferInsert)[] = [];
  const volunteers = EARLIER_EVENT.members.filter((m) => m.role === "volunteer");
  for (const v of volunteers) {
    for (let k = 0; k < 8; k++) {
      const zone = DEMO_ZONES[(k + (v.key === "vol-4" ? 0 : 2)) % DEMO_ZONES.length]!;
      const sessionId = demoId(`earlier:session:${v.key}:${k}`);
      const startMs = EARLIER_EVENT.startsAt.getTime() + (1 + k * 1.8 + rand()) * 3_600_000;
      sessions.push({
        id: sessionId,
        eventId,
        userId: ids.people.get(v.key)!,
        zoneId: zoneIds.get(zone.key)!,
        kind: "timed_count",
        startedAt: new Date(startMs),
        endedAt: new Date(startMs + 20 * 60_000),
        allSpeciesNoted: true,
      });
      const pool = SEED_TAXA.filter((t) => zone.pools.includes(t.habitat));
      const weighted = pool.flatMap((t) => Array.from({ length: t.abundance ** 3 }, () => t));
      const found = new Set<SeedTaxon>();
      const target = 5 + Math.floor(rand() * 8);
      for (let tries = 0; found.size < target && tries < 200; tries++) found.add(pick(weighted));
      let i = 0;
      for (const taxon of found) {
        if (taxon.sensitivity !== "open") continue; // no sensitive records in last year's demo
        const [w, so, e, n] = zone.box;
        sightings.push({
          id: demoId(`earlier:${v.key}:${k}:sighting:${i++}`),
          eventId,
          userId: ids.people.get(v.key)!,
          sessionId,
          taxonId: ids.taxonIds.get(taxon.scientificName)!,
          count: 1 + Math.floor(rand() * rand() * 4 * taxon.abundance),
          observedAt: new Date(startMs + Math.floor(rand() * 20) * 60_000),
          location: { longitude: w + (e - w) * (0.1 + 0.8 * rand()), latitude: so + (n - so) * (0.1 + 0.8 * rand()) },
          accuracyM: Math.round(5 + rand() * 20),
          zoneId: zoneIds.get(zone.key)!,
          reviewState: "approved",
          version: 2,
        });
      }
    }
  }
  await tx.insert(s.countSessions).values(sessions).onConflictDoNothing();
  await tx.insert(s.sightings).values(sightings).onConflictDoNothing();
  await refreshCheckMarks(
    tx,
    sightings.map((x) => x.id!),
  );
  // Every record approved by the coordinator the evening after, as the history must show.
  await tx.insert(s.reviews).values(
    sightings.map((x) => ({
      sightingId: x.id!,
      eventId: x.eventId,
      reviewerId: ids.people.get("coord-all")!,
      decidedAt: new Date(EARLIER_EVENT.endsAt.getTime() + 12 * 3_600_000),
      fromState: "pending" as const,
      toState: "approved" as const,
    })),
  );
}
