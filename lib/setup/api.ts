import "server-only";
import { z } from "zod";
import type { GeoProblem } from "@/lib/geo/geojson";
import { ApiError, apiTranslator, requestLocale, zodFieldProblems, type FieldProblem } from "@/lib/http/errors";
import type { Locale } from "@/lib/i18n/routing";
import { catalogues, translator } from "@/lib/i18n/translator";
import type { CsvProblem } from "@/lib/species/csv";
import { zonedLocalToUtc } from "@/lib/time/zoned";

// Server-side helpers of the event-setup handlers: body parsing whose messages match the
// form's (the shared zod schemas carry keys under "Setup.errors"), and the translated
// validation reports of uploads.

type ErrorKey = keyof (typeof catalogues)["en"]["Setup"]["errors"];
const isErrorKey = (m: string): m is ErrorKey => m in catalogues.en.Setup.errors;

export function setupFieldProblems(error: z.ZodError, locale: Locale): FieldProblem[] {
  const t = translator(locale, "Setup");
  return error.issues.map((issue) => isErrorKey(issue.message)
    ? { field: issue.path.map(String).join(".") || "(body)", message: t(`errors.${issue.message}`) }
    : zodFieldProblems(new z.ZodError([issue]), locale)[0]!);
}

/** Reads a JSON body with a shared schema; 400 naming each wrong field, in the caller's language. */
export async function parseSetupBody<T extends z.ZodType>(request: Request, schema: T, maxBytes = 1_000_000): Promise<z.infer<T>> {
  const locale = requestLocale(request);
  const text = await request.text();
  const tApi = apiTranslator(locale);
  if (text.length > maxBytes) throw new ApiError("bad_request", [{ field: "(body)", message: tApi("field.tooLarge", { maximum: maxBytes }) }]);
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch {
    throw new ApiError("bad_request", [{ field: "(body)", message: tApi("field.notJson") }]);
  }
  const parsed = schema.safeParse(data);
  if (!parsed.success) throw new ApiError("bad_request", setupFieldProblems(parsed.error, locale));
  return parsed.data;
}

/** The event's wall-clock dates as instants in its time zone. */
export function eventInstants(v: { startsLocal: string; endsLocal: string; timeZone: string }) {
  return { startsAt: zonedLocalToUtc(v.startsLocal, v.timeZone), endsAt: zonedLocalToUtc(v.endsLocal, v.timeZone) };
}

export type ReportLine = { feature: number | null; line?: number; name?: string; field: string; code: string; message: string };

export function geoReport(problems: GeoProblem[], locale: Locale): ReportLine[] {
  const t = translator(locale, "Setup");
  return problems.map((p) => ({
    feature: p.feature,
    name: p.name,
    code: p.code,
    field: p.feature === null ? (p.name ? `zone "${p.name}"` : "(file)") : `features[${p.feature}]`,
    message: t(`geoProblems.${p.code}`, { ...(p.values ?? {}), name: p.name ?? "" } as never),
  }));
}

export function csvReport(problems: CsvProblem[], locale: Locale): ReportLine[] {
  const t = translator(locale, "Setup");
  return problems.map((p) => ({
    feature: null,
    line: p.line,
    code: p.code,
    field: p.column ? `line ${p.line}: ${p.column}` : `line ${p.line}`,
    message: t(`csvProblems.${p.code}`, { ...(p.values ?? {}), column: p.column ?? "", line: p.line } as never),
  }));
}

/** A 422 whose `fields` are the report's lines, plus the report itself for the page. */
export function reportResponse(report: ReportLine[], locale: Locale, extra: Record<string, unknown> = {}): Response {
  const t = apiTranslator(locale);
  return Response.json(
    { error: { code: "unprocessable", message: t("code.unprocessable"), fields: report.map((r) => ({ field: r.field, message: r.message })) }, report, ...extra },
    { status: 422, headers: { "Cache-Control": "no-store" } },
  );
}
