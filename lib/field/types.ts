import type { MySighting } from "@/lib/sync/mine";
import type { EventPack } from "@/lib/sync/pack";
import type { DeviceState } from "@/lib/domain";
import type { ReviewState, SessionRecord, SightingRecord } from "@/lib/sync/records";

// The server's half of what the phone keeps (records, pack, review states) is the sync
// contract in lib/sync; re-exported here for the field log's screens.
export type { ArealGeometry, EventPack, PackSpecies, ZoneCollection, ZoneFeature } from "@/lib/sync/pack";
export type { ReviewState } from "@/lib/sync/records";

// What the device keeps in IndexedDB. Every record goes to the outbox first and is sent
// later; its device state (design.md "Words") says where it is on that way.
export type { DeviceState } from "@/lib/domain";

/** Why the last try did not go through, when it was not the record's fault. */
export type TransientProblem = "offline" | "server" | "signin" | "busy";

type Outboxed = {
  id: string;
  eventId: string;
  state: DeviceState;
  rev: number; // bumped on every local edit
  sendingRev?: number; // the rev that went out in the batch now in flight
  attempts: number; // failed tries in a row (for the back-off)
  nextTryAt: number; // epoch ms; 0 = as soon as possible
  problem?: TransientProblem; // last transient problem, shown while waiting
  reason?: string; // translated by the server, when refused (state "failed")
  field?: string; // the field at fault, when refused
  savedAt: number;
  sentAt?: number;
};

export type LocalSession = Outboxed & { kind: "session"; record: SessionRecord };
export type LocalSighting = Outboxed & {
  kind: "sighting";
  record: SightingRecord;
  taxonLabel: string; // the name shown in lists, as chosen on the device
  reviewState?: ReviewState;
  serverVersion?: number;
  question?: string; // a coordinator's question, for returned sightings
  rejectionReason?: string; // the coordinator's reason (a REJECT_REASONS code, maybe with text), for rejected ones
  withdrawn?: boolean; // withdrawn by the volunteer (the server keeps it as rejected)
};
export type LocalRecord = LocalSession | LocalSighting;

export type LocalPhoto = {
  id: string;
  eventId: string;
  sightingId: string;
  blob: Blob;
  contentType: "image/jpeg" | "image/png" | "image/webp";
  sizeBytes: number;
  sha256: string;
  width: number;
  height: number;
  state: DeviceState;
  attempts: number;
  nextTryAt: number;
  problem?: TransientProblem;
  reason?: string;
  savedAt: number;
  sentAt?: number;
};

// The event pack as last downloaded, with its ETag.
export type StoredPack = { eventId: string; etag: string | null; pack: EventPack; fetchedAt: number };

/** One of the person's own sightings as the server has it (GET …/sightings/mine), the parts the phone keeps. */
export type MineItem = Pick<
  MySighting,
  "id" | "reviewState" | "version" | "question" | "taxonId" | "count" | "observedAt" | "rejectionReason" | "withdrawn"
>;
export type StoredMine = { eventId: string; fetchedAt: number; items: MineItem[] };

/** Events the person may record in, as the field log page last listed them. */
export type KnownEvent = {
  id: string;
  name: string;
  timeZone: string;
  startsAt: string;
  endsAt: string;
  status: string;
  reviewClosesAt: string; // answers and corrections are taken until then (lib/time/review-period.ts)
};
