"use client";

import dynamic from "next/dynamic";
import { useTranslations } from "next-intl";
import { useState } from "react";
import { useMapSettings } from "@/components/map/map-settings";
import type { Corner } from "@/components/map/zone-editor-map";
import { api } from "@/lib/http/client";
import { HABITATS } from "@/lib/domain";
import { polygonsOf, type ArealGeometry } from "@/lib/geo/areal";

// Leaflet only when the editor is on screen (never on the server).
const ZoneEditorMap = dynamic(() => import("@/components/map/zone-editor-map"), { ssr: false });

type StoredZone = { id: string; name: string; habitat: string; description?: string | null; geometry: unknown };
type Draft = { corners: Corner[]; name: string; habitat: string; description: string };
const AREA = "area";
const NEW = "new";

function cornersOf(g: unknown): Corner[] {
  const geometry = g as ArealGeometry | null;
  if (!geometry || (geometry.type !== "Polygon" && geometry.type !== "MultiPolygon")) return [];
  // The first polygon's outer ring, without its closing position (holes and other parts are not edited here).
  const ring = polygonsOf(geometry)[0]?.[0] ?? [];
  return ring.slice(0, -1).map((p) => [p[0]!, p[1]!] as Corner);
}

const polygon = (corners: Corner[]): ArealGeometry => ({ type: "Polygon", coordinates: [[...corners, corners[0]!]] });

/**
 * Drawing the area and zones in the browser: pick what to draw, tap corners, drag them, name the
 * zone and its habitat, save. The whole set goes through the same handler and PostGIS checks as
 * an uploaded file (PUT …/setup/zones).
 */
