import "server-only";
import type { MapSettings } from "@/lib/geo/tiles";
import { env } from "@/lib/env";

/** The base map's settings for a page that shows a map (read at request time). */
export function mapSettings(): MapSettings {
  const e = env();
  return { tileUrl: e.MAP_TILE_URL, attribution: e.MAP_TILE_ATTRIBUTION };
}
