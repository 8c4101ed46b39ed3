import "server-only";
import { sql } from "drizzle-orm";
import type { ArealGeometry as Geometry } from "@/lib/geo/areal";
import type { AreaInput, GeoProblem, ZoneInput } from "@/lib/geo/geojson";
import { getDb } from "../client";
import { sessionZonesSql } from "./results";

type Tx = Parameters<Parameters<ReturnType<typeof getDb>["transaction"]>[0]>[0];

// PostGIS checks of an uploaded area and its zones, then the save, in one transaction:
// the event keeps its old area and zones unless every check passes.
// - ST_IsValid / ST_IsValidReason: rings that cross themselves, holes outside shells…
//   (OGC Simple Features validity, as PostGIS implements it);
// - ST_Within: every zone lies inside the event area (sharing its boundary is fine);
// - zones may not overlap one another (interiors meeting, DE-9IM "2********"), so that
//   each record falls in one zone — common practice for stratified surveys;
// - a zone that already holds records cannot vanish by leaving it out of the file.

async function loadInput(tx: Tx, area: AreaInput, zones: ZoneInput[]) {
  const items = [
    { feature: area.feature, kind: "area", name: "", geometry: area.geometry },
    ...zones.map((z) => ({ feature: z.feature, kind: "zone", name: z.name, geometry: z.geometry })),
  ];
  await tx.execute(
    sql`CREATE TEMP TABLE upload_geom (feature int, kind text, name text, geom geometry) ON COMMIT DROP`,
  );
  await tx.execute(sql`
    INSERT INTO upload_geom
    SELECT (x->>'feature')::int, x->>'kind', x->>'name', ST_SetSRID(ST_Force2D(ST_GeomFromGeoJSON(x->>'geometry')), 4326)
    FROM jsonb_array_elements(${JSON.stringify(items.map((i) => ({ ...i, geometry: JSON.stringify(i.geometry) })))}::jsonb) x`);
}

async function checks(tx: Tx, eventId: string, area: AreaInput, zones: ZoneInput[]): Promise<GeoProblem[]> {
  const problems: GeoProblem[] = [];
  const nameOf = new Map<number, string>(zones.map((z) => [z.feature, z.name]));
  try {
    await tx.execute(sql`SAVEPOINT read_geojson`);
    await loadInput(tx, area, zones);
    await tx.execute(sql`RELEASE SAVEPOINT read_geojson`);
  } catch (err) {
    await tx.execute(sql`ROLLBACK TO SAVEPOINT read_geojson`);
    console.warn("[setup] PostGIS could not read an upload:", (err as Error).message);
    return [{ feature: null, code: "unreadableGeometry" }];
  }
  const { rows: invalid } = await tx.execute<{ feature: number; reason: string }>(sql`
    SELECT feature, ST_IsValidReason(geom) AS reason FROM upload_geom WHERE NOT ST_IsValid(geom) ORDER BY feature`);
  for (const r of invalid)
    problems.push({
      feature: r.feature,
      name: nameOf.get(r.feature),
      code: "invalidGeometry",
      values: { reason: r.reason },
    });
  // Within and overlap are meaningless on invalid shapes: those are left out of the next checks,
  // and every other feature is still checked, so one upload reports every problem at once.
  const { rows: outside } = await tx.execute<{ feature: number; outside_m2: number }>(sql`
    SELECT z.feature, round(ST_Area(ST_Difference(z.geom, a.geom)::geography))::float8 AS outside_m2
    FROM upload_geom z, upload_geom a
    WHERE z.kind = 'zone' AND a.kind = 'area' AND ST_IsValid(z.geom) AND ST_IsValid(a.geom)
      AND NOT ST_Within(z.geom, a.geom)
    ORDER BY z.feature`);
  for (const r of outside)
    problems.push({
      feature: r.feature,
      name: nameOf.get(r.feature),
      code: "outsideArea",
      values: { squareMetres: r.outside_m2 },
    });

  const { rows: overlaps } = await tx.execute<{ a: number; b: number }>(sql`
    SELECT x.feature AS a, y.feature AS b FROM upload_geom x JOIN upload_geom y
      ON x.kind = 'zone' AND y.kind = 'zone' AND x.feature < y.feature AND ST_IsValid(x.geom) AND ST_IsValid(y.geom)
        AND x.geom && y.geom AND ST_Relate(x.geom, y.geom, '2********')
    ORDER BY 1, 2`);
  for (const r of overlaps)
    problems.push({
      feature: r.b,
      name: nameOf.get(r.b),
      code: "overlapsZone",
      values: { other: nameOf.get(r.a) ?? String(r.a + 1) },
    });

  const { rows: dropped } = await tx.execute<{ name: string; records: number }>(sql`
    SELECT z.name, ((SELECT count(*) FROM sightings s WHERE s.zone_id = z.id) + (SELECT count(*) FROM count_sessions c WHERE c.zone_id = z.id))::int AS records
    FROM zones z
    WHERE z.event_id = ${eventId} AND NOT EXISTS (SELECT 1 FROM upload_geom u WHERE u.kind = 'zone' AND lower(u.name) = lower(z.name))
    ORDER BY z.name`);
  for (const r of dropped)
    if (r.records > 0)
      problems.push({ feature: null, name: r.name, code: "zoneHasRecords", values: { records: r.records } });
  return problems;
}

