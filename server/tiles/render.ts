import sharp from "sharp";
import { LANDSCAPE, type LandscapeFeature, type LandscapeKind } from "@/db/seed/landscape";
import { isValidTile, pixelInTile, TILE_SIZE, tileBbox, type Tile } from "@/lib/geo/tiles";

// Draws one raster tile of the demo's invented landscape (db/seed/landscape.ts): an SVG of
// the features that reach the tile, rendered to PNG by sharp, kept in memory. Used by the
// local tile fake only (scripts/tile-fake.mts); a deployment points MAP_TILE_URL elsewhere.

const LAND = "#eef0e2";
const FILL: Partial<Record<LandscapeKind, string>> = {
  wood: "#b9d3a8",
  water: "#a9cbe0",
  heath: "#dcc8d8",
  pasture: "#e4ecc4",
};
const STROKE: Partial<Record<LandscapeKind, { colour: string; width: number; dash?: string }>> = {
  path: { colour: "#9a6b3f", width: 1.5, dash: "5 3" },
  track: { colour: "#ffffff", width: 3.5 },
  stream: { colour: "#5d9cc4", width: 2 },
};

function positionsOf(f: LandscapeFeature): number[][] {
  return f.geometry.type === "Polygon" ? f.geometry.coordinates.flat() : f.geometry.coordinates;
}

function touches(f: LandscapeFeature, [w, s, e, n]: [number, number, number, number]): boolean {
  const ps = positionsOf(f);
  const lons = ps.map((p) => p[0]!);
  const lats = ps.map((p) => p[1]!);
  return Math.min(...lons) <= e && Math.max(...lons) >= w && Math.min(...lats) <= n && Math.max(...lats) >= s;
}

/** The SVG of one tile (exported for tests of what is drawn). */
export function tileSvg(tile: Tile): string {
  const box = tileBbox(tile);
  // A margin of a quarter of the tile keeps lines that only pass near the edge.
  const [w, s, e, n] = box;
  const grown: [number, number, number, number] = [w - (e - w) / 4, s - (n - s) / 4, e + (e - w) / 4, n + (n - s) / 4];
  const scale = Math.max(0.6, Math.min(3, 2 ** (tile.z - 15)));
  const d = (coords: number[][]) =>
    coords
      .map((p, i) => {
        const [x, y] = pixelInTile(p[0]!, p[1]!, tile);
        return `${i === 0 ? "M" : "L"}${x.toFixed(1)} ${y.toFixed(1)}`;
      })
      .join("");
  const shapes = LANDSCAPE.features.filter((f) => touches(f, grown));
  const areas = shapes
    .filter((f) => f.geometry.type === "Polygon")
    .map((f) => {
      const rings = (f.geometry.coordinates as number[][][]).map((r) => `${d(r)}Z`).join("");
      return `<path d="${rings}" fill="${FILL[f.properties.kind] ?? LAND}" fill-rule="evenodd"/>`;
    });
  const lines = shapes
    .filter((f) => f.geometry.type === "LineString")
    .map((f) => {
      const st = STROKE[f.properties.kind] ?? { colour: "#777", width: 1 };
      return `<path d="${d(f.geometry.coordinates as number[][])}" fill="none" stroke="${st.colour}" stroke-width="${(st.width * scale).toFixed(2)}" stroke-linecap="round" stroke-linejoin="round"${st.dash ? ` stroke-dasharray="${st.dash}"` : ""}/>`;
    });
  return (
    `<svg xmlns="http://www.w3.org/2000/svg" width="${TILE_SIZE}" height="${TILE_SIZE}" viewBox="0 0 ${TILE_SIZE} ${TILE_SIZE}">` +
    `<rect width="${TILE_SIZE}" height="${TILE_SIZE}" fill="${LAND}"/>${areas.join("")}${lines.join("")}</svg>`
  );
}

const cache = new Map<string, Promise<Buffer>>();
const CACHE_MAX = 5000; // tiles kept in memory (a few KB each)

/** The PNG of a tile, rendered once and kept in memory; null for a tile outside the world. */
export function renderTile(tile: Tile): Promise<Buffer> | null {
  if (!isValidTile(tile)) return null;
  const key = `${tile.z}/${tile.x}/${tile.y}`;
  let png = cache.get(key);
  if (!png) {
    if (cache.size >= CACHE_MAX) cache.delete(cache.keys().next().value!);
    png = sharp(Buffer.from(tileSvg(tile)))
      .png({ compressionLevel: 9, palette: true })
      .toBuffer();
    cache.set(key, png);
    png.catch(() => cache.delete(key));
  }
  return png;
}
