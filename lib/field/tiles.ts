import {
  tilesForBbox,
  tileUrl,
  padBbox,
  OFFLINE_MAX_ZOOM,
  OFFLINE_MIN_ZOOM,
  bboxOfPositions,
  type Bbox,
} from "@/lib/geo/tiles";
import { polygonsOf, type ArealGeometry } from "@/lib/geo/areal";
import { TILE_CACHE } from "./sw-constants";

// The base map of an event kept for use without a network: every tile over the event's area
// (with a margin) from zoom 13 to 17, fetched by the page into the Cache Storage that the
// service worker answers tile requests from (lib/field/sw.ts).

export type TileStore = { total: number; kept: number; bytes: number };

/** The tiles of an area (its zones when it has no area of its own) that the field log keeps. */
export function offlineTileUrls(template: string, shapes: ArealGeometry[]): string[] {
  const box = bboxOfPositions(shapes.flatMap((g) => polygonsOf(g).flat(2)));
  if (!box) return [];
  // Half the area again on each side: the screen around the area's edge.
  const grown: Bbox = padBbox(box, 0.5);
  return tilesForBbox(grown, OFFLINE_MIN_ZOOM, OFFLINE_MAX_ZOOM).map((t) => tileUrl(template, t));
}

async function sizeOf(res: Response): Promise<number> {
  const length = Number(res.headers.get("content-length"));
  return Number.isFinite(length) && length > 0 ? length : (await res.blob()).size;
}

/** What is kept now: how many of the area's tiles, and their bytes. */
export async function tileStoreStatus(urls: string[]): Promise<TileStore> {
  if (typeof caches === "undefined") return { total: urls.length, kept: 0, bytes: 0 };
  const cache = await caches.open(TILE_CACHE);
  let kept = 0;
  let bytes = 0;
  for (const url of urls) {
    const res = await cache.match(url);
    if (res) {
      kept++;
      bytes += await sizeOf(res);
    }
  }
  return { total: urls.length, kept, bytes };
}

/**
 * Fetches the tiles not kept yet, a few at a time, and reports progress. A failed tile is left
 * for the next time; the count says how many are kept.
 */
export async function keepTiles(urls: string[], onProgress?: (s: TileStore) => void): Promise<TileStore> {
  if (typeof caches === "undefined") return { total: urls.length, kept: 0, bytes: 0 };
  const cache = await caches.open(TILE_CACHE);
  let kept = 0;
  let bytes = 0;
  const queue = [...urls];
  const worker = async () => {
    for (let url = queue.shift(); url; url = queue.shift()) {
      let res = await cache.match(url);
      if (!res) {
        try {
          const fresh = await fetch(url, { mode: "cors", credentials: "omit" });
          if (fresh.ok) {
            await cache.put(url, fresh.clone());
            res = fresh;
          }
        } catch {
          // Offline or the tile server away: tried again next time.
        }
      }
      if (res) {
        kept++;
        bytes += await sizeOf(res);
      }
      onProgress?.({ total: urls.length, kept, bytes });
    }
  };
  await Promise.all([worker(), worker(), worker(), worker()]);
  return { total: urls.length, kept, bytes };
}
