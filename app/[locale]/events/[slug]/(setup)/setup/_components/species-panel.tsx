"use client";

import { useTranslations } from "next-intl";
import { useState } from "react";
import useSWR from "swr";
import { api, ApiClientError, fetcher } from "@/lib/http/client";
import { UploadPanel, type UploadAnswer } from "./upload-panel";
import type { taxa } from "@/db/schema";
import { TAXON_GROUPS, TAXON_RANKS } from "@/lib/domain";

type Species = Pick<typeof taxa.$inferSelect, "id" | "scientificName" | "rank" | "taxonGroup" | "sensitivity"> & {
  names: Record<string, string>;
};
type Summary = {
  rows: number;
  newTaxa: number;
  addedToList: number;
  alreadyListed: number;
  namesAdded: number;
  namesKept: number;
};
type Checked = UploadAnswer<Summary> & { notices: { line: number; message: string }[] };

export function SpeciesPanel({ eventId, locale }: { eventId: string; locale: string }) {
  const t = useTranslations("Setup.species");
  const tGroup = useTranslations("TaxonGroup");
  const url = `/api/events/${eventId}/setup/species`;
  const { data, mutate } = useSWR<{ species: Species[] }>(url, fetcher);
  const [removal, setRemoval] = useState<{ ok: boolean; text: string } | null>(null);
  async function remove(s: Species) {
    setRemoval(null);
    try {
      await api.send(`${url}/${s.id}`, "DELETE");
    } catch (err) {
      if (!(err instanceof ApiClientError)) throw err;
      setRemoval({ ok: false, text: err.fields[0]?.message || err.message });
      return;
    }
    setRemoval({ ok: true, text: t("removed", { name: s.scientificName }) });
    await mutate();
  }

  return (
    <div className="space-y-6">
      <UploadPanel<string, Summary, Checked>
        kind="species"
        url={url}
        accept=".csv,text/csv"
        read={(csv) => ({ content: csv })}
        body={(csv, save) => ({ csv, save })}
        onSaved={() => void mutate()}
        format={
          <ul className="ms-5 list-disc space-y-1 pt-2">
            <li>{t("formatColumns")}</li>
            <li>{t("formatGroups", { list: TAXON_GROUPS.join(", ") })}</li>
            <li>{t("formatRanks", { list: TAXON_RANKS.join(", ") })}</li>
            <li>{t("formatSensitivity")}</li>
          </ul>
        }
        note={
          <p className="max-w-prose rounded-lg border-s-4 border-heath-500 bg-heath-50 p-3 text-sm">
            {t("sharedNote")}
          </p>
        }
        checkedNote={(answer) =>
          answer.notices.length ? (
            <ul className="ms-5 list-disc text-sm">
              {answer.notices.map((n, i) => (
                <li key={i}>{t("noticeLine", { line: n.line, message: n.message })}</li>
              ))}
            </ul>
          ) : null
        }
      />

      <section aria-labelledby="species-current-title" className="space-y-3">
        <h2 id="species-current-title" className="text-2xl font-bold text-reed-900">
          {t("currentTitle", { count: data?.species.length ?? 0 })}
        </h2>
        {removal ? (
          <p role={removal.ok ? "status" : "alert"} className={`font-semibold ${removal.ok ? "" : "text-signal"}`}>
            {removal.ok ? "✓" : "✕"} {removal.text}
          </p>
        ) : null}
        {!data ? (
          <p role="status">{t("loading")}</p>
        ) : data.species.length === 0 ? (
          <p>{t("none")}</p>
        ) : (
          <table className="w-full text-start text-sm">
            <caption className="sr-only">{t("currentCaption")}</caption>
            <thead>
              <tr className="border-b border-reed-300">
                <th scope="col">{t("colScientific")}</th>
                <th scope="col">{t("colCommon")}</th>
                <th scope="col">{t("colGroup")}</th>
                <th scope="col">{t("colSensitivity")}</th>
                <th scope="col">{t("colRemove")}</th>
              </tr>
            </thead>
            <tbody>
              {data.species.map((s) => (
                <tr key={s.id} className="border-b border-reed-100">
                  <th scope="row" className="py-1 font-normal italic">
                    {s.scientificName}
                  </th>
                  <td>{s.names[locale] ?? s.names.en ?? ""}</td>
                  <td>{tGroup(s.taxonGroup)}</td>
                  <td>{t(`sensitivity.${s.sensitivity}`)}</td>
                  <td>
                    <button
                      type="button"
                      onClick={() => remove(s)}
                      aria-label={t("remove", { name: s.scientificName })}
                      className="min-h-touch px-2 font-semibold text-signal underline"
                    >
                      {t("colRemove")}
                    </button>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>
    </div>
  );
}
