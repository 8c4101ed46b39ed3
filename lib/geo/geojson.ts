// Area-and-zones upload: the shape checks of GeoJSON (RFC 7946, IETF 2016) that can be
// made without a database. Geometry validity (self-intersection and the like) and
// "zone inside the area" are then checked by PostGIS (db/queries/setup-zones.ts).
// Pure: no database, no framework.

import { HABITATS, type Habitat } from "@/lib/domain";
import type { ArealGeometry as Geometry } from "./areal";

export const MAX_FEATURES = 200;
export const MAX_POSITIONS = 100_000;
export const MAX_ZONE_NAME = 120;

export type GeoProblemCode =
  | "notFeatureCollection"
  | "noFeatures"
  | "tooManyFeatures"
  | "tooManyPositions"
  | "crsNotWgs84"
  | "notFeature"
  | "noGeometry"
  | "wrongGeometryType"
  | "badCoordinates"
  | "badPosition"
  | "longitudeRange"
  | "latitudeRange"
  | "ringTooShort"
  | "ringNotClosed"
  | "missingName"
  | "nameTooLong"
  | "duplicateName"
  | "missingHabitat"
  | "unknownHabitat"
  | "unknownKind"
  | "noArea"
  | "twoAreas"
  | "noZones"
  // From PostGIS (db/queries/setup-zones.ts):
  | "invalidGeometry"
  | "outsideArea"
  | "overlapsZone"
  | "zoneHasRecords"
  | "unreadableGeometry";

/** One problem; `feature` is the 0-based index in `features` (null: the whole file). */
export type GeoProblem = {
  feature: number | null;
  name?: string;
  code: GeoProblemCode;
  values?: Record<string, string | number>;
};

export type ZoneInput = { feature: number; name: string; habitat: Habitat; description: string; geometry: Geometry };
export type AreaInput = { feature: number; geometry: Geometry };
export type ParsedUpload = { area: AreaInput | null; zones: ZoneInput[]; problems: GeoProblem[] };

const isObject = (v: unknown): v is Record<string, unknown> => typeof v === "object" && v !== null && !Array.isArray(v);

// RFC 7946 §4: coordinates are WGS 84 longitude, latitude; the "crs" member of 2008
// GeoJSON was removed, so only a crs naming WGS 84 / CRS84 is tolerated.
function crsIsWgs84(crs: unknown): boolean {
  const name = isObject(crs) && isObject(crs.properties) ? String(crs.properties.name ?? "") : "";
  return /CRS84$|EPSG::?4326$/i.test(name);
}

/** Checks a position (RFC 7946 §3.1.1: two or three numbers, longitude first). */
function positionProblem(p: unknown): GeoProblemCode | null {
  if (!Array.isArray(p) || p.length < 2 || p.length > 3 || !p.every((n) => typeof n === "number" && Number.isFinite(n)))
    return "badPosition";
  const [lon, lat] = p as number[];
  if (lon! < -180 || lon! > 180) return "longitudeRange";
  if (lat! < -90 || lat! > 90) return "latitudeRange";
  return null;
}

/** Problems of one Polygon's rings (RFC 7946 §3.1.6: closed, at least four positions). */
function ringsProblems(
  rings: unknown,
  count: { n: number },
): { code: GeoProblemCode; values?: Record<string, string | number> }[] {
  if (!Array.isArray(rings) || rings.length === 0) return [{ code: "badCoordinates" }];
  const out: { code: GeoProblemCode; values?: Record<string, string | number> }[] = [];
  rings.forEach((ring, r) => {
    if (!Array.isArray(ring)) {
      out.push({ code: "badCoordinates" });
      return;
    }
    count.n += ring.length;
    for (let i = 0; i < ring.length; i++) {
      const problem = positionProblem(ring[i]);
      if (problem) {
        const p = ring[i] as number[];
        out.push({
          code: problem,
          values: { ring: r + 1, position: i + 1, value: Array.isArray(p) ? p.slice(0, 3).join(", ") : String(p) },
        });
        return;
      }
    }
    if (ring.length < 4) out.push({ code: "ringTooShort", values: { ring: r + 1, found: ring.length } });
    else {
      const a = ring[0] as number[];
      const b = ring[ring.length - 1] as number[];
      if (a[0] !== b[0] || a[1] !== b[1]) out.push({ code: "ringNotClosed", values: { ring: r + 1 } });
    }
  });
  return out;
}

