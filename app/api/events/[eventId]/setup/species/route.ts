import { importSpecies, listEventSpecies } from "@/db/queries/setup-species";
import { requireEventRole } from "@/server/auth/guard";
import { handle, parseQuery, requestLocale } from "@/lib/http/errors";
import { limitWrites } from "@/lib/http/write-limit";
import { translator } from "@/lib/i18n/translator";
import { csvReport, parseSetupBody, reportResponse } from "@/lib/setup/api";
import { parseSpeciesCsv } from "@/lib/species/csv";
import { setupQuery } from "../schema";
import { MAX_CSV_CHARS, speciesUploadInput } from "./schema";

type Ctx = { params: Promise<{ eventId: string }> };
export const dynamic = "force-dynamic";

export const GET = handle<Ctx>(async (request, { params }) => {
  const { eventId } = await params;
  await requireEventRole(eventId, "organiser");
  parseQuery(request, setupQuery);
  return Response.json({ species: await listEventSpecies(eventId) }, { headers: { "Cache-Control": "no-store" } });
});

// Species-list CSV: every line checked (file, then against the shared taxa) before
// anything is stored; then merged into the event's list in one transaction.
export const PUT = handle<Ctx>(async (request, { params }) => {
  const { eventId } = await params;
  const { user } = await requireEventRole(eventId, "organiser");
  limitWrites(`setup:${user.id}`);
  const locale = requestLocale(request);
  const { csv, save } = await parseSetupBody(request, speciesUploadInput, MAX_CSV_CHARS * 2);
  const parsed = parseSpeciesCsv(csv);
  if (parsed.problems.length) return reportResponse(csvReport(parsed.problems, locale), locale, { saved: false });
  const result = await importSpecies(eventId, parsed.rows, save);
  if (result.problems.length) return reportResponse(csvReport(result.problems, locale), locale, { saved: false, summary: result.summary });
  const t = translator(locale, "Setup");
  const notices = result.notices
    .filter((n) => n.code !== "newTaxon" && n.code !== "alreadyListed")
    .map((n) => ({ line: n.line, code: n.code, message: t(`speciesNotices.${n.code}`, (n.values ?? {}) as never) }));
  return Response.json({ ok: true, saved: result.saved, summary: result.summary, notices, report: [] });
});
