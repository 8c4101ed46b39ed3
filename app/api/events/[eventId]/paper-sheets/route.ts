import { importPaperSheet, paperSheetChoices } from "@/db/queries/paper-sheets";
import { parseJson } from "@/lib/http/body";
import { ApiError, handle, parseQuery, requestLocale } from "@/lib/http/errors";
import { parseParams, pathId } from "@/lib/http/params";
import { limitWrites } from "@/lib/http/write-limit";
import { translator } from "@/lib/i18n/translator";
import { parseSheetCsv, sheetTemplate } from "@/lib/paper/sheet";
import { requireEventRole } from "@/server/auth/guard";
import { reportResponse, sheetReport } from "@/server/setup/upload-report";
import { MAX_SHEET_CHARS, paperSheetInput, paperSheetQuery } from "./schema";

type Ctx = { params: Promise<{ eventId: string }> };
export const dynamic = "force-dynamic";

// The paper sheet template: a CSV with the column names, preceded by notes ("#" lines)
// listing the event's zones, species list and session kinds (coordinators, organisers).
export const GET = handle<Ctx>(async (request, { params }) => {
  const { eventId } = await parseParams(params, { eventId: pathId });
  await requireEventRole(eventId, "coordinator");
  const query = parseQuery(request, paperSheetQuery);
  const locale = query.locale ?? requestLocale(request);
  const choices = await paperSheetChoices(eventId, locale);
  if (!choices) throw new ApiError("not_found");
  const t = translator(locale, "PaperSheets");
  const csv = sheetTemplate({
    ...choices,
    notes: {
      intro: t("template.intro"),
      lines: t("template.lines"),
      times: t("template.times"),
      kinds: t("template.kinds"),
      zones: t("template.zones"),
      taxa: t("template.taxa"),
    },
  });
  return new Response(csv, {
    headers: {
      "Content-Type": "text/csv; charset=utf-8",
      "Content-Disposition": `attachment; filename="paper-sheet-template.csv"`,
      "Cache-Control": "no-store",
    },
  });
});

// A transcribed sheet: every line checked (file, then against the event) before anything
// is stored; then stored in one transaction, every record pending and marked "paper sheet".
export const PUT = handle<Ctx>(async (request, { params }) => {
  const { eventId } = await parseParams(params, { eventId: pathId });
  const permit = await requireEventRole(eventId, "coordinator");
  limitWrites(`paper:${permit.user.id}`, 30, 60_000);
  const locale = requestLocale(request);
  const { csv, save } = await parseJson(request, paperSheetInput, { maxBytes: MAX_SHEET_CHARS * 2 });
  const parsed = parseSheetCsv(csv);
  if (parsed.problems.length) return reportResponse(sheetReport(parsed.problems, locale), locale);
  const result = await importPaperSheet(eventId, permit.user.id, parsed, save);
  if (result.problems.length) return reportResponse(sheetReport(result.problems, locale), locale, result.summary);
  return Response.json(
    { ok: true, saved: result.saved, summary: result.summary, report: [] },
    { headers: { "Cache-Control": "no-store" } },
  );
});
