import { areaAndZones, uploadAreaAndZones } from "@/db/queries/setup-zones";
import { parseAreaAndZones } from "@/lib/geo/geojson";
import { handle } from "@/lib/http/errors";
import { parseParams, pathId } from "@/lib/http/params";
import { requireSetupReadPermit, requireSetupWritePermit } from "@/server/setup/handler";
import { geoReport, reportResponse } from "@/server/setup/upload-report";
import { MAX_GEOJSON_BYTES, zonesUploadInput } from "./schema";

type Ctx = { params: Promise<{ eventId: string }> };
export const dynamic = "force-dynamic";

export const GET = handle<Ctx>(async (request, { params }) => {
  const { eventId } = await parseParams(params, { eventId: pathId });
  await requireSetupReadPermit(request, eventId);
  return Response.json(await areaAndZones(eventId), { headers: { "Cache-Control": "no-store" } });
});

// Upload of the area and zones: checked in full (shape, then PostGIS), and saved in one
// transaction only when nothing is wrong. Problems come back as a report per feature.
export const PUT = handle<Ctx>(async (request, { params }) => {
  const { eventId } = await parseParams(params, { eventId: pathId });
  const {
    input: { geojson, save },
    locale,
  } = await requireSetupWritePermit(request, eventId, zonesUploadInput, { maxBytes: MAX_GEOJSON_BYTES });
  const parsed = parseAreaAndZones(geojson);
  if (parsed.problems.length || !parsed.area) return reportResponse(geoReport(parsed.problems, locale), locale);
  const result = await uploadAreaAndZones(eventId, parsed.area, parsed.zones, save);
  if (result.problems.length) return reportResponse(geoReport(result.problems, locale), locale, result.summary);
  return Response.json({ ok: true, saved: result.saved, summary: result.summary, moved: result.moved, report: [] });
});
