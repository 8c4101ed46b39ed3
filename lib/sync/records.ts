import { z } from "zod";
import { SESSION_KINDS, type ReviewState } from "@/lib/domain";
import { freeText } from "@/lib/validation/text";

// The field log's sync batch: the one contract between the device (lib/field, IndexedDB
// outbox) and the server (the sync route handler). Ids are made on the device (uuid v4),
// so a resent batch is harmless: the server answers each record on its own.
//
// The device validates every record with these same schemas before it is queued, and the
// server validates again; a record that fails is refused alone with a translated reason,
// and the rest of the batch is stored.

import { MAX_BATCH_RECORDS } from "./limits";
export { MAX_BATCH_RECORDS };

/** A sighting's review state, as the server tells the phone (acknowledgements, "mine"). */
export type { ReviewState };

const isoInstant = z.iso.datetime({ offset: true });
const text = (max: number) => freeText().max(max).default(""); // no NUL: PostgreSQL text cannot hold it

export const sessionRecord = z
  .object({
    id: z.uuid(),
    zoneId: z.uuid().nullable(),
    kind: z.enum(SESSION_KINDS),
    startedAt: isoInstant,
    endedAt: isoInstant.nullable(),
    allSpeciesNoted: z.boolean(), // the full-list answer ("Is this session's list full?"); true only once ended
    distanceM: z.number().finite().min(0).max(100_000).nullable(), // walks
    notes: text(2000),
    // Cancelled by its volunteer: the server removes the session and keeps its sightings,
    // outside any session. A cancelled session that never reached the server is not sent.
    cancelled: z.boolean().optional(),
  })
  .strict();
export type SessionRecord = z.infer<typeof sessionRecord>;

export const sightingRecord = z
  .object({
    id: z.uuid(),
    sessionId: z.uuid().nullable(),
    taxonId: z.uuid().nullable(), // null: unidentified, then description is required
    description: text(2000),
    count: z.number().int().min(1), // the upper limit is a rule with its own reason (lib/sync/rules.ts MAX_COUNT)
    countIsEstimate: z.boolean(), // "about"
    observedAt: isoInstant,
    latitude: z.number().finite().min(-90).max(90),
    longitude: z.number().finite().min(-180).max(180),
    accuracyM: z.number().finite().min(0).max(100_000),
    zoneId: z.uuid().nullable(), // the device's guess (point in polygon); the server decides with PostGIS
    notes: text(2000),
    photoIds: z.array(z.uuid()).max(10).default([]), // photos follow through the photo handlers
    // A returned sighting edited and resent: the version the volunteer edited and their answer.
    answer: z
      .object({ toVersion: z.number().int().min(1), message: freeText().min(1).max(2000) })
      .strict()
      .optional(),
    // A sent sighting corrected by its volunteer (pending, returned or approved): the version
    // they corrected. The server keeps the previous values and sends the record back to review.
    correction: z
      .object({ toVersion: z.number().int().min(1) })
      .strict()
      .optional(),
    // A sent sighting withdrawn by its volunteer (pending or returned): it leaves the results.
    withdrawal: z
      .object({ toVersion: z.number().int().min(1) })
      .strict()
      .optional(),
  })
  .strict();
export type SightingRecord = z.infer<typeof sightingRecord>;

export const syncBatch = z
  .object({
    sessions: z.array(z.unknown()).max(MAX_BATCH_RECORDS).default([]),
    sightings: z.array(z.unknown()).max(MAX_BATCH_RECORDS).default([]),
  })
  .strict()
  .refine((b) => b.sessions.length + b.sightings.length <= MAX_BATCH_RECORDS, {
    message: "too_many_records",
    path: ["sightings"],
  });
// Records are arrays of unknown at the batch level on purpose: each record is parsed on its
// own with sessionRecord / sightingRecord, so one bad record never refuses its neighbours.
export type SyncBatch = z.infer<typeof syncBatch>;
