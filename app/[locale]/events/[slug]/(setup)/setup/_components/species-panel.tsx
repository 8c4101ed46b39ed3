"use client";

import { useTranslations } from "next-intl";
import { useState } from "react";
import useSWR from "swr";
import { buttonClass } from "@/components/ui/field";
import { fetcher, send } from "@/lib/http/client";
import { ReportTable, type ReportLine } from "./report-table";
import type { taxa } from "@/db/schema";
import { TAXON_GROUPS, TAXON_RANKS } from "@/lib/domain";

type Species = Pick<typeof taxa.$inferSelect, "id" | "scientificName" | "rank" | "taxonGroup" | "sensitivity"> & { names: Record<string, string> };
type Summary = { rows: number; newTaxa: number; addedToList: number; alreadyListed: number; namesAdded: number; namesKept: number };
type Answer = { saved?: boolean; summary?: Summary; report?: ReportLine[]; notices?: { line: number; message: string }[] };

export function SpeciesPanel({ eventId, locale }: { eventId: string; locale: string }) {
  const t = useTranslations("Setup.species");
  const tGroup = useTranslations("TaxonGroup");
  const url = `/api/events/${eventId}/setup/species`;
  const { data, mutate } = useSWR<{ species: Species[] }>(url, fetcher);
  const [file, setFile] = useState<{ name: string; text: string } | null>(null);
  const [answer, setAnswer] = useState<Answer | null>(null);
  const [busy, setBusy] = useState(false);
  const [done, setDone] = useState<Summary | null>(null);
  const failed = (message?: string): Answer => ({ report: [{ feature: null, line: 1, field: "(file)", code: "error", message: message ?? t("failed") }] });

  async function check(name: string, text: string) {
    setDone(null);
    setAnswer(null);
    setFile({ name, text });
    setBusy(true);
    const res = await send<Answer>(url, "PUT", { csv: text, save: false });
    setBusy(false);
    setAnswer(res.ok || res.status === 422 ? res.body : failed(res.body.error?.fields?.[0]?.message ?? res.body.error?.message));
  }

  async function save() {
    if (!file) return;
    setBusy(true);
    const res = await send<Answer>(url, "PUT", { csv: file.text, save: true });
    setBusy(false);
    if (res.ok && res.body.saved) {
      setDone(res.body.summary ?? null);
      setFile(null);
      setAnswer(null);
      await mutate();
    } else setAnswer(res.status === 422 ? res.body : failed(res.body.error?.message));
  }

  const report = answer?.report ?? [];
  return (
    <div className="space-y-6">
      <section aria-labelledby="species-upload-title" className="space-y-3 rounded-xl border border-reed-200 bg-white/70 p-4">
        <h2 id="species-upload-title" className="text-2xl font-bold text-reed-900">{t("uploadTitle")}</h2>
        <p className="max-w-prose">{t("uploadIntro")}</p>
        <details className="max-w-prose text-sm">
          <summary className="cursor-pointer font-semibold">{t("formatTitle")}</summary>
          <ul className="ml-5 list-disc space-y-1 pt-2">
            <li>{t("formatColumns")}</li>
            <li>{t("formatGroups", { list: TAXON_GROUPS.join(", ") })}</li>
            <li>{t("formatRanks", { list: TAXON_RANKS.join(", ") })}</li>
            <li>{t("formatSensitivity")}</li>
          </ul>
        </details>
        <p className="max-w-prose rounded-lg border-l-4 border-heath-500 bg-heath-50 p-3 text-sm">{t("sharedNote")}</p>
        <label className="block font-semibold" htmlFor="species-file">{t("fileLabel")}</label>
        <input id="species-file" type="file" accept=".csv,text/csv" className="block min-h-touch"
          onChange={async (e) => { const f = e.target.files?.[0]; if (f) await check(f.name, await f.text()); e.target.value = ""; }} />
        {busy ? <p role="status">{t("checking")}</p> : null}
        {report.length ? <ReportTable report={report} kind="csv" /> : null}
        {answer && !report.length && answer.summary ? (
          <div role="status" className="space-y-2 rounded-lg border-2 border-reed-600 bg-reed-50 p-3">
            <p className="font-semibold">✓ {t("checkedOk", { name: file?.name ?? "", ...answer.summary })}</p>
            {answer.notices?.length ? (
              <ul className="ml-5 list-disc text-sm">
                {answer.notices.map((n, i) => <li key={i}>{t("noticeLine", { line: n.line, message: n.message })}</li>)}
              </ul>
            ) : null}
            <button type="button" className={buttonClass} onClick={save} disabled={busy}>{t("save")}</button>
          </div>
        ) : null}
        {done ? <p role="status" className="font-semibold text-reed-700">✓ {t("saved", { ...done })}</p> : null}
      </section>

      <section aria-labelledby="species-current-title" className="space-y-3">
        <h2 id="species-current-title" className="text-2xl font-bold text-reed-900">{t("currentTitle", { count: data?.species.length ?? 0 })}</h2>
        {!data ? <p role="status">{t("loading")}</p> : data.species.length === 0 ? <p>{t("none")}</p> : (
          <table className="w-full text-left text-sm">
            <caption className="sr-only">{t("currentCaption")}</caption>
            <thead><tr className="border-b border-reed-300"><th scope="col">{t("colScientific")}</th><th scope="col">{t("colCommon")}</th><th scope="col">{t("colGroup")}</th><th scope="col">{t("colSensitivity")}</th></tr></thead>
            <tbody>
              {data.species.map((s) => (
                <tr key={s.id} className="border-b border-reed-100">
                  <th scope="row" className="py-1 font-normal italic">{s.scientificName}</th>
                  <td>{s.names[locale] ?? s.names.en ?? ""}</td>
                  <td>{tGroup(s.taxonGroup)}</td>
                  <td>{t(`sensitivity.${s.sensitivity}`)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>
    </div>
  );
}