/**
 * Reads an uploaded FeatureCollection: one feature with `"kind": "area"` (the event
 * area) and zone features with `name`, `habitat` and an optional `description` in their
 * properties. Returns what could be read and every problem, per feature.
 */
export function parseAreaAndZones(input: unknown): ParsedUpload {
  const problems: GeoProblem[] = [];
  if (!isObject(input) || input.type !== "FeatureCollection" || !Array.isArray(input.features)) {
    return { area: null, zones: [], problems: [{ feature: null, code: "notFeatureCollection" }] };
  }
  if (input.crs !== undefined && !crsIsWgs84(input.crs)) problems.push({ feature: null, code: "crsNotWgs84" });
  const features = input.features as unknown[];
  if (features.length === 0)
    return { area: null, zones: [], problems: [...problems, { feature: null, code: "noFeatures" }] };
  if (features.length > MAX_FEATURES)
    return {
      area: null,
      zones: [],
      problems: [...problems, { feature: null, code: "tooManyFeatures", values: { maximum: MAX_FEATURES } }],
    };

  let area: AreaInput | null = null;
  const zones: ZoneInput[] = [];
  const names = new Map<string, number>();
  const count = { n: 0 };
  features.forEach((f, i) => {
    const at = (code: GeoProblemCode, values?: Record<string, string | number>, name?: string) =>
      problems.push({ feature: i, code, values, name });
    if (!isObject(f) || f.type !== "Feature") return at("notFeature");
    const props = isObject(f.properties) ? f.properties : {};
    const kind = props.kind === undefined ? "zone" : String(props.kind).trim().toLowerCase();
    const label = typeof props.name === "string" ? props.name.trim().replace(/\s+/g, " ") : "";
    const geometry = f.geometry;
    let geomOk = true;
    if (!isObject(geometry)) {
      at("noGeometry", undefined, label || undefined);
      geomOk = false;
    } else if (geometry.type !== "Polygon" && geometry.type !== "MultiPolygon") {
      at("wrongGeometryType", { found: String(geometry.type) }, label || undefined);
      geomOk = false;
    } else {
      const polys =
        geometry.type === "Polygon"
          ? [geometry.coordinates]
          : Array.isArray(geometry.coordinates) && geometry.coordinates.length
            ? geometry.coordinates
            : [null];
      for (const rings of polys) {
        for (const p of ringsProblems(rings, count)) {
          at(p.code, p.values, label || undefined);
          geomOk = false;
        }
      }
    }
    if (kind === "area") {
      if (area) at("twoAreas", { first: area.feature + 1 });
      else if (geomOk) area = { feature: i, geometry: geometry as Geometry };
      else area = { feature: i, geometry: null as never }; // counted, so later areas are reported
      return;
    }
    if (kind !== "zone") return at("unknownKind", { value: kind });
    if (!label) at("missingName");
    else if (label.length > MAX_ZONE_NAME) at("nameTooLong", { maximum: MAX_ZONE_NAME }, label.slice(0, 40));
    else {
      const first = names.get(label.toLowerCase());
      if (first !== undefined) at("duplicateName", { first: first + 1 }, label);
      else names.set(label.toLowerCase(), i);
    }
    const habitatRaw =
      typeof props.habitat === "string"
        ? props.habitat
            .trim()
            .toLowerCase()
            .replace(/[\s-]+/g, "_")
        : "";
    if (!habitatRaw) at("missingHabitat", undefined, label || undefined);
    else if (!(HABITATS as readonly string[]).includes(habitatRaw))
      at("unknownHabitat", { value: String(props.habitat), allowed: HABITATS.join(", ") }, label || undefined);
    const description = typeof props.description === "string" ? props.description.trim().slice(0, 1000) : "";
    if (geomOk && label && label.length <= MAX_ZONE_NAME && (HABITATS as readonly string[]).includes(habitatRaw)) {
      zones.push({
        feature: i,
        name: label,
        habitat: habitatRaw as Habitat,
        description,
        geometry: geometry as Geometry,
      });
    }
  });
  if (count.n > MAX_POSITIONS)
    problems.push({ feature: null, code: "tooManyPositions", values: { maximum: MAX_POSITIONS } });
  if (!area) problems.push({ feature: null, code: "noArea" });
  if (!features.some((f) => isObject(f) && (!isObject(f.properties) || (f.properties.kind ?? "zone") === "zone")))
    problems.push({ feature: null, code: "noZones" });
  const a = area as AreaInput | null;
  return { area: a && a.geometry ? a : null, zones, problems };
}
