import { publishedReport } from "@/db/queries/api-tokens";
import { publicResultsOf } from "@/db/queries/reports";
import type { Results } from "@/lib/results/compute";
import { ApiError, handle } from "@/lib/http/errors";
import { parseParams } from "@/lib/http/params";
import { requireApiToken } from "@/server/auth/guard";
import { readOnly } from "../../../../read-only";
import { reportParams, type ReportResponse } from "./schema";

export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ eventId: string; version: string }> };

/** One published report: its frozen results, method notes and changes, and its public downloads. */
export const GET = handle(async (request, { params }: Ctx) => {
  const { eventId, version } = await parseParams(params, reportParams.shape);
  await requireApiToken(request, { eventId });
  const report = await publishedReport(eventId, version);
  if (!report) throw new ApiError("not_found");
  const files = `/api/reports/${report.id}`;
  const body: ReportResponse = {
    id: report.id,
    version: report.version,
    publishedAt: report.publishedAt.toISOString(),
    superseded: report.version < report.latestVersion,
    withdrawal: report.withdrawnAt
      ? { withdrawnAt: report.withdrawnAt.toISOString(), reason: report.withdrawReason ?? "" }
      : null,
    engineVersion: report.engineVersion,
    inputHash: report.inputHash,
    // As public as the report page: no sensitive taxon by zone (lib/results/public.ts).
    results: (await publicResultsOf(eventId, report.results as Results)) as ReportResponse["results"],
    methodNotes: report.methodNotes,
    changes: report.changes,
    downloads: {
      speciesCsv: `${files}/species.csv`,
      darwinCoreArchive: `${files}/darwin-core-archive.zip`,
      geojson: `${files}/sightings.geojson`,
    },
  };
  // A published version never changes, but a token may be revoked: not cached by anyone.
  return Response.json(body, { headers: { "Cache-Control": "no-store" } });
});

export { readOnly as POST, readOnly as PUT, readOnly as PATCH, readOnly as DELETE };
