import "server-only";
import { and, asc, count, eq, ne, sql } from "drizzle-orm";
import { getDb } from "../client";
import { eventSpecies, events, organisations, taxa, zones } from "../schema";

export type EventSummary = Pick<
  typeof events.$inferSelect,
  "id" | "slug" | "name" | "status" | "startsAt" | "endsAt" | "timeZone"
> & {
  organisationName: string;
  zoneCount: number;
  speciesCount: number;
};

/** Events that are not drafts, newest first, for the home page. */
export async function listPublicEvents(): Promise<EventSummary[]> {
  const db = getDb();
  const zoneCount = db.$with("zone_count").as(
    db
      .select({ eventId: zones.eventId, zones: count().as("zone_n") })
      .from(zones)
      .groupBy(zones.eventId),
  );
  const speciesCount = db.$with("species_count").as(
    db
      .select({ eventId: eventSpecies.eventId, species: count().as("species_n") })
      .from(eventSpecies)
      .groupBy(eventSpecies.eventId),
  );
  const rows = await db
    .with(zoneCount, speciesCount)
    .select({
      id: events.id,
      slug: events.slug,
      name: events.name,
      status: events.status,
      startsAt: events.startsAt,
      endsAt: events.endsAt,
      timeZone: events.timeZone,
      organisationName: organisations.name,
      zoneCount: sql<number>`coalesce(${zoneCount.zones}, 0)::int`,
      speciesCount: sql<number>`coalesce(${speciesCount.species}, 0)::int`,
    })
    .from(events)
    .innerJoin(organisations, eq(organisations.id, events.organisationId))
    .leftJoin(zoneCount, eq(zoneCount.eventId, events.id))
    .leftJoin(speciesCount, eq(speciesCount.eventId, events.id))
    .where(ne(events.status, "draft"))
    .orderBy(sql`${events.startsAt} DESC`);
  return rows;
}

/** An event by its address with what its pages show; `drafts` includes events still in preparation. */
async function eventBySlug(slug: string, drafts: boolean) {
  const [row] = await getDb()
    .select({
      id: events.id,
      slug: events.slug,
      name: events.name,
      description: events.description,
      status: events.status,
      startsAt: events.startsAt,
      endsAt: events.endsAt,
      timeZone: events.timeZone,
      languages: events.languages,
      reviewClosesAt: events.reviewClosesAt,
      organisationName: organisations.name,
    })
    .from(events)
    .innerJoin(organisations, eq(organisations.id, events.organisationId))
    .where(drafts ? eq(events.slug, slug) : and(eq(events.slug, slug), ne(events.status, "draft")))
    .limit(1);
  return row ?? null;
}

export async function getPublicEventBySlug(slug: string) {
  return eventBySlug(slug, false);
}

/**
 * An event by its address for its own members' pages (results, preview), drafts included: the
 * page itself checks the person's role. The public pages use getPublicEventBySlug.
 */
export async function getMemberEventBySlug(slug: string) {
  return eventBySlug(slug, true);
}

/** The latitude of the event's area (or of its zones) at its centroid: sizes the 0.1° cell east–west. */
export async function eventLatitude(eventId: string): Promise<number | null> {
  const r = await getDb().execute<{ lat: number | null }>(sql`
    SELECT ST_Y(ST_Centroid(coalesce(e.area, (SELECT ST_Union(z.geom) FROM zones z WHERE z.event_id = e.id))))::float8 AS lat
    FROM events e WHERE e.id = ${eventId}`);
  const lat = r.rows[0]?.lat;
  return lat === null || lat === undefined ? null : Number(lat);
}

export async function listZones(eventId: string) {
  return getDb()
    .select({
      id: zones.id,
      name: zones.name,
      habitat: zones.habitat,
      description: zones.description,
      // Area on the spheroid, in hectares.
      areaHa: sql<number>`round((ST_Area(${zones.geom}::geography) / 10000)::numeric, 1)::float8`,
    })
    .from(zones)
    .where(eq(zones.eventId, eventId))
    .orderBy(asc(zones.name));
}

export async function speciesListSummary(eventId: string) {
  const rows = await getDb()
    .select({
      group: taxa.taxonGroup,
      total: count(),
      sensitive: sql<number>`count(*) FILTER (WHERE ${taxa.sensitivity} <> 'open')::int`,
    })
    .from(eventSpecies)
    .innerJoin(taxa, eq(taxa.id, eventSpecies.taxonId))
    .where(eq(eventSpecies.eventId, eventId))
    .groupBy(taxa.taxonGroup)
    .orderBy(asc(taxa.taxonGroup));
  return {
    byGroup: rows.map((r) => ({ group: r.group, count: Number(r.total) })),
    total: rows.reduce((s, r) => s + Number(r.total), 0),
    sensitive: rows.reduce((s, r) => s + Number(r.sensitive), 0),
  };
}

/** The id of the event with this slug, whatever its status (drafts too): for pages that check roles next. */
export async function eventIdBySlug(slug: string): Promise<string | null> {
  const [row] = await getDb().select({ id: events.id }).from(events).where(eq(events.slug, slug)).limit(1);
  return row?.id ?? null;
}
