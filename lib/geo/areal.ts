// Event areas and zones are a Polygon or a MultiPolygon (RFC 7946, IETF 2016: §3.1.6 and
// §3.1.7): an area in two parts, a zone split by a river, a zone with a pond cut out.
// This module holds their types and the pure drawing arithmetic of the small SVG maps
// (no map tiles, nothing fetched, so they work offline). Pure: no database, no framework.

/** [longitude, latitude] (RFC 7946 §3.1.1); a third number (altitude) is ignored. */
export type Position = number[];
/** A closed ring: first and last positions equal. */
export type Ring = Position[];
export type PolygonGeometry = { type: "Polygon"; coordinates: Ring[] };
export type MultiPolygonGeometry = { type: "MultiPolygon"; coordinates: Ring[][] };
export type ArealGeometry = PolygonGeometry | MultiPolygonGeometry;

export type ZoneFeature = {
  type: "Feature";
  id: string;
  geometry: ArealGeometry;
  properties: { name: string; habitat: string; description?: string };
};
export type ZoneCollection = { type: "FeatureCollection"; features: ZoneFeature[] };

/** The polygons of a geometry, each as [outer ring, ...holes]. */
export function polygonsOf(g: ArealGeometry): Ring[][] {
  return g.type === "Polygon" ? [g.coordinates] : g.coordinates;
}

export const M_PER_DEG_LAT = 111_320; // metres per degree of latitude, approximately (from memory)

/**
 * Equirectangular projection with longitude scaled by the cosine of the middle latitude:
 * at reserve scale the distortion is far below a location's accuracy (common practice
 * for small maps). y grows downwards, as in SVG.
 */
export type Projection = {
  width: number;
  height: number;
  x: (lon: number) => number;
  y: (lat: number) => number;
  /** The position under an SVG point (for a tap on the map). */
  invert: (px: number, py: number) => { longitude: number; latitude: number };
  /** Ground metres per SVG unit. */
  metresPerUnit: number;
};

export type FitOptions = {
  width: number;
  /** A fixed height; without it the height follows the shape, between minHeight and maxHeight. */
  height?: number;
  minHeight?: number;
  maxHeight?: number;
  pad?: number;
  /** Extra room around everything, in metres (an accuracy ring). */
  marginM?: number;
};

/** The projection that fits the geometries and extra positions into the box; null when there is nothing to draw. */
export function fitProjection(geometries: ArealGeometry[], extra: Position[], opts: FitOptions): Projection | null {
  const positions = [...geometries.flatMap((g) => polygonsOf(g).flat(2)), ...extra].filter(
    (p) => Number.isFinite(p[0]) && Number.isFinite(p[1]),
  );
  if (positions.length === 0) return null;
  const lons = positions.map((p) => p[0]!);
  const lats = positions.map((p) => p[1]!);
  const margin = (opts.marginM ?? 0) / M_PER_DEG_LAT;
  const k = Math.cos((((Math.min(...lats) + Math.max(...lats)) / 2) * Math.PI) / 180);
  const minX = Math.min(...lons) * k - margin;
  const maxX = Math.max(...lons) * k + margin;
  const minY = Math.min(...lats) - margin;
  const maxY = Math.max(...lats) + margin;
  const spanX = Math.max(maxX - minX, 1e-9);
  const spanY = Math.max(maxY - minY, 1e-9);
  const pad = opts.pad ?? 0;
  const width = opts.width;
  const inner = width - 2 * pad;
  const height =
    opts.height ??
    Math.round(Math.min(opts.maxHeight ?? Infinity, Math.max(opts.minHeight ?? 0, (inner * spanY) / spanX + 2 * pad)));
  const scale = Math.min(inner / spanX, (height - 2 * pad) / spanY);
  // Centred in the box.
  const offX = (width - spanX * scale) / 2;
  const offY = (height - spanY * scale) / 2;
  return {
    width,
    height,
    x: (lon) => offX + (lon * k - minX) * scale,
    y: (lat) => height - offY - (lat - minY) * scale,
    invert: (px, py) => ({
      longitude: ((px - offX) / scale + minX) / k,
      latitude: (height - offY - py) / scale + minY,
    }),
    metresPerUnit: M_PER_DEG_LAT / scale,
  };
}

const f1 = (v: number) => v.toFixed(1);

/**
 * The SVG path of a Polygon or MultiPolygon: one closed subpath per ring, every part and
 * every hole. Drawn with fill-rule="evenodd", holes stay empty.
 */
export function arealPath(g: ArealGeometry, p: Pick<Projection, "x" | "y">): string {
  return polygonsOf(g)
    .flat()
    .filter((ring) => ring.length >= 3)
    .map((ring) => ring.map(([lon, lat], i) => `${i ? "L" : "M"}${f1(p.x(lon!))},${f1(p.y(lat!))}`).join("") + "Z")
    .join("");
}

/** Shoelace area of a ring, in squared coordinate units (sign dropped). */
function ringArea(ring: Ring): number {
  let a = 0;
  for (let i = 0; i + 1 < ring.length; i++) a += ring[i]![0]! * ring[i + 1]![1]! - ring[i + 1]![0]! * ring[i]![1]!;
  return Math.abs(a / 2);
}

/** Where to write a zone's name: the middle of the bounding box of its largest part's outer ring. */
export function labelPoint(g: ArealGeometry, p: Pick<Projection, "x" | "y">): [number, number] | null {
  const outers = polygonsOf(g)
    .map((poly) => poly[0] ?? [])
    .filter((r) => r.length >= 3);
  if (outers.length === 0) return null;
  const largest = outers.reduce((a, b) => (ringArea(b) > ringArea(a) ? b : a));
  const xs = largest.map((c) => p.x(c[0]!));
  const ys = largest.map((c) => p.y(c[1]!));
  return [(Math.min(...xs) + Math.max(...xs)) / 2, (Math.min(...ys) + Math.max(...ys)) / 2];
}