export type ZonesUploadResult = {
  problems: GeoProblem[];
  saved: boolean;
  summary: { zones: number; added: number; updated: number; removed: number };
  /** After a save: how many existing sightings and count sessions changed zone. */
  moved?: { sightings: number; sessions: number };
};

/**
 * One zone per record, after the zones change: every sighting of the event goes to the
 * zone that covers its own point (the smallest, if zones touch; as sync decides it), then
 * every count session to the zone holding most of its sightings (results.ts sessionZonesSql).
 */
export async function reassignZones(tx: Tx, eventId: string): Promise<{ sightings: number; sessions: number }> {
  const moved = await tx.execute(sql`
    WITH target AS (
      SELECT s.id, (
        SELECT z.id FROM zones z WHERE z.event_id = ${eventId} AND ST_Covers(z.geom, s.location)
        ORDER BY ST_Area(z.geom), z.id LIMIT 1
      ) AS zone_id
      FROM sightings s WHERE s.event_id = ${eventId}
    )
    UPDATE sightings s SET zone_id = t.zone_id FROM target t
    WHERE t.id = s.id AND s.zone_id IS DISTINCT FROM t.zone_id`);
  const sessions = await tx.execute(sql`
    WITH sz AS (${sessionZonesSql(eventId, { completeOnly: false })})
    UPDATE count_sessions c SET zone_id = sz.zone_id FROM sz
    WHERE sz.id = c.id AND c.zone_id IS DISTINCT FROM sz.zone_id`);
  return { sightings: moved.rowCount ?? 0, sessions: sessions.rowCount ?? 0 };
}

export async function uploadAreaAndZones(
  eventId: string,
  area: AreaInput,
  zones: ZoneInput[],
  save: boolean,
): Promise<ZonesUploadResult> {
  return getDb().transaction(async (tx) => {
    await tx.execute(sql`SELECT id FROM events WHERE id = ${eventId} FOR UPDATE`);
    const problems = await checks(tx, eventId, area, zones);
    const { rows: current } = await tx.execute<{ id: string; name: string; records: number }>(sql`
      SELECT z.id, z.name FROM zones z WHERE z.event_id = ${eventId}`);
    const byName = new Map(current.map((z) => [z.name.toLowerCase(), z]));
    const incoming = new Set(zones.map((z) => z.name.toLowerCase()));
    const summary = {
      zones: zones.length,
      added: zones.filter((z) => !byName.has(z.name.toLowerCase())).length,
      updated: zones.filter((z) => byName.has(z.name.toLowerCase())).length,
      removed: current.filter((z) => !incoming.has(z.name.toLowerCase())).length,
    };
    if (!save || problems.length) return { problems, saved: false, summary };

    await tx.execute(
      sql`UPDATE events SET area = (SELECT geom FROM upload_geom WHERE kind = 'area') WHERE id = ${eventId}`,
    );
    for (const z of zones) {
      const existing = byName.get(z.name.toLowerCase());
      const geom = sql`(SELECT geom FROM upload_geom WHERE feature = ${z.feature})`;
      if (existing) {
        await tx.execute(
          sql`UPDATE zones SET name = ${z.name}, habitat = ${z.habitat}, description = ${z.description}, geom = ${geom} WHERE id = ${existing.id}`,
        );
      } else {
        await tx.execute(
          sql`INSERT INTO zones (event_id, name, habitat, description, geom) VALUES (${eventId}, ${z.name}, ${z.habitat}, ${z.description}, ${geom})`,
        );
      }
    }
    // Only zones without records get here (checked above, inside this transaction).
    for (const z of current)
      if (!incoming.has(z.name.toLowerCase())) await tx.execute(sql`DELETE FROM zones WHERE id = ${z.id}`);
    const moved = await reassignZones(tx, eventId);
    return { problems, saved: true, summary, moved };
  });
}

export type StoredZone = {
  id: string;
  name: string;
  habitat: string;
  description: string;
  areaHa: number;
  records: number;
  geometry: Geometry;
};

/** The event's area and zones as GeoJSON geometries, for the preview and the setup page. */
export async function areaAndZones(eventId: string): Promise<{ area: Geometry | null; zones: StoredZone[] }> {
  const db = getDb();
  const {
    rows: [event],
  } = await db.execute<{ area: Geometry | null }>(
    sql`SELECT ST_AsGeoJSON(area, 7)::json AS area FROM events WHERE id = ${eventId}`,
  );
  const { rows } = await db.execute<StoredZone>(sql`
    SELECT z.id, z.name, z.habitat, z.description, ST_AsGeoJSON(z.geom, 7)::json AS geometry,
           round((ST_Area(z.geom::geography) / 10000)::numeric, 1)::float8 AS "areaHa",
           ((SELECT count(*) FROM sightings s WHERE s.zone_id = z.id) + (SELECT count(*) FROM count_sessions c WHERE c.zone_id = z.id))::int AS records
    FROM zones z WHERE z.event_id = ${eventId} ORDER BY z.name`);
  return { area: event?.area ?? null, zones: rows };
}
