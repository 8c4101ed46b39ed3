"use client";

import { useTranslations } from "next-intl";

// The area and zones drawn as SVG from their own coordinates: no map tiles, nothing
// fetched, so the preview works offline. An equirectangular projection scaled by the
// cosine of the mid latitude keeps shapes true enough at reserve scale (common practice).

type Ring = number[][];
type Geometry = { type: string; coordinates: unknown } | null | undefined;
export type PreviewZone = { name: string; habitat: string; geometry: Geometry; problem?: boolean };

const FILL: Record<string, string> = {
  interior: "#a9cfb7",
  edge: "#ebc98a",
  wetland: "#76b08f",
  open_water: "#9cc3d5",
  grassland: "#d5e8dc",
  woodland: "#4a8e6b",
  urban: "#c9c3b6",
  other: "#efe9da",
};

function polygonsOf(g: Geometry): Ring[][] {
  if (!g || !Array.isArray(g.coordinates)) return [];
  const polys = g.type === "Polygon" ? [g.coordinates] : g.type === "MultiPolygon" ? g.coordinates : [];
  return (polys as unknown[])
    .filter(Array.isArray)
    .map((rings) =>
      (rings as unknown[])
        .filter(Array.isArray)
        .map((ring) =>
          (ring as unknown[]).filter(
            (p): p is number[] =>
              Array.isArray(p) &&
              Number.isFinite(p[0]) &&
              Number.isFinite(p[1]) &&
              Math.abs(p[0] as number) <= 180 &&
              Math.abs(p[1] as number) <= 90,
          ),
        ),
    );
}

export function PolygonPreview({ area, zones, title }: { area: Geometry; zones: PreviewZone[]; title: string }) {
  const t = useTranslations("Setup.zones");
  const tHabitat = useTranslations("Habitat");
  const shapes = [
    { polys: polygonsOf(area), kind: "area" as const, zone: null as PreviewZone | null },
    ...zones.map((z) => ({ polys: polygonsOf(z.geometry), kind: "zone" as const, zone: z })),
  ];
  const points = shapes.flatMap((s) => s.polys.flat(2) as unknown as number[][]).filter(Array.isArray);
  if (points.length === 0) return <p className="text-ink-soft">{t("nothingToDraw")}</p>;
  const lons = points.map((p) => p[0]!);
  const lats = points.map((p) => p[1]!);
  const [minLon, maxLon, minLat, maxLat] = [Math.min(...lons), Math.max(...lons), Math.min(...lats), Math.max(...lats)];
  const k = Math.cos((((minLat + maxLat) / 2) * Math.PI) / 180);
  const w = Math.max((maxLon - minLon) * k, 1e-9);
  const h = Math.max(maxLat - minLat, 1e-9);
  const W = 640;
  const H = Math.min(480, Math.max(200, (W * h) / w));
  const pad = 16;
  const scale = Math.min((W - 2 * pad) / w, (H - 2 * pad) / h);
  const x = (lon: number) => pad + (lon - minLon) * k * scale;
  const y = (lat: number) => pad + (maxLat - lat) * scale;
  const d = (polys: Ring[][]) =>
    polys
      .map((rings) =>
        rings
          .map((r) => r.map((p, i) => `${i ? "L" : "M"}${x(p[0]!).toFixed(1)} ${y(p[1]!).toFixed(1)}`).join("") + "Z")
          .join(""),
      )
      .join("");
  const centre = (polys: Ring[][]) => {
    const ring = polys[0]?.[0] ?? [];
    if (!ring.length) return null;
    return {
      cx: ring.reduce((s, p) => s + x(p[0]!), 0) / ring.length,
      cy: ring.reduce((s, p) => s + y(p[1]!), 0) / ring.length,
    };
  };

  return (
    <figure className="space-y-2">
      <svg
        viewBox={`0 0 ${W} ${H}`}
        role="img"
        aria-labelledby="preview-title"
        className="w-full max-w-2xl rounded-lg border border-reed-200 bg-paper-deep"
      >
        <title id="preview-title">{title}</title>
        {shapes.map((s, i) =>
          s.kind === "area" ? (
            <path key="area" d={d(s.polys)} fill="#f8f5ec" stroke="#153a2a" strokeWidth={3} fillRule="evenodd" />
          ) : (
            <path
              key={i}
              d={d(s.polys)}
              fill={FILL[s.zone!.habitat] ?? FILL.other}
              fillOpacity={0.85}
              fillRule="evenodd"
              stroke={s.zone!.problem ? "#b3261e" : "#1b4a35"}
              strokeWidth={s.zone!.problem ? 3 : 1.5}
              strokeDasharray={s.zone!.problem ? "8 4" : undefined}
            />
          ),
        )}
        {shapes.map((s, i) => {
          if (s.kind === "area") return null;
          const c = centre(s.polys);
          return c ? (
            <text
              key={`l${i}`}
              x={c.cx}
              y={c.cy}
              textAnchor="middle"
              dominantBaseline="middle"
              fontSize={16}
              fontWeight={700}
              fill="#1a1f1b"
              stroke="#f8f5ec"
              strokeWidth={3}
              paintOrder="stroke"
            >
              {i}
            </text>
          ) : null;
        })}
      </svg>
      <figcaption>
        <ol className="grid gap-1 sm:grid-cols-2">
          {zones.map((z, i) => (
            <li key={i} className="flex items-center gap-2">
              <span
                aria-hidden="true"
                className="inline-block size-4 rounded-sm border border-reed-800"
                style={{ background: FILL[z.habitat] ?? FILL.other }}
              />
              <span className="font-semibold">{i + 1}.</span> {z.name || t("unnamed")} ·{" "}
              {tHabitat.has(z.habitat as never) ? tHabitat(z.habitat as never) : z.habitat}
              {z.problem ? <span className="font-semibold text-signal">✕ {t("hasProblem")}</span> : null}
            </li>
          ))}
        </ol>
        <p className="text-sm text-ink-soft">{t("areaOutline")}</p>
      </figcaption>
    </figure>
  );
}
