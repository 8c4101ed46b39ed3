"use client";

import { arealPath, fitProjection, labelPoint, type ArealGeometry } from "@/lib/geo/areal";

// A small SVG map of an event: its area, its zones (named; Polygon or MultiPolygon, holes
// left empty) and one point with its accuracy ring. No map tiles: nothing to download in
// the field. Used by the field log (a tap places the point) and by the review desk.

export type MapZone = { id: string; name: string; geometry: ArealGeometry };
export type MapPoint = { longitude: number; latitude: number; accuracyM?: number };

// Zone fills from the palette of tailwind.config.ts (reed and heath), in turn.
const FILLS = ["#a9cfb7", "#ebc98a", "#76b08f", "#dfab55", "#d5e8dc", "#f5e3bf"];
const FINGERTIP_PX = 24; // the ground width of a fingertip is the accuracy of a tapped point

type Props = {
  zones: MapZone[];
  area?: ArealGeometry | null;
  point?: MapPoint | null;
  /** The zone the point was recorded in: drawn with a solid outline. */
  zoneId?: string | null;
  label: string;
  /** Makes the map a place picker: a tap gives the position and the accuracy of a fingertip. */
  onPlace?: (p: { longitude: number; latitude: number; accuracyM: number }) => void;
  width?: number;
  height?: number;
  className?: string;
};

export function ZoneMap({ zones, area, point, zoneId, label, onPlace, width = 320, height, className }: Props) {
  // A place picker keeps still while the point moves; a map showing a record fits the point and its ring.
  const shown = point && !onPlace ? point : null;
  const proj = fitProjection(
    [...(area ? [area] : []), ...zones.map((z) => z.geometry)],
    shown ? [[shown.longitude, shown.latitude]] : [],
    {
      width,
      height,
      minHeight: 120,
      maxHeight: 480,
      pad: onPlace ? 0 : 12,
      marginM: shown?.accuracyM ?? 0,
    },
  );
  if (!proj) return null;
  const { x, y } = proj;
  return (
    <svg
      viewBox={`0 0 ${proj.width} ${proj.height}`}
      role="img"
      aria-label={label}
      className={className ?? "h-auto w-full rounded-lg border border-reed-200 bg-paper-deep"}
      onClick={
        onPlace
          ? (ev) => {
              const rect = ev.currentTarget.getBoundingClientRect();
              const px = ((ev.clientX - rect.left) / rect.width) * proj.width;
              const py = ((ev.clientY - rect.top) / rect.height) * proj.height;
              const unitsPerPx = proj.width / rect.width;
              onPlace({
                ...proj.invert(px, py),
                accuracyM: Math.round(proj.metresPerUnit * FINGERTIP_PX * unitsPerPx),
              });
            }
          : undefined
      }
    >
      {area ? (
        <path d={arealPath(area, proj)} fillRule="evenodd" fill="#eef5f0" stroke="#153a2a" strokeWidth={2} />
      ) : null}
      {zones.map((z, i) => {
        const here = z.id === zoneId;
        return (
          <path
            key={z.id}
            d={arealPath(z.geometry, proj)}
            fillRule="evenodd"
            fill={FILLS[i % FILLS.length]}
            stroke="#153a2a"
            strokeWidth={here ? 2.5 : 1}
            strokeDasharray={here || !zoneId ? undefined : "3 2"}
            data-zone={z.name}
          >
            <title>{z.name}</title>
          </path>
        );
      })}
      {zones.map((z) => {
        const at = labelPoint(z.geometry, proj);
        return at ? (
          <text
            key={`${z.id}-label`}
            x={at[0]}
            y={at[1]}
            textAnchor="middle"
            fontSize={onPlace ? 13 : 9}
            fontWeight={onPlace || z.id === zoneId ? 700 : 400}
            fill="#0f2a1f"
          >
            {z.name}
          </text>
        ) : null;
      })}
      {point ? (
        <>
          {point.accuracyM ? (
            <circle
              cx={x(point.longitude)}
              cy={y(point.latitude)}
              r={Math.max(2, point.accuracyM / proj.metresPerUnit)}
              fill="#b3261e"
              fillOpacity={0.12}
              stroke="#b3261e"
              strokeWidth={1}
            />
          ) : null}
          <circle
            cx={x(point.longitude)}
            cy={y(point.latitude)}
            r={onPlace ? 7 : 4}
            fill="#b3261e"
            stroke="#f8f5ec"
            strokeWidth={onPlace ? 2 : 1.5}
          />
        </>
      ) : null}
    </svg>
  );
}
