// Limits of the sync contract that the phone's sending side needs without the record
// schemas (the service worker stays free of the validation library: lib/field/sw.ts).

/** At most this many records (sessions and sightings together) in one sync batch. */
export const MAX_BATCH_RECORDS = 100;
