// Names shared by the service worker (lib/field/sw.ts) and the pages.
export const SYNC_TAG = "ecotone-outbox";
export const PAGE_CACHE = "ecotone-field-pages";
export const LAST_LOCALE_KEY = "/__ecotone/field-locale";
export const CHANGE_CHANNEL = "ecotone-field";
/** The base map's tiles kept for offline use (lib/field/tiles.ts fills it; the worker answers from it). */
export const TILE_CACHE = "ecotone-map-tiles";
/** Tile addresses: …/{z}/{x}/{y}.png (or .jpg, .webp), whatever the tile server. */
export const TILE_PATH = /\/\d{1,2}\/\d{1,7}\/\d{1,7}(@2x)?\.(png|jpe?g|webp)$/;
