import booleanPointInPolygon from "@turf/boolean-point-in-polygon";
import type { ZoneCollection, ZoneFeature } from "./types";

// The zone a point falls in, found on the device (the server confirms with PostGIS).
// GeoJSON positions are [longitude, latitude] (RFC 7946, section 3.1.1).
export function zoneAt(
  zones: ZoneCollection | null | undefined,
  latitude: number,
  longitude: number,
): ZoneFeature | null {
  if (!zones) return null;
  for (const f of zones.features) {
    if (booleanPointInPolygon([longitude, latitude], f.geometry)) return f;
  }
  return null;
}

const EARTH_RADIUS_M = 6_371_008.8; // mean Earth radius (IUGG), from memory

/** Great-circle distance in metres (haversine formula). */
export function distanceM(
  a: { latitude: number; longitude: number },
  b: { latitude: number; longitude: number },
): number {
  const rad = Math.PI / 180;
  const dLat = (b.latitude - a.latitude) * rad;
  const dLon = (b.longitude - a.longitude) * rad;
  const h = Math.sin(dLat / 2) ** 2 + Math.cos(a.latitude * rad) * Math.cos(b.latitude * rad) * Math.sin(dLon / 2) ** 2;
  return 2 * EARTH_RADIUS_M * Math.asin(Math.min(1, Math.sqrt(h)));
}

export type Fix = { latitude: number; longitude: number; accuracyM: number };

/**
 * The length of a walk from position fixes. A step shorter than the two fixes' combined
 * accuracy is taken as jitter, not movement (common practice), and a fix worse than
 * `maxAccuracyM` is ignored.
 */
export function walkDistanceM(fixes: Fix[], maxAccuracyM = 50): number {
  let total = 0;
  let last: Fix | undefined;
  for (const fix of fixes) {
    if (fix.accuracyM > maxAccuracyM) continue;
    if (!last) {
      last = fix;
      continue;
    }
    const step = distanceM(last, fix);
    if (step > Math.max(last.accuracyM, fix.accuracyM)) {
      total += step;
      last = fix;
    }
  }
  return total;
}
