import type { SessionRecord, SightingRecord } from "@/lib/sync/records";
import type { EventPack as ServerPack, PackSpecies as ServerSpecies } from "@/db/queries/pack";
import type { DeviceState, ReviewState } from "@/lib/domain";

// What the device keeps in IndexedDB. Every record goes to the outbox first and is sent
// later; its device state (design.md "Words") says where it is on that way.
export type { DeviceState, ReviewState } from "@/lib/domain";

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

// The event pack as the server sends it (GET /api/events/{id}/pack, db/queries/pack.ts).

export type PackSpecies = ServerSpecies;
export type { ZoneCollection, ZoneFeature } from "@/lib/geo/areal";
export type EventPack = ServerPack;
export type StoredPack = { eventId: string; etag: string | null; pack: EventPack; fetchedAt: number };

/** One of the person's own sightings as the server has it (GET …/sightings/mine). */
export type MineItem = {
  id: string;
  reviewState: ReviewState;
  version: number;
  question?: string | null;
  taxonId?: string | null;
  count?: number;
  observedAt?: string;
};
export type StoredMine = { eventId: string; fetchedAt: number; items: MineItem[] };

/** Events the person may record in, as the field log page last listed them. */
export type KnownEvent = { id: string; name: string; timeZone: string; startsAt: string; endsAt: string; status: string };