export function ZoneEditor({
  url,
  area,
  zones,
  onSaved,
}: {
  url: string;
  area: unknown;
  zones: StoredZone[];
  onSaved: () => void;
}) {
  const t = useTranslations("Map");
  const tHabitat = useTranslations("Habitat");
  const settings = useMapSettings();
  const [target, setTarget] = useState<string>(area ? NEW : AREA);
  const [drafts, setDrafts] = useState<Record<string, Draft>>({});
  const [status, setStatus] = useState<{ ok: boolean; text: string[] } | null>(null);
  const [saving, setSaving] = useState(false);

  const stored = (key: string): Draft => {
    if (key === AREA) return { corners: cornersOf(area), name: "", habitat: "", description: "" };
    const z = zones.find((x) => x.id === key);
    return z
      ? { corners: cornersOf(z.geometry), name: z.name, habitat: z.habitat, description: z.description ?? "" }
      : { corners: [], name: "", habitat: "interior", description: "" };
  };
  const draft = drafts[target] ?? stored(target);
  const change = (patch: Partial<Draft>) => {
    setDrafts((d) => ({ ...d, [target]: { ...draft, ...patch } }));
    setStatus(null);
  };

  const areaDraft = drafts[AREA];
  const context = [
    ...(target !== AREA && (areaDraft?.corners.length ?? 0) >= 3
      ? [{ name: "", geometry: polygon(areaDraft!.corners), isArea: true }]
      : target !== AREA && area
        ? [{ name: "", geometry: area as ArealGeometry, isArea: true }]
        : []),
    ...zones
      .filter((z) => z.id !== target)
      .map((z) => ({ name: z.name, geometry: z.geometry as ArealGeometry, isArea: false })),
  ];

  const save = async () => {
    const problems: string[] = [];
    for (const [key, d] of Object.entries(drafts)) {
      if (d.corners.length < 3) problems.push(t("editorNeedCorners"));
      if (key !== AREA && !d.name.trim()) problems.push(t("editorNeedName"));
    }
    if (Object.keys(drafts).length === 0) problems.push(t("editorNeedCorners"));
    if (problems.length) {
      setStatus({ ok: false, text: [...new Set(problems)] });
      return;
    }
    const areaGeometry = areaDraft ? polygon(areaDraft.corners) : area;
    const zoneFeatures = [
      ...zones.map((z) => {
        const d = drafts[z.id];
        return {
          type: "Feature",
          properties: {
            kind: "zone",
            name: d ? d.name.trim() : z.name,
            habitat: d ? d.habitat : z.habitat,
            description: d ? d.description : (z.description ?? ""),
          },
          geometry: d ? polygon(d.corners) : z.geometry,
        };
      }),
      ...(drafts[NEW]
        ? [
            {
              type: "Feature",
              properties: {
                kind: "zone",
                name: drafts[NEW].name.trim(),
                habitat: drafts[NEW].habitat,
                description: drafts[NEW].description,
              },
              geometry: polygon(drafts[NEW].corners),
            },
          ]
        : []),
    ];
    const geojson = {
      type: "FeatureCollection",
      features: [
        ...(areaGeometry ? [{ type: "Feature", properties: { kind: "area" }, geometry: areaGeometry }] : []),
        ...zoneFeatures,
      ],
    };
    setSaving(true);
    const r = await api.call<{ saved: boolean }>(url, { method: "PUT", body: { geojson, save: true } });
    setSaving(false);
    if (r.ok) {
      const name = drafts[NEW]?.name.trim() ?? (target === AREA ? "" : draft.name);
      setDrafts({});
      setTarget(NEW);
      setStatus({ ok: true, text: [t("editorSaved", { name })] });
      onSaved();
    } else {
      const fields = r.error.fields.map((f) => f.message);
      setStatus({ ok: false, text: fields.length ? fields : [r.error.problem] });
    }
  };

  const input = "min-h-touch w-full rounded-lg border-2 border-reed-700 bg-white px-3";
  return (
    <section aria-labelledby="zone-editor-title" className="space-y-3">
      <h2 id="zone-editor-title" className="text-2xl font-bold text-reed-900">
        {t("editorTitle")}
      </h2>
      <p>{t("editorHelp")}</p>
      <label className="block max-w-md space-y-1">
        <span className="font-bold">{t("editorPick")}</span>
        <select value={target} onChange={(e) => setTarget(e.target.value)} className={input}>
          <option value={AREA}>{t("editorArea")}</option>
          {zones.map((z) => (
            <option key={z.id} value={z.id}>
              {z.name}
            </option>
          ))}
          <option value={NEW}>{t("editorNew")}</option>
        </select>
      </label>
      <ZoneEditorMap
        key={target}
        tileUrl={settings?.tileUrl ?? null}
        attribution={settings?.attribution ?? ""}
        label={t("editorLabel")}
        context={context}
        corners={draft.corners}
        onChange={(corners) => change({ corners })}
      />
      <div className="flex flex-wrap items-center gap-2">
        <span role="status" aria-live="polite" className="font-semibold">
          {t("editorCorners", { count: draft.corners.length })}
        </span>
        <button
          type="button"
          onClick={() => change({ corners: draft.corners.slice(0, -1) })}
          disabled={draft.corners.length === 0}
          className="min-h-touch rounded-lg border-2 border-reed-700 px-3 font-semibold text-reed-800 disabled:opacity-50"
        >
          {t("editorUndo")}
        </button>
        <button
          type="button"
          onClick={() => change({ corners: [] })}
          disabled={draft.corners.length === 0}
          className="min-h-touch rounded-lg border-2 border-reed-700 px-3 font-semibold text-reed-800 disabled:opacity-50"
        >
          {t("editorClear")}
        </button>
      </div>
      {target !== AREA ? (
        <div className="grid max-w-2xl gap-3 sm:grid-cols-2">
          <label className="block space-y-1">
            <span className="font-bold">{t("editorName")}</span>
            <input value={draft.name} onChange={(e) => change({ name: e.target.value })} className={input} />
          </label>
          <label className="block space-y-1">
            <span className="font-bold">{t("editorHabitat")}</span>
            <select value={draft.habitat} onChange={(e) => change({ habitat: e.target.value })} className={input}>
              {HABITATS.map((h) => (
                <option key={h} value={h}>
                  {tHabitat(h)}
                </option>
              ))}
            </select>
          </label>
          <label className="block space-y-1 sm:col-span-2">
            <span className="font-bold">{t("editorDescription")}</span>
            <input
              value={draft.description}
              onChange={(e) => change({ description: e.target.value })}
              className={input}
            />
          </label>
        </div>
      ) : null}
      <button
        type="button"
        onClick={() => void save()}
        disabled={saving}
        className="min-h-touch rounded-lg bg-reed-700 px-5 text-lg font-bold text-paper disabled:opacity-60"
      >
        {saving ? t("editorSaving") : t("editorSave")}
      </button>
      {status ? (
        <div
          role={status.ok ? "status" : "alert"}
          className={status.ok ? "font-semibold" : "font-semibold text-signal"}
        >
          {status.text.map((line, i) => (
            <p key={i}>{line}</p>
          ))}
        </div>
      ) : null}
    </section>
  );
}
