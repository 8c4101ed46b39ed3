import { areaAndZones, uploadAreaAndZones } from "@/db/queries/setup-zones";
import { requireEventRole } from "@/server/auth/guard";
import { parseAreaAndZones } from "@/lib/geo/geojson";
import { handle, parseQuery, requestLocale } from "@/lib/http/errors";
import { limitWrites } from "@/lib/http/write-limit";
import { geoReport, parseSetupBody, reportResponse } from "@/lib/setup/api";
import { setupQuery } from "../schema";
import { MAX_GEOJSON_BYTES, zonesUploadInput } from "./schema";

type Ctx = { params: Promise<{ eventId: string }> };
export const dynamic = "force-dynamic";

export const GET = handle<Ctx>(async (request, { params }) => {
  const { eventId } = await params;
  await requireEventRole(eventId, "organiser");
  parseQuery(request, setupQuery);
  return Response.json(await areaAndZones(eventId), { headers: { "Cache-Control": "no-store" } });
});

// Upload of the area and zones: checked in full (shape, then PostGIS), and saved in one
// transaction only when nothing is wrong. Problems come back as a report per feature.
export const PUT = handle<Ctx>(async (request, { params }) => {
  const { eventId } = await params;
  const { user } = await requireEventRole(eventId, "organiser");
  limitWrites(`setup:${user.id}`);
  const locale = requestLocale(request);
  const { geojson, save } = await parseSetupBody(request, zonesUploadInput, MAX_GEOJSON_BYTES);
  const parsed = parseAreaAndZones(geojson);
  if (parsed.problems.length || !parsed.area) return reportResponse(geoReport(parsed.problems, locale), locale, { saved: false });
  const result = await uploadAreaAndZones(eventId, parsed.area, parsed.zones, save);
  if (result.problems.length) return reportResponse(geoReport(result.problems, locale), locale, { saved: false, summary: result.summary });
  return Response.json({ ok: true, saved: result.saved, summary: result.summary, moved: result.moved, report: [] });
});
