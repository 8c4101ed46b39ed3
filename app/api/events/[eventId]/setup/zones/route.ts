import { areaAndZones } from "@/db/queries/setup-zones";
import { handle } from "@/lib/http/errors";
import { parseParams, pathId } from "@/lib/http/params";
import { requireSetupReadPermit, requireSetupWritePermit } from "@/server/setup/handler";
import { geoReport, reportResponse } from "@/server/setup/upload-report";
import { checkAndSaveZones } from "@/server/setup/zones-upload";
import { MAX_GEOJSON_BYTES, zonesUploadInput } from "./schema";

type Ctx = { params: Promise<{ eventId: string }> };
export const dynamic = "force-dynamic";

export const GET = handle<Ctx>(async (request, { params }) => {
  const { eventId } = await parseParams(params, { eventId: pathId });
  await requireSetupReadPermit(request, eventId);
  return Response.json(await areaAndZones(eventId), { headers: { "Cache-Control": "no-store" } });
});

// Upload of the area and zones: checked in full (shape and PostGIS together, every problem at
// once), and saved in one transaction only when nothing is wrong. Problems come back as a
// report per feature.
export const PUT = handle<Ctx>(async (request, { params }) => {
  const { eventId } = await parseParams(params, { eventId: pathId });
  const {
    input: { geojson, save },
    locale,
  } = await requireSetupWritePermit(request, eventId, zonesUploadInput, { maxBytes: MAX_GEOJSON_BYTES });
  const result = await checkAndSaveZones(eventId, geojson, save);
  if (result.problems.length) return reportResponse(geoReport(result.problems, locale), locale, result.summary);
  return Response.json({ ok: true, saved: result.saved, summary: result.summary, moved: result.moved, report: [] });
});
