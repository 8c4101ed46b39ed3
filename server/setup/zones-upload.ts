import "server-only";
import { uploadAreaAndZones, type ZonesUploadResult } from "@/db/queries/setup-zones";
import { parseAreaAndZones } from "@/lib/geo/geojson";

/**
 * An uploaded area-and-zones file checked in full and saved only when nothing is wrong: the
 * shape checks (lib/geo/geojson.ts) and, on every feature whose shape could be read, the
 * PostGIS checks, so one upload names every problem at once (issue 16). Without a readable
 * area the PostGIS checks cannot run (zones are checked against it), and only the shape
 * problems come back.
 */
export async function checkAndSaveZones(
  eventId: string,
  geojson: unknown,
  save: boolean,
): Promise<Omit<ZonesUploadResult, "summary"> & { summary?: ZonesUploadResult["summary"] }> {
  const parsed = parseAreaAndZones(geojson);
  if (!parsed.area) return { problems: parsed.problems, saved: false };
  const result = await uploadAreaAndZones(eventId, parsed.area, parsed.zones, save && parsed.problems.length === 0);
  if (!parsed.problems.length) return result;
  const problems = [...parsed.problems, ...result.problems].sort(
    (a, b) => (a.feature ?? Number.MAX_SAFE_INTEGER) - (b.feature ?? Number.MAX_SAFE_INTEGER),
  );
  return { ...result, problems, saved: false };
}
