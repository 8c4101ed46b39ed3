import type { GeoJsonPolygon } from "@/db/queries/review";

// A small SVG map: the event area, its zones (named), the recorded point and a ring for its
// accuracy. Equirectangular, with longitude scaled by cos(latitude): at reserve scale the
// distortion is far below the accuracy ring (common practice for small maps).
const W = 320;
const H = 220;
const PAD = 12;
const M_PER_DEG_LAT = 111_320; // metres per degree of latitude, approximately (from memory)

type Props = {
  area: GeoJsonPolygon | null; zones: { id: string; name: string; geometry: GeoJsonPolygon }[];
  point: { lon: number; lat: number; accuracyM: number }; zoneId: string | null; label: string;
};

export function ZoneMap({ area, zones, point, zoneId, label }: Props) {
  const rings = [...(area ? [area.coordinates[0]!] : []), ...zones.map((z) => z.geometry.coordinates[0]!)];
  const all = [...rings.flat(), [point.lon, point.lat] as [number, number]];
  const k = Math.cos((point.lat * Math.PI) / 180);
  const rPad = point.accuracyM / M_PER_DEG_LAT;
  const minX = Math.min(...all.map((c) => c[0] * k)) - rPad;
  const maxX = Math.max(...all.map((c) => c[0] * k)) + rPad;
  const minY = Math.min(...all.map((c) => c[1])) - rPad;
  const maxY = Math.max(...all.map((c) => c[1])) + rPad;
  const scale = Math.min((W - 2 * PAD) / Math.max(maxX - minX, 1e-9), (H - 2 * PAD) / Math.max(maxY - minY, 1e-9));
  const x = (lon: number) => PAD + (lon * k - minX) * scale;
  const y = (lat: number) => H - PAD - (lat - minY) * scale;
  const path = (ring: [number, number][]) => ring.map(([lon, lat], i) => `${i ? "L" : "M"}${x(lon).toFixed(1)},${y(lat).toFixed(1)}`).join("") + "Z";
  const centre = (ring: [number, number][]) => {
    const xs = ring.map((c) => x(c[0]));
    const ys = ring.map((c) => y(c[1]));
    return [(Math.min(...xs) + Math.max(...xs)) / 2, (Math.min(...ys) + Math.max(...ys)) / 2] as const;
  };
  const radius = Math.max(2, (point.accuracyM / M_PER_DEG_LAT) * scale);
  return (
    <svg viewBox={`0 0 ${W} ${H}`} role="img" aria-label={label} className="h-auto w-full rounded-lg border border-reed-200 bg-paper-deep">
      {area ? <path d={path(area.coordinates[0]!)} fill="#eef5f0" stroke="#153a2a" strokeWidth={2} /> : null}
      {zones.map((z) => {
        const [cx, cy] = centre(z.geometry.coordinates[0]!);
        const here = z.id === zoneId;
        return (
          <g key={z.id}>
            <path d={path(z.geometry.coordinates[0]!)} fill={here ? "#f5e3bf" : "#d5e8dc"} stroke="#2f7352" strokeWidth={1} strokeDasharray={here ? undefined : "3 2"}>
              <title>{z.name}</title>
            </path>
            <text x={cx} y={cy} textAnchor="middle" fontSize={9} fill="#0f2a1f">{z.name}</text>
          </g>
        );
      })}
      <circle cx={x(point.lon)} cy={y(point.lat)} r={radius} fill="#b3261e" fillOpacity={0.12} stroke="#b3261e" strokeWidth={1} />
      <circle cx={x(point.lon)} cy={y(point.lat)} r={4} fill="#b3261e" stroke="#f8f5ec" strokeWidth={1.5} />
    </svg>
  );
}
