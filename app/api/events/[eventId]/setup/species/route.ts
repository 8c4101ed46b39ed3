import { importSpecies, listEventSpecies } from "@/db/queries/setup-species";
import { handle } from "@/lib/http/errors";
import { parseParams, pathId } from "@/lib/http/params";
import { translator } from "@/lib/i18n/translator";
import { parseSpeciesCsv } from "@/lib/species/csv";
import { requireSetupReadPermit, requireSetupWritePermit } from "@/server/setup/handler";
import { csvReport, reportResponse } from "@/server/setup/upload-report";
import { MAX_CSV_CHARS, speciesUploadInput } from "./schema";

type Ctx = { params: Promise<{ eventId: string }> };
export const dynamic = "force-dynamic";

export const GET = handle<Ctx>(async (request, { params }) => {
  const { eventId } = await parseParams(params, { eventId: pathId });
  await requireSetupReadPermit(request, eventId);
  return Response.json({ species: await listEventSpecies(eventId) }, { headers: { "Cache-Control": "no-store" } });
});

// Species-list CSV: every line checked (file, then against the shared taxa) before
// anything is stored; then merged into the event's list in one transaction.
export const PUT = handle<Ctx>(async (request, { params }) => {
  const { eventId } = await parseParams(params, { eventId: pathId });
  const {
    input: { csv, save },
    locale,
  } = await requireSetupWritePermit(request, eventId, speciesUploadInput, { maxBytes: MAX_CSV_CHARS * 2 });
  const parsed = parseSpeciesCsv(csv);
  if (parsed.problems.length) return reportResponse(csvReport(parsed.problems, locale), locale);
  const result = await importSpecies(eventId, parsed.rows, save);
  if (result.problems.length) return reportResponse(csvReport(result.problems, locale), locale, result.summary);
  const t = translator(locale, "Setup");
  const notices = result.notices
    .filter((n) => n.code !== "newTaxon" && n.code !== "alreadyListed")
    .map((n) => ({ line: n.line, code: n.code, message: t(`speciesNotices.${n.code}`, (n.values ?? {}) as never) }));
  return Response.json({ ok: true, saved: result.saved, summary: result.summary, notices, report: [] });
});
