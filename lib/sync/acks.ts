import type { ReviewState } from "./records";

// The server's answer to a sync batch: one acknowledgement per record, in batch order
// (sessions, then sightings). The phone (lib/field/outbox.ts) reads only these; the server
// builds them in server/sync/answer.ts from the data layer's outcome codes.

export type SyncOutcome = "created" | "already_had" | "updated" | "refused";

/**
 * Why the server refused one record. The data layer (db/queries/sync.ts) answers with these
 * codes; the handler translates each into FieldSync.reason.<code> in the person's language.
 * The phone judges by the same rules at save (lib/sync/rules.ts) and shows the same text.
 */
export const REFUSAL_CODES = [
  "event_not_open",
  "unknown_taxon",
  "unknown_zone",
  "kind_not_allowed",
  "ends_before_start",
  "complete_needs_end",
  "unknown_session",
  "description_required",
  "future_time",
  "count_too_high",
  "outside_session",
  "id_taken",
  "changed_after_send",
  "not_returned",
  "stale_version",
  "not_correctable",
  "not_withdrawable",
  "store_failed",
] as const;
export type RefusalCode = (typeof REFUSAL_CODES)[number];

/** One record's outcome as the data layer sees it: codes, never text. */
export type RecordOutcome =
  | { outcome: "created" | "already_had" | "updated"; reviewState?: ReviewState }
  | { outcome: "refused"; code: RefusalCode; field: string; values?: Record<string, string | number> };

/** Which record of the batch an outcome or acknowledgement is about. */
export type RecordRef = {
  kind: "session" | "sighting";
  id: string | null; // null only when a refused record had no readable id
  index: number; // position in its array in the batch
};

export type SyncAck = RecordRef & {
  outcome: SyncOutcome;
  reason?: string; // translated, for refused records
  field?: string; // the field at fault, for refused records
  reviewState?: ReviewState;
};
export type SyncResponse = { acks: SyncAck[] };
