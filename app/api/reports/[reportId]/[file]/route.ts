import { z } from "zod";
import { getReportById, reportEventNames, reportOccurrences } from "@/db/queries/reports";
import { ApiError, handle, requestLocale } from "@/lib/http/errors";
import { parseParams, pathId } from "@/lib/http/params";
import { darwinCoreArchive, occurrencesGeoJson, publicOccurrences, speciesCsv } from "@/lib/results/exports";

// Public by design: a published report and its downloads are for anyone (design.md,
// "Public report"). Sensitive taxa are generalised or withheld in lib/results/exports.ts.
export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ reportId: string; file: string }> };

const FILES = ["species.csv", "darwin-core-archive.zip", "sightings.geojson"] as const;

export const GET = handle(async (request, { params }: Ctx) => {
  const { reportId, file } = await parseParams(params, { reportId: pathId, file: z.enum(FILES) });
  const report = await getReportById(reportId, { withInputs: file !== "species.csv" });
  if (!report) throw new ApiError("not_found");
  const locale = requestLocale(request);
  const event = await reportEventNames(report.eventId);
  if (!event) throw new ApiError("not_found");
  const base = `${event.slug}-v${report.version}`;
  // A published version never changes, so its files may be cached for as long as anyone likes.
  const headers = (type: string, name: string) => ({
    "Content-Type": type,
    "Content-Disposition": `attachment; filename="${base}-${name}"`,
    "Cache-Control": "public, max-age=31536000, immutable",
  });
  if (file === "species.csv")
    return new Response(speciesCsv(report.results, locale), {
      headers: headers("text/csv; charset=utf-8", "species.csv"),
    });
  const { rows, withheld } = publicOccurrences(report.results, await reportOccurrences(report), locale);
  if (file === "sightings.geojson")
    return new Response(occurrencesGeoJson(rows), { headers: headers("application/geo+json", "sightings.geojson") });
  const zip = darwinCoreArchive(rows, {
    id: report.id,
    title: event.name,
    organisation: event.organisation,
    version: report.version,
    publishedAt: report.publishedAt,
    withheld,
    abstract: `Approved sightings of ${event.name}, published as report version ${report.version}.`,
  });
  return new Response(Buffer.from(zip), { headers: headers("application/zip", "darwin-core-archive.zip") });
});
