import { sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import * as s from "@/db/schema";
import { sessionRecord, sightingRecord, type SessionRecord, type SightingRecord } from "@/lib/sync/records";

export const db = () => getDb();

export const lonLat = (longitude: number, latitude: number) => ({ longitude, latitude });
export const polygonSql = (ring: [number, number][]) =>
  sql`ST_SetSRID(ST_GeomFromGeoJSON(${JSON.stringify({ type: "Polygon", coordinates: [ring] })}), 4326)`;

/** A minimal valid organisation, person, event, zone and taxon to hang test rows on. */
export async function makeFixture(tag: string) {
  const [org] = await db()
    .insert(s.organisations)
    .values({ slug: `org-${tag}`, name: `Org ${tag}` })
    .returning();
  const [user] = await db()
    .insert(s.users)
    .values({ email: `${tag}@example.org`, name: `Person ${tag}` })
    .returning();
  const [event] = await db()
    .insert(s.events)
    .values({
      organisationId: org!.id,
      slug: `event-${tag}`,
      name: `Event ${tag}`,
      status: "open",
      startsAt: new Date("2026-06-20T05:00:00Z"),
      endsAt: new Date("2026-06-22T05:00:00Z"),
      timeZone: "Europe/London",
      area: polygonSql([
        [0, 0],
        [1, 0],
        [1, 1],
        [0, 1],
        [0, 0],
      ]),
    })
    .returning();
  const [zone] = await db()
    .insert(s.zones)
    .values({
      eventId: event!.id,
      name: "Zone A",
      habitat: "edge",
      geom: polygonSql([
        [0, 0],
        [0.5, 0],
        [0.5, 0.5],
        [0, 0.5],
        [0, 0],
      ]),
    })
    .returning();
  const [taxon] = await db()
    .insert(s.taxa)
    .values({ scientificName: `Testus ${tag}`, taxonGroup: "birds" })
    .returning();
  return { org: org!, user: user!, event: event!, zone: zone!, taxon: taxon! };
}

export function sightingValues(
  f: Awaited<ReturnType<typeof makeFixture>>,
  over: Partial<typeof s.sightings.$inferInsert> = {},
) {
  return {
    id: crypto.randomUUID(),
    eventId: f.event.id,
    userId: f.user.id,
    taxonId: f.taxon.id,
    count: 1,
    observedAt: new Date("2026-06-20T09:00:00Z"),
    location: lonLat(0.2, 0.2),
    accuracyM: 10,
    zoneId: f.zone.id,
    ...over,
  } satisfies typeof s.sightings.$inferInsert;
}

/** Runs `fn` and returns PostgreSQL's refusal (SQLSTATE code and constraint), or fails. */
export async function refusal(
  fn: () => Promise<unknown>,
): Promise<{ code: string; constraint?: string; message: string }> {
  try {
    await fn();
  } catch (err) {
    // drizzle wraps the driver error; PostgreSQL's fields sit on the cause.
    const e = ((err as { cause?: unknown }).cause ?? err) as { code?: string; constraint?: string; message: string };
    if (!e.code) throw err;
    return { code: e.code, constraint: e.constraint, message: e.message };
  }
  throw new Error("expected PostgreSQL to refuse the row, but it was accepted");
}

/** A count session as a phone sends it in a sync batch (a finished 30-minute complete count), with `over` applied. */
export const syncSession = (zoneId: string | null, over: Record<string, unknown> = {}): SessionRecord =>
  sessionRecord.parse({
    id: crypto.randomUUID(),
    zoneId,
    kind: "timed_count",
    startedAt: "2026-06-20T08:00:00Z",
    endedAt: "2026-06-20T08:30:00Z",
    allSpeciesNoted: true,
    distanceM: null,
    notes: "",
    ...over,
  });

/** A sighting as a phone sends it in a sync batch (two of `taxonId` at 0.2, 0.2, no session), with `over` applied. */
export const syncSighting = (taxonId: string, over: Record<string, unknown> = {}): SightingRecord =>
  sightingRecord.parse({
    id: crypto.randomUUID(),
    sessionId: null,
    taxonId,
    description: "",
    count: 2,
    countIsEstimate: false,
    observedAt: "2026-06-20T08:10:00Z",
    latitude: 0.2,
    longitude: 0.2,
    accuracyM: 8.3,
    zoneId: null,
    notes: "",
    photoIds: [],
    ...over,
  });
