"use client";

import { useTranslations } from "next-intl";
import type { ReportLine } from "@/server/setup/upload-report";

// The validation report of an upload: one row per problem, naming the feature or line.
export function ReportTable({ report, kind }: { report: ReportLine[]; kind: "geojson" | "csv" }) {
  const t = useTranslations("Setup.report");
  return (
    <div role="alert" className="space-y-2 rounded-lg border-2 border-signal bg-signal-soft p-3">
      <p className="font-bold">✕ {t("title", { count: report.length })}</p>
      <p>{t("nothingSaved")}</p>
      <table className="w-full text-start text-sm">
        <caption className="sr-only">{t("caption")}</caption>
        <thead>
          <tr className="border-b border-signal/40">
            <th scope="col" className="py-1 pe-3">
              {kind === "csv" ? t("line") : t("feature")}
            </th>
            {kind === "geojson" ? (
              <th scope="col" className="py-1 pe-3">
                {t("zone")}
              </th>
            ) : null}
            <th scope="col" className="py-1">
              {t("problem")}
            </th>
          </tr>
        </thead>
        <tbody>
          {report.map((r, i) => (
            <tr key={i} className="border-b border-signal/20 align-top">
              <td className="py-1 pe-3 tabular-nums">
                {kind === "csv" ? r.line : r.feature === null ? t("wholeFile") : r.feature + 1}
              </td>
              {kind === "geojson" ? <td className="py-1 pe-3">{r.name ?? ""}</td> : null}
              <td className="py-1">{r.message}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
