// Web Mercator tile arithmetic (the "slippy map" scheme used by every common tile server:
// 2^z × 2^z square tiles of 256 px, x eastwards from 180° W, y southwards from about 85.05° N;
// formulas from memory). Pure: used by the tile fake to draw a tile, and by the field log to
// list the tiles of an event's area for offline use.

export const TILE_SIZE = 256;
/** The zoom levels kept for offline use: 13 shows the whole reserve, 17 a few paces of a path. */
export const OFFLINE_MIN_ZOOM = 13;
export const OFFLINE_MAX_ZOOM = 17;
const MAX_LAT = 85.0511287798; // the latitude where the Mercator square ends (from memory)

/** The base map's settings a page hands to its maps (lib/env.ts MAP_TILE_URL, MAP_TILE_ATTRIBUTION). */
export type MapSettings = { tileUrl: string; attribution: string };

export type Tile = { z: number; x: number; y: number };
/** [west, south, east, north] in degrees. */
export type Bbox = [number, number, number, number];

/** The position in "world pixels" at zoom z (the whole world is 256·2^z pixels wide). */
export function worldPixel(lon: number, lat: number, z: number): [number, number] {
  const size = TILE_SIZE * 2 ** z;
  const phi = (Math.max(-MAX_LAT, Math.min(MAX_LAT, lat)) * Math.PI) / 180;
  const x = ((lon + 180) / 360) * size;
  const y = ((1 - Math.log(Math.tan(phi) + 1 / Math.cos(phi)) / Math.PI) / 2) * size;
  return [x, y];
}

/** The inverse of worldPixel. */
export function worldPixelToLonLat(px: number, py: number, z: number): [number, number] {
  const size = TILE_SIZE * 2 ** z;
  const lon = (px / size) * 360 - 180;
  const n = Math.PI - (2 * Math.PI * py) / size;
  const lat = (180 / Math.PI) * Math.atan(Math.sinh(n));
  return [lon, lat];
}

/** The tile that holds a position at zoom z. */
export function tileAt(lon: number, lat: number, z: number): Tile {
  const [px, py] = worldPixel(lon, lat, z);
  const last = 2 ** z - 1;
  return {
    z,
    x: Math.min(last, Math.max(0, Math.floor(px / TILE_SIZE))),
    y: Math.min(last, Math.max(0, Math.floor(py / TILE_SIZE))),
  };
}

/** A tile's edges in degrees. */
export function tileBbox({ z, x, y }: Tile): Bbox {
  const [west, north] = worldPixelToLonLat(x * TILE_SIZE, y * TILE_SIZE, z);
  const [east, south] = worldPixelToLonLat((x + 1) * TILE_SIZE, (y + 1) * TILE_SIZE, z);
  return [west, south, east, north];
}

/** A position in a tile's own pixels (0–256 inside it; outside it beyond). */
export function pixelInTile(lon: number, lat: number, tile: Tile): [number, number] {
  const [px, py] = worldPixel(lon, lat, tile.z);
  return [px - tile.x * TILE_SIZE, py - tile.y * TILE_SIZE];
}

export function isValidTile({ z, x, y }: Tile): boolean {
  const n = 2 ** z;
  return [z, x, y].every(Number.isInteger) && z >= 0 && z <= 22 && x >= 0 && x < n && y >= 0 && y < n;
}

/** A box grown by a share of its own size on every side (room around an area on a screen). */
export function padBbox([w, s, e, n]: Bbox, share: number): Bbox {
  const dx = (e - w) * share;
  const dy = (n - s) * share;
  return [w - dx, Math.max(-MAX_LAT, s - dy), e + dx, Math.min(MAX_LAT, n + dy)];
}

/** Every tile that covers the box, zoom by zoom from minZoom to maxZoom. */
export function tilesForBbox([w, s, e, n]: Bbox, minZoom: number, maxZoom: number): Tile[] {
  const tiles: Tile[] = [];
  for (let z = minZoom; z <= maxZoom; z++) {
    const a = tileAt(w, n, z);
    const b = tileAt(e, s, z);
    for (let x = a.x; x <= b.x; x++) for (let y = a.y; y <= b.y; y++) tiles.push({ z, x, y });
  }
  return tiles;
}

/** The tile address from a template with {z}, {x} and {y} (and {s}, {r} left out). */
export function tileUrl(template: string, { z, x, y }: Tile): string {
  return template
    .replace("{z}", String(z))
    .replace("{x}", String(x))
    .replace("{y}", String(y))
    .replace("{r}", "")
    .replace("{s}.", "");
}

/** The bounding box of any nested GeoJSON coordinates. */
export function bboxOfPositions(positions: number[][]): Bbox | null {
  let [w, s, e, n] = [Infinity, Infinity, -Infinity, -Infinity];
  for (const [lon, lat] of positions) {
    if (!Number.isFinite(lon) || !Number.isFinite(lat)) continue;
    w = Math.min(w, lon!);
    e = Math.max(e, lon!);
    s = Math.min(s, lat!);
    n = Math.max(n, lat!);
  }
  return Number.isFinite(w) ? [w, s, e, n] : null;
}
