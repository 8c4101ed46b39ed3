import "server-only";
import { asc, eq, sql } from "drizzle-orm";
import type { ArealGeometry, EventPack } from "@/lib/sync/pack";
import { getDb } from "../client";
import { eventSpecies, events, sightings, taxa, taxonNames, zones } from "../schema";
import { eventCountUnits } from "./results";
import { DEFAULT_COUNT_UNITS, countUnitOf } from "@/lib/results/settings";

// The event pack (issue 5): everything the field log needs to work offline at one event,
// stored on the device and refreshed only when its ETag changes. Its shape is the sync
// contract's (lib/sync/pack.ts), shared with the phone.

// GeoJSON as RFC 7946 wants it: WGS 84 longitude/latitude, exterior rings counter-clockwise
// (RFC 7946 section 3.1.6, hence ST_ForcePolygonCCW), and 7 decimals (about 1 cm; section
// 11.2 says 6 is usually enough).
const geoJson = (column: unknown) => sql<string>`ST_AsGeoJSON(ST_ForcePolygonCCW(${column}), 7)`;

/** How many of the event's most-recorded taxa the pack names (about one screen of the search list). */
const MOST_RECORDED = 8;

export async function getEventPack(eventId: string): Promise<EventPack | null> {
  const db = getDb();
  const [event] = await db
    .select({
      id: events.id,
      name: events.name,
      status: events.status,
      startsAt: events.startsAt,
      endsAt: events.endsAt,
      timeZone: events.timeZone,
      languages: events.languages,
      sessionKinds: events.sessionKinds,
      accuracyLimitM: events.accuracyLimitM,
      photoRequiredSensitive: events.photoRequiredSensitive,
      photoRequiredOffList: events.photoRequiredOffList,
      area: sql<string | null>`CASE WHEN ${events.area} IS NULL THEN NULL ELSE ${geoJson(events.area)} END`,
    })
    .from(events)
    .where(eq(events.id, eventId))
    .limit(1);
  if (!event) return null;
  const chosenUnits = await eventCountUnits(eventId, db);

  const zoneRows = await db
    .select({
      id: zones.id,
      name: zones.name,
      habitat: zones.habitat,
      description: zones.description,
      geometry: geoJson(zones.geom),
    })
    .from(zones)
    .where(eq(zones.eventId, eventId))
    .orderBy(asc(zones.name), asc(zones.id));

  const speciesRows = await db
    .select({
      id: taxa.id,
      scientificName: taxa.scientificName,
      rank: taxa.rank,
      taxonGroup: taxa.taxonGroup,
      sensitivity: taxa.sensitivity,
      onList: sql<boolean>`${eventSpecies.taxonId} IS NOT NULL`,
      names: sql<Record<string, string> | null>`(
      SELECT jsonb_object_agg(${taxonNames.locale}, ${taxonNames.name} ORDER BY ${taxonNames.locale}) FROM ${taxonNames}
      WHERE ${taxonNames.taxonId} = ${taxa.id} AND ${taxonNames.locale} = ANY(${events.languages})
    )`,
    })
    .from(taxa)
    .innerJoin(events, eq(events.id, eventId))
    .leftJoin(eventSpecies, sql`${eventSpecies.eventId} = ${eventId} AND ${eventSpecies.taxonId} = ${taxa.id}`)
    .orderBy(sql`${eventSpecies.taxonId} IS NULL`, asc(taxa.scientificName), asc(taxa.id));

  // The species this event records most, for the search list before any typing (sensitive
  // taxa left out: a ranking would say more about them than their place on the list).
  const mostRecorded = await db
    .select({ id: sightings.taxonId })
    .from(sightings)
    .innerJoin(taxa, eq(taxa.id, sightings.taxonId))
    .where(
      sql`${sightings.eventId} = ${eventId} AND ${sightings.reviewState} <> 'rejected' AND ${taxa.sensitivity} = 'open'`,
    )
    .groupBy(sightings.taxonId)
    .orderBy(sql`count(*) DESC`, asc(sightings.taxonId))
    .limit(MOST_RECORDED);

  return {
    event: {
      id: event.id,
      name: event.name,
      status: event.status,
      startsAt: event.startsAt.toISOString(),
      endsAt: event.endsAt.toISOString(),
      timeZone: event.timeZone,
      languages: event.languages,
      sessionKinds: event.sessionKinds,
      accuracyLimitM: event.accuracyLimitM,
      photoRules: { requiredForSensitive: event.photoRequiredSensitive, requiredOffList: event.photoRequiredOffList },
      area: event.area ? (JSON.parse(event.area) as ArealGeometry) : null,
      countUnits: Object.fromEntries(Object.keys(DEFAULT_COUNT_UNITS).map((g) => [g, countUnitOf(g, chosenUnits)])),
    },
    zones: {
      type: "FeatureCollection",
      features: zoneRows.map((z) => ({
        type: "Feature",
        id: z.id,
        geometry: JSON.parse(z.geometry) as ArealGeometry,
        properties: { name: z.name, habitat: z.habitat, description: z.description },
      })),
    },
    species: speciesRows.map((r) => ({
      id: r.id,
      scientificName: r.scientificName,
      rank: r.rank,
      taxonGroup: r.taxonGroup,
      sensitivity: r.sensitivity,
      onList: r.onList,
      names: r.names ?? {},
    })),
    mostRecorded: mostRecorded.flatMap((r) => (r.id ? [r.id] : [])),
  };
}
