import L from "leaflet";
import type { ArealGeometry } from "@/lib/geo/areal";
import { polygonsOf } from "@/lib/geo/areal";

// Shared pieces of our Leaflet maps (loaded only with a map on screen; see real-map.tsx).

export type BaseTexts = { zoomIn: string; zoomOut: string; attribution: string };

/** A map with our tile layer, translated zoom buttons and no external links or default icons. */
export function createBaseMap(
  el: HTMLElement,
  tileUrl: string,
  texts: BaseTexts,
  onTiles?: (ok: boolean) => void,
): { map: L.Map; tiles: L.TileLayer } {
  const map = L.map(el, { zoomControl: false, attributionControl: true, zoomSnap: 0.5 });
  map.attributionControl.setPrefix(false);
  L.control.zoom({ zoomInTitle: texts.zoomIn, zoomOutTitle: texts.zoomOut }).addTo(map);
  const tiles = L.tileLayer(tileUrl, {
    // CORS, so the service worker can keep the tiles for offline use and count their size.
    crossOrigin: "anonymous",
    maxZoom: 19,
    attribution: texts.attribution,
  }).addTo(map);
  if (onTiles) {
    // Once the visible tiles are done (loaded or failed): were there any at all?
    let loaded = 0;
    tiles.on("tileload", () => loaded++);
    tiles.on("load", () => onTiles(loaded > 0));
  }
  return { map, tiles };
}

/** Leaflet's [lat, lng] rings of a GeoJSON Polygon or MultiPolygon. */
export function latLngsOf(g: ArealGeometry): L.LatLngExpression[][][] {
  return polygonsOf(g).map((rings) => rings.map((ring) => ring.map((p) => [p[1]!, p[0]!] as [number, number])));
}

export const COLOURS = {
  ink: "#153a2a",
  area: "#153a2a",
  record: "#b3261e",
  here: "#1d5fa8",
  paper: "#f8f5ec",
  sensitive: "#7a4b00",
};
// Zone fills from the palette (reed and heath), in turn, as on the SVG zone map.
export const ZONE_FILLS = ["#76b08f", "#dfab55", "#a9cfb7", "#ebc98a", "#4f8f6b", "#c98f2f"];

/** Ground metres of one screen pixel at a latitude and zoom (Web Mercator; from memory). */
export function metresPerPixel(lat: number, zoom: number): number {
  return (40_075_016.686 * Math.cos((lat * Math.PI) / 180)) / 2 ** (zoom + 8);
}
