// The reasons a coordinator picks from when rejecting a sighting (free text may follow).
// Stored in reviews.reason as these codes; shown translated (messages: ReviewDesk.reasons).
export const REJECT_REASONS = ["misidentified", "duplicate", "outside_event", "insufficient_evidence", "other"] as const;
export type RejectReason = (typeof REJECT_REASONS)[number];

/** The desk's keyboard: one place, shown on screen and used by the key handler. */
export const DESK_KEYS = {
  next: "j", previous: "k", approve: "a", reject: "r", returnWithQuestion: "q", reidentify: "i", bulk: "b", help: "?",
} as const;
