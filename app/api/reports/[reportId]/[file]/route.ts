import { z } from "zod";
import {
  getReportById,
  publicResultsOf,
  reportDwcContext,
  reportEventNames,
  reportOccurrences,
} from "@/db/queries/reports";
import { ApiError, handle, requestLocale } from "@/lib/http/errors";
import { FILE_CACHE, REPORT_FILES } from "./schema";
import { parseParams, pathId } from "@/lib/http/params";
import { occurrencesGeoJson, publicOccurrences, speciesCsv } from "@/lib/results/exports";
import { eventCoreArchive } from "@/lib/results/dwc";

// Public by design: a published report and its downloads are for anyone (design.md,
// "Public report"). Sensitive taxa are generalised or withheld in lib/results/exports.ts.
export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ reportId: string; file: string }> };

export const GET = handle(async (request, { params }: Ctx) => {
  const { reportId, file } = await parseParams(params, { reportId: pathId, file: z.enum(REPORT_FILES) });
  const report = await getReportById(reportId, { withInputs: file !== "species.csv" });
  if (!report) throw new ApiError("not_found");
  const locale = requestLocale(request);
  const event = await reportEventNames(report.eventId);
  if (!event) throw new ApiError("not_found");
  const base = `${event.slug}-v${report.version}`;
  // A published version's numbers never change, but its event may go back to draft or a taxon's
  // sensitivity may be raised: shared caches keep a file five minutes at most, then ask again.
  const headers = (type: string, name: string) => ({
    "Content-Type": type,
    "Content-Disposition": `attachment; filename="${base}-${name}"`,
    "Cache-Control": FILE_CACHE,
  });
  if (file === "species.csv")
    return new Response(speciesCsv(await publicResultsOf(report.eventId, report.results), locale), {
      headers: headers("text/csv; charset=utf-8", "species.csv"),
    });
  const { rows, withheld } = publicOccurrences(report.results, await reportOccurrences(report), locale);
  if (file === "sightings.geojson")
    return new Response(occurrencesGeoJson(rows), { headers: headers("application/geo+json", "sightings.geojson") });
  // An Event core with an Occurrence extension (lib/results/dwc.ts), as a records centre takes it.
  const zip = eventCoreArchive(rows, {
    reportId: report.id,
    eventId: report.eventId,
    eventName: event.name,
    organisation: event.organisation,
    version: report.version,
    publishedAt: report.publishedAt,
    startsAt: event.startsAt,
    endsAt: event.endsAt,
    timeZone: event.timeZone,
    license: event.dataLicense,
    isDemo: event.isDemo,
    publishAbsences: event.publishAbsences,
    withheld,
    withdrawal: report.withdrawal,
    ...(await reportDwcContext(report.eventId, report, locale)),
  });
  return new Response(Buffer.from(zip), { headers: headers("application/zip", "darwin-core-archive.zip") });
});
