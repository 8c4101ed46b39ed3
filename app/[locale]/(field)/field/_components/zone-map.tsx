"use client";

import { useTranslations } from "next-intl";
import type { ZoneCollection } from "@/lib/field/types";
import { bounds, distanceM } from "@/lib/field/zones";

const W = 320;

/**
 * Manual placement without map tiles (nothing to download in the field): the event's zones
 * drawn from the pack; a tap places the point. The accuracy given is the ground width of
 * a fingertip (24 px) at this scale.
 */
export function ZoneMap({ zones, point, onPlace }: { zones: ZoneCollection; point: { latitude: number; longitude: number } | null; onPlace: (p: { latitude: number; longitude: number; accuracyM: number }) => void }) {
  const t = useTranslations("FieldLog");
  const b = bounds(zones);
  if (!b) return null;
  const [w, s, e, n] = b;
  const kx = Math.cos(((s + n) / 2) * (Math.PI / 180)); // equirectangular, scaled at the mid latitude
  const H = Math.max(120, Math.round((W * (n - s)) / Math.max(1e-9, (e - w) * kx)));
  const x = (lon: number) => ((lon - w) / (e - w)) * W;
  const y = (lat: number) => ((n - lat) / (n - s)) * H;
  const metresPerPx = distanceM({ latitude: s, longitude: w }, { latitude: s, longitude: e }) / W;
  const ring = (r: number[][]) => r.map(([lon, lat]) => `${x(lon!)},${y(lat!)}`).join(" ");
  const palette = ["#a9cfb7", "#ebc98a", "#76b08f", "#dfab55", "#d5e8dc", "#f5e3bf"];

  return (
    <figure className="space-y-1">
      <svg
        viewBox={`0 0 ${W} ${H}`}
        role="img"
        aria-label={t("mapLabel")}
        className="w-full touch-none rounded-lg border-2 border-reed-700 bg-white"
        onClick={(ev) => {
          const rect = ev.currentTarget.getBoundingClientRect();
          const px = ((ev.clientX - rect.left) / rect.width) * W;
          const py = ((ev.clientY - rect.top) / rect.height) * H;
          onPlace({ longitude: w + (px / W) * (e - w), latitude: n - (py / H) * (n - s), accuracyM: Math.round(metresPerPx * 24 * (W / rect.width)) });
        }}
      >
        {zones.features.map((f, i) => {
          const polys = f.geometry.type === "Polygon" ? [f.geometry.coordinates] : f.geometry.coordinates;
          return (
            <g key={f.id}>
              {polys.map((p, j) => <polygon key={j} points={ring(p[0] ?? [])} fill={palette[i % palette.length]} stroke="#153a2a" strokeWidth={1.5} />)}
            </g>
          );
        })}
        {zones.features.map((f) => {
          const r = (f.geometry.type === "Polygon" ? f.geometry.coordinates[0] : f.geometry.coordinates[0]?.[0]) ?? [];
          const cx = r.reduce((a, [lon]) => a + x(lon!), 0) / Math.max(1, r.length);
          const cy = r.reduce((a, [, lat]) => a + y(lat!), 0) / Math.max(1, r.length);
          return <text key={`${f.id}-label`} x={cx} y={cy} textAnchor="middle" fontSize="13" fontWeight="700" fill="#0f2a1f">{f.properties.name}</text>;
        })}
        {point ? <circle cx={x(point.longitude)} cy={y(point.latitude)} r={7} fill="#b3261e" stroke="#fff" strokeWidth={2} /> : null}
      </svg>
      <figcaption className="text-sm text-ink-soft">{t("mapHint")}</figcaption>
    </figure>
  );
}
