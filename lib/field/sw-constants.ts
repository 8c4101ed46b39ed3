// Names shared by the service worker (lib/field/sw.ts) and the pages.
export const SYNC_TAG = "ecotone-outbox";
export const PAGE_CACHE = "ecotone-field-pages";
export const LAST_LOCALE_KEY = "/__ecotone/field-locale";
export const CHANGE_CHANNEL = "ecotone-field";
