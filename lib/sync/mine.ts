import type { ReviewState } from "./records";

// The person's own sightings at one event (GET /api/events/{eventId}/sightings/mine), with
// their review states: the field log's "sent" list. Built by db/queries/my-sightings.ts.

export type MySighting = {
  id: string;
  version: number;
  reviewState: ReviewState;
  taxonId: string | null;
  scientificName: string | null;
  description: string;
  count: number;
  countIsEstimate: boolean;
  observedAt: string;
  latitude: number;
  longitude: number;
  accuracyM: number;
  zoneId: string | null;
  sessionId: string | null;
  notes: string;
  photoIds: string[];
  question: string | null; // the latest message of a decision to 'returned', while the sighting is returned
  rejectionReason: string | null; // the reason of the latest decision to 'rejected', while it is rejected
  withdrawn: boolean; // withdrawn by the volunteer (kept as rejected, reason "withdrawn")
  updatedAt: string;
};

export type MineResponse = { sightings: MySighting[] };
