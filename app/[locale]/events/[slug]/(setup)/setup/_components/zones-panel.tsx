"use client";

import { useTranslations } from "next-intl";
import { useState } from "react";
import useSWR from "swr";
import { fetcher } from "@/lib/http/client";
import type { ReportLine } from "@/server/setup/upload-report";
import { PolygonPreview, type PreviewZone } from "./polygon-preview";
import { UploadPanel, type UploadAnswer } from "./upload-panel";
import { ZoneEditor } from "./zone-editor";
import { HABITATS } from "@/lib/domain";

type Geometry = { type: string; coordinates: unknown } | null;
type Stored = {
  area: Geometry;
  zones: {
    id: string;
    name: string;
    habitat: string;
    description?: string | null;
    areaHa: number;
    records: number;
    geometry: Geometry;
  }[];
};
type Summary = { zones: number; added: number; updated: number; removed: number };
type Moved = { sightings: number; sessions: number };
/** A saved upload also says how many existing records moved to the new zones. */
type Saved = UploadAnswer<Summary> & { moved?: Moved };

function fileShapes(json: unknown, report: ReportLine[]): { area: Geometry; zones: PreviewZone[] } {
  const features = (json as { features?: unknown })?.features;
  if (!Array.isArray(features)) return { area: null, zones: [] };
  const bad = new Set(report.map((r) => r.feature));
  let area: Geometry = null;
  const zones: PreviewZone[] = [];
  features.forEach((f, i) => {
    const props = (f?.properties ?? {}) as Record<string, unknown>;
    if (String(props.kind ?? "zone").toLowerCase() === "area") area ??= f?.geometry ?? null;
    else
      zones.push({
        name: String(props.name ?? ""),
        habitat: String(props.habitat ?? "other"),
        geometry: f?.geometry ?? null,
        problem: bad.has(i),
      });
  });
  return { area, zones };
}

export function ZonesPanel({ eventId }: { eventId: string }) {
  const t = useTranslations("Setup.zones");
  const tHabitat = useTranslations("Habitat");
  const url = `/api/events/${eventId}/setup/zones`;
  const { data, mutate } = useSWR<Stored>(url, fetcher);
  const [moved, setMoved] = useState<Moved | null>(null);

  // Not JSON at all: said at once, without a call.
  const read = (text: string): { content: unknown } | { problem: ReportLine } => {
    try {
      return { content: JSON.parse(text) as unknown };
    } catch {
      return { problem: { feature: null, field: "(file)", code: "notJson", message: t("notJson") } };
    }
  };

  return (
    <div className="space-y-6">
      <UploadPanel<unknown, Summary, Saved>
        kind="zones"
        url={url}
        accept=".geojson,.json,application/geo+json,application/json"
        read={read}
        body={(geojson, save) => ({ geojson, save })}
        onSaved={(saved) => {
          setMoved(saved.moved ?? null);
          void mutate();
        }}
        format={
          <ul className="ms-5 list-disc space-y-1 pt-2">
            <li>{t("formatArea")}</li>
            <li>{t("formatZones")}</li>
            <li>{t("formatHabitats", { list: HABITATS.join(", ") })}</li>
            <li>{t("formatWgs84")}</li>
          </ul>
        }
        preview={(file, report) => {
          if (!file.content) return null;
          const shapes = fileShapes(file.content, report);
          return (
            <PolygonPreview area={shapes.area} zones={shapes.zones} title={t("previewFile", { name: file.name })} />
          );
        }}
      />
      {moved ? (
        <p role="status" className="font-semibold text-reed-700">
          {t("moved", moved)}
        </p>
      ) : null}

      <section aria-labelledby="zones-current-title" className="space-y-3">
        <h2 id="zones-current-title" className="text-2xl font-bold text-reed-900">
          {t("currentTitle")}
        </h2>
        {!data ? (
          <p role="status">{t("loading")}</p>
        ) : data.zones.length === 0 && !data.area ? (
          <p>{t("none")}</p>
        ) : (
          <>
            <PolygonPreview
              area={data.area}
              zones={data.zones.map((z) => ({ name: z.name, habitat: z.habitat, geometry: z.geometry }))}
              title={t("previewCurrent")}
            />
            <table className="w-full max-w-2xl text-start">
              <caption className="sr-only">{t("currentTitle")}</caption>
              <thead>
                <tr className="border-b border-reed-300">
                  <th scope="col">{t("colName")}</th>
                  <th scope="col">{t("colHabitat")}</th>
                  <th scope="col" className="text-end">
                    {t("colArea")}
                  </th>
                  <th scope="col" className="text-end">
                    {t("colRecords")}
                  </th>
                </tr>
              </thead>
              <tbody>
                {data.zones.map((z) => (
                  <tr key={z.id} className="border-b border-reed-100">
                    <th scope="row" className="py-1 font-normal">
                      {z.name}
                    </th>
                    <td>{tHabitat(z.habitat as never)}</td>
                    <td className="text-end tabular-nums">{z.areaHa}</td>
                    <td className="text-end tabular-nums">{z.records}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </>
        )}
      </section>

      {data ? <ZoneEditor url={url} area={data.area} zones={data.zones} onSaved={() => void mutate()} /> : null}
    </div>
  );
}
