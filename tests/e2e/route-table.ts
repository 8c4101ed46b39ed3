// Every route handler, with who may call it. The role-matrix browser test walks this
// table with every kind of person; tests/unit/route-table.test.ts fails when a handler
// exists in app/api that is missing here. Add a row with every new handler.

export type Who = "anonymous" | "volunteer" | "coordinator" | "birdsCoordinator" | "organiser" | "outsider";
export const EVERYONE: Who[] = ["anonymous", "volunteer", "coordinator", "birdsCoordinator", "organiser", "outsider"];
export const SIGNED_IN: Who[] = ["volunteer", "coordinator", "birdsCoordinator", "organiser", "outsider"];
export const EVENT_MEMBERS: Who[] = ["volunteer", "coordinator", "birdsCoordinator", "organiser"];
export const COORDINATORS: Who[] = ["coordinator", "birdsCoordinator", "organiser"];
export const ORGANISERS: Who[] = ["organiser"];

/** Ids of the demo rows the paths need, read from the seeded database by the test. */
export type Ids = { eventId: string; organisationId: string; sightingId: string; birdSightingId: string; volunteerId: string };

export type RouteCase = {
  file: string; // app/api/.../route.ts
  method: "GET" | "POST" | "PUT" | "PATCH" | "DELETE";
  path: (ids: Ids) => string;
  body?: (ids: Ids) => unknown;
  allowed: Who[];
  note?: string;
};

// A realistic field log batch, so that the fuzz test mutates every field of a record.
const SYNC_BODY = {
  sessions: [{ id: "0d6f3a52-8b1e-4c7d-a9f0-3e2b1c4d5a6f", zoneId: null, kind: "walk", startedAt: "2026-06-20T08:00:00Z", endedAt: "2026-06-20T09:00:00Z", allSpeciesNoted: true, distanceM: 1200, notes: "" }],
  sightings: [{
    id: "7e1c2b3a-4d5e-4f60-8a9b-0c1d2e3f4a5b", sessionId: "0d6f3a52-8b1e-4c7d-a9f0-3e2b1c4d5a6f", taxonId: null, description: "small brown moth", count: 1,
    countIsEstimate: false, observedAt: "2026-06-20T08:30:00Z", latitude: 51.5, longitude: -1.5, accuracyM: 10, zoneId: null, notes: "", photoIds: [],
  }],
};

export const ROUTES: RouteCase[] = [
  { file: "app/api/health/route.ts", method: "GET", path: () => "/api/health", allowed: EVERYONE, note: "public: load balancers poll it" },
  { file: "app/api/health/route.ts", method: "POST", path: () => "/api/health", allowed: EVERYONE, note: "405 for everyone" },
  { file: "app/api/health/route.ts", method: "PUT", path: () => "/api/health", allowed: EVERYONE, note: "405 for everyone" },
  { file: "app/api/health/route.ts", method: "PATCH", path: () => "/api/health", allowed: EVERYONE, note: "405 for everyone" },
  { file: "app/api/health/route.ts", method: "DELETE", path: () => "/api/health", allowed: EVERYONE, note: "405 for everyone" },
  { file: "app/api/[...path]/route.ts", method: "GET", path: () => "/api/no-such-thing", allowed: EVERYONE, note: "404 for everyone" },
  { file: "app/api/[...path]/route.ts", method: "POST", path: () => "/api/no-such-thing", allowed: EVERYONE, note: "404 for everyone" },
  { file: "app/api/[...path]/route.ts", method: "PUT", path: () => "/api/no-such-thing", allowed: EVERYONE, note: "404 for everyone" },
  { file: "app/api/[...path]/route.ts", method: "PATCH", path: () => "/api/no-such-thing", allowed: EVERYONE, note: "404 for everyone" },
  { file: "app/api/[...path]/route.ts", method: "DELETE", path: () => "/api/no-such-thing", allowed: EVERYONE, note: "404 for everyone" },
  { file: "app/api/auth/[...nextauth]/route.ts", method: "GET", path: () => "/api/auth/providers", allowed: EVERYONE, note: "public: how a session starts" },
  { file: "app/api/auth/[...nextauth]/route.ts", method: "POST", path: () => "/api/auth/_log", allowed: EVERYONE, note: "public: how a session starts" },
  { file: "app/api/account/password/route.ts", method: "PUT", path: () => "/api/account/password", body: () => ({ password: "short" }), allowed: SIGNED_IN },
  { file: "app/api/events/[eventId]/sync/route.ts", method: "POST", path: (i) => `/api/events/${i.eventId}/sync`, body: () => SYNC_BODY, allowed: EVENT_MEMBERS, note: "each member sends their own records; the demo event is closed, so every record is refused" },
  { file: "app/api/events/[eventId]/pack/route.ts", method: "GET", path: (i) => `/api/events/${i.eventId}/pack`, allowed: EVENT_MEMBERS, note: "the field log's offline event pack" },
  { file: "app/api/events/[eventId]/photos/route.ts", method: "POST", path: (i) => `/api/events/${i.eventId}/photos`, body: (i) => ({ id: "5b7c8f0e-2d1a-4c3b-9e8f-7a6b5c4d3e2f", sightingId: i.sightingId, contentType: "image/jpeg", sizeBytes: 1000, sha256: "0".repeat(64), width: 40, height: 30 }), allowed: EVENT_MEMBERS, note: "presigned upload of a photo of one's own sighting (422 here: not the caller's)" },
  { file: "app/api/events/[eventId]/photos/[photoId]/confirm/route.ts", method: "POST", path: (i) => `/api/events/${i.eventId}/photos/${i.sightingId}/confirm`, allowed: EVENT_MEMBERS, note: "422 for members: nothing uploaded under that id" },
  { file: "app/api/events/[eventId]/photos/[photoId]/route.ts", method: "GET", path: (i) => `/api/events/${i.eventId}/photos/${i.sightingId}?size=thumb`, allowed: EVENT_MEMBERS, note: "404 for members: no such photo; author and reviewers see real ones" },
  { file: "app/api/events/[eventId]/sightings/mine/route.ts", method: "GET", path: (i) => `/api/events/${i.eventId}/sightings/mine`, allowed: EVENT_MEMBERS, note: "only the caller's own sightings" },
];
