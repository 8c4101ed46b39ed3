import "server-only";
import type { GeoProblem } from "@/lib/geo/geojson";
import { apiTranslator, type ApiErrorBody } from "@/lib/http/errors";
import type { Locale } from "@/lib/i18n/routing";
import { translator } from "@/lib/i18n/translator";
import type { SheetProblem } from "@/lib/paper/sheet";
import type { CsvProblem } from "@/lib/species/csv";

// The validation report of a setup upload (area and zones, species list): one translated
// line per problem, naming the feature or the line of the file.

export type ReportLine = {
  feature: number | null;
  line?: number;
  name?: string;
  field: string;
  code: string;
  message: string;
};

/** What a refused upload answers (422): the usual error body, plus the report for the page. */
export type UploadReport<S> = ApiErrorBody & { report: ReportLine[]; saved: false; summary?: S };

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

/** A paper sheet's problems (lib/paper/sheet.ts, db/queries/paper-sheets.ts), one line each. */
export function sheetReport(problems: SheetProblem[], locale: Locale): ReportLine[] {
  const t = translator(locale, "PaperSheets");
  return problems.map((p) => ({
    feature: null,
    line: p.line,
    code: p.code,
    field: p.column ? `line ${p.line}: ${p.column}` : `line ${p.line}`,
    message: t(`problems.${p.code}`, { ...(p.values ?? {}), column: p.column ?? "", line: p.line } as never),
  }));
}

/** A 422 whose `fields` are the report's lines, plus the report itself for the page. */
export function reportResponse<S>(report: ReportLine[], locale: Locale, summary?: S): Response {
  const t = apiTranslator(locale);
  const body: UploadReport<S> = {
    error: {
      code: "unprocessable",
      message: t("code.unprocessable"),
      fields: report.map((r) => ({ field: r.field, message: r.message })),
    },
    report,
    saved: false,
    ...(summary === undefined ? {} : { summary }),
  };
  return Response.json(body, { status: 422, headers: { "Cache-Control": "no-store" } });
}
