"use client";

import { useTranslations } from "next-intl";
import { useState } from "react";
import useSWR from "swr";
import { buttonClass } from "@/components/ui/field";
import { fetcher, send } from "@/lib/http/client";
import { PolygonPreview, type PreviewZone } from "./polygon-preview";
import { ReportTable, type ReportLine } from "./report-table";

type Geometry = { type: string; coordinates: unknown } | null;
type Stored = { area: Geometry; zones: { id: string; name: string; habitat: string; areaHa: number; records: number; geometry: Geometry }[] };
type Summary = { zones: number; added: number; updated: number; removed: number };
type Answer = { saved?: boolean; summary?: Summary; report?: ReportLine[]; moved?: { sightings: number; sessions: number } };

function fileShapes(json: unknown, report: ReportLine[]): { area: Geometry; zones: PreviewZone[] } {
  const features = (json as { features?: unknown })?.features;
  if (!Array.isArray(features)) return { area: null, zones: [] };
  const bad = new Set(report.map((r) => r.feature));
  let area: Geometry = null;
  const zones: PreviewZone[] = [];
  features.forEach((f, i) => {
    const props = (f?.properties ?? {}) as Record<string, unknown>;
    if (String(props.kind ?? "zone").toLowerCase() === "area") area ??= f?.geometry ?? null;
    else zones.push({ name: String(props.name ?? ""), habitat: String(props.habitat ?? "other"), geometry: f?.geometry ?? null, problem: bad.has(i) });
  });
  return { area, zones };
}

export function ZonesPanel({ eventId }: { eventId: string }) {
  const t = useTranslations("Setup.zones");
  const tHabitat = useTranslations("Habitat");
  const url = `/api/events/${eventId}/setup/zones`;
  const { data, mutate } = useSWR<Stored>(url, fetcher);
  const [file, setFile] = useState<{ name: string; json: unknown } | null>(null);
  const [answer, setAnswer] = useState<Answer | null>(null);
  const [busy, setBusy] = useState(false);
  const [done, setDone] = useState<(Summary & { moved?: Answer["moved"] }) | null>(null);

  async function check(name: string, text: string) {
    setDone(null);
    setAnswer(null);
    let json: unknown;
    try {
      json = JSON.parse(text);
    } catch {
      setFile({ name, json: null });
      setAnswer({ report: [{ feature: null, field: "(file)", code: "notJson", message: t("notJson") }] });
      return;
    }
    setFile({ name, json });
    setBusy(true);
    const res = await send<Answer>(url, "PUT", { geojson: json, save: false });
    setBusy(false);
    setAnswer(res.ok || res.status === 422 ? res.body : { report: [{ feature: null, field: "(file)", code: "error", message: res.body.error?.message ?? t("failed") }] });
  }

  async function save() {
    if (!file) return;
    setBusy(true);
    const res = await send<Answer>(url, "PUT", { geojson: file.json, save: true });
    setBusy(false);
    if (res.ok && res.body.saved) {
      setDone(res.body.summary ? { ...res.body.summary, moved: res.body.moved } : null);
      setFile(null);
      setAnswer(null);
      await mutate();
    } else setAnswer(res.status === 422 ? res.body : { report: [{ feature: null, field: "(file)", code: "error", message: res.body.error?.message ?? t("failed") }] });
  }

  const report = answer?.report ?? [];
  const preview = file?.json ? fileShapes(file.json, report) : null;
  return (
    <div className="space-y-6">
      <section aria-labelledby="zones-upload-title" className="space-y-3 rounded-xl border border-reed-200 bg-white/70 p-4">
        <h2 id="zones-upload-title" className="text-2xl font-bold text-reed-900">{t("uploadTitle")}</h2>
        <p className="max-w-prose">{t("uploadIntro")}</p>
        <details className="max-w-prose text-sm">
          <summary className="cursor-pointer font-semibold">{t("formatTitle")}</summary>
          <ul className="ml-5 list-disc space-y-1 pt-2">
            <li>{t("formatArea")}</li>
            <li>{t("formatZones")}</li>
            <li>{t("formatHabitats", { list: "interior, edge, wetland, open_water, grassland, woodland, urban, other" })}</li>
            <li>{t("formatWgs84")}</li>
          </ul>
        </details>
        <label className="block font-semibold" htmlFor="zones-file">{t("fileLabel")}</label>
        <input id="zones-file" type="file" accept=".geojson,.json,application/geo+json,application/json" className="block min-h-touch"
          onChange={async (e) => { const f = e.target.files?.[0]; if (f) await check(f.name, await f.text()); e.target.value = ""; }} />
        {busy ? <p role="status">{t("checking")}</p> : null}
        {report.length ? <ReportTable report={report} kind="geojson" /> : null}
        {answer && !report.length && answer.summary ? (
          <div role="status" className="space-y-2 rounded-lg border-2 border-reed-600 bg-reed-50 p-3">
            <p className="font-semibold">✓ {t("checkedOk", { name: file?.name ?? "", ...answer.summary })}</p>
            <button type="button" className={buttonClass} onClick={save} disabled={busy}>{t("save")}</button>
          </div>
        ) : null}
        {preview ? <PolygonPreview area={preview.area} zones={preview.zones} title={t("previewFile", { name: file?.name ?? "" })} /> : null}
        {done ? <p role="status" className="font-semibold text-reed-700">✓ {t("saved", { zones: done.zones, added: done.added, updated: done.updated, removed: done.removed })}{done.moved ? ` ${t("moved", done.moved)}` : ""}</p> : null}
      </section>

      <section aria-labelledby="zones-current-title" className="space-y-3">
        <h2 id="zones-current-title" className="text-2xl font-bold text-reed-900">{t("currentTitle")}</h2>
        {!data ? <p role="status">{t("loading")}</p> : data.zones.length === 0 && !data.area ? <p>{t("none")}</p> : (
          <>
            <PolygonPreview area={data.area} zones={data.zones.map((z) => ({ name: z.name, habitat: z.habitat, geometry: z.geometry }))} title={t("previewCurrent")} />
            <table className="w-full max-w-2xl text-left">
              <caption className="sr-only">{t("currentTitle")}</caption>
              <thead><tr className="border-b border-reed-300"><th scope="col">{t("colName")}</th><th scope="col">{t("colHabitat")}</th><th scope="col" className="text-right">{t("colArea")}</th><th scope="col" className="text-right">{t("colRecords")}</th></tr></thead>
              <tbody>
                {data.zones.map((z) => (
                  <tr key={z.id} className="border-b border-reed-100">
                    <th scope="row" className="py-1 font-normal">{z.name}</th>
                    <td>{tHabitat(z.habitat as never)}</td>
                    <td className="text-right tabular-nums">{z.areaHa}</td>
                    <td className="text-right tabular-nums">{z.records}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </>
        )}
      </section>
    </div>
  );
}
