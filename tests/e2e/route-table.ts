// Every route handler, with who may call it. The role-matrix browser test walks this
// table with every kind of person; tests/unit/route-table.test.ts fails when a handler
// exists in app/api that is missing here. Add a row with every new handler.

// "admin" is the site admin (users.is_admin): every event role passes for them (server/auth/guard.ts).
export type Who =
  "anonymous" | "volunteer" | "coordinator" | "birdsCoordinator" | "organiser" | "outsider" | "admin" | ApiTokenHolder;
// Callers of the read-only API (issue 19), without a session: a token of the demo event, one
// of its whole organisation, one of another event of that organisation, one of another
// organisation's event (tests/e2e/api-tokens.ts makes them).
export type ApiTokenHolder = "eventToken" | "organisationToken" | "otherEventToken" | "otherOrganisationToken";
export const TOKEN_HOLDERS: ApiTokenHolder[] = [
  "eventToken",
  "organisationToken",
  "otherEventToken",
  "otherOrganisationToken",
];
export const EVERYONE: Who[] = [
  "anonymous",
  "volunteer",
  "coordinator",
  "birdsCoordinator",
  "organiser",
  "outsider",
  "admin",
  ...TOKEN_HOLDERS,
];
export const SIGNED_IN: Who[] = ["volunteer", "coordinator", "birdsCoordinator", "organiser", "outsider", "admin"];
export const EVENT_MEMBERS: Who[] = ["volunteer", "coordinator", "birdsCoordinator", "organiser", "admin"];
export const COORDINATORS: Who[] = ["coordinator", "birdsCoordinator", "organiser", "admin"];
export const ORGANISERS: Who[] = ["organiser", "admin"];
export const ADMINS: Who[] = ["admin"];

/** Ids of the demo rows the paths need, read from the seeded database by the test. */
export type Ids = {
  eventId: string;
  organisationId: string;
  sightingId: string;
  birdSightingId: string;
  volunteerId: string;
  // The draft event of the setup screens, a member there to change, an open invitation, its join code.
  setupEventId: string;
  setupMemberId: string;
  setupInvitationId: string;
  setupJoinCode: string;
  // A token of the draft event that the organiser's DELETE revokes (tests/e2e/api-tokens.ts).
  setupApiTokenId: string;
};

export type RouteCase = {
  file: string; // app/api/.../route.ts
  method: "GET" | "POST" | "PUT" | "PATCH" | "DELETE";
  path: (ids: Ids) => string;
  body?: (ids: Ids) => unknown;
  allowed: Who[];
  note?: string;
  /** "token": a read-only API handler; callers without a token get 401 whatever their session. */
  auth?: "token";
  /** The one status every caller gets (the 405 of a method a handler refuses). */
  status?: number;
};

// A realistic field log batch, so that the fuzz test mutates every field of a record.
const SYNC_BODY = {
  sessions: [
    {
      id: "0d6f3a52-8b1e-4c7d-a9f0-3e2b1c4d5a6f",
      zoneId: null,
      kind: "walk",
      startedAt: "2026-06-20T08:00:00Z",
      endedAt: "2026-06-20T09:00:00Z",
      allSpeciesNoted: true,
      distanceM: 1200,
      notes: "",
    },
  ],
  sightings: [
    {
      id: "7e1c2b3a-4d5e-4f60-8a9b-0c1d2e3f4a5b",
      sessionId: "0d6f3a52-8b1e-4c7d-a9f0-3e2b1c4d5a6f",
      taxonId: null,
      description: "small brown moth",
      count: 1,
      countIsEstimate: false,
      observedAt: "2026-06-20T08:30:00Z",
      latitude: 51.5,
      longitude: -1.5,
      accuracyM: 10,
      zoneId: null,
      notes: "",
      photoIds: [],
    },
  ],
};

export const ROUTES: RouteCase[] = [
  {
    file: "app/api/health/route.ts",
    method: "GET",
    path: () => "/api/health",
    allowed: EVERYONE,
    note: "public: load balancers poll it",
  },
  {
    file: "app/api/health/route.ts",
    method: "POST",
    path: () => "/api/health",
    allowed: EVERYONE,
    note: "405 for everyone",
  },
  {
    file: "app/api/health/route.ts",
    method: "PUT",
    path: () => "/api/health",
    allowed: EVERYONE,
    note: "405 for everyone",
  },
  {
    file: "app/api/health/route.ts",
    method: "PATCH",
    path: () => "/api/health",
    allowed: EVERYONE,
    note: "405 for everyone",
  },
  {
    file: "app/api/health/route.ts",
    method: "DELETE",
    path: () => "/api/health",
    allowed: EVERYONE,
    note: "405 for everyone",
  },
  {
    file: "app/api/[...path]/route.ts",
    method: "GET",
    path: () => "/api/no-such-thing",
    allowed: EVERYONE,
    note: "404 for everyone",
  },
  {
    file: "app/api/[...path]/route.ts",
    method: "POST",
    path: () => "/api/no-such-thing",
    allowed: EVERYONE,
    note: "404 for everyone",
  },
  {
    file: "app/api/[...path]/route.ts",
    method: "PUT",
    path: () => "/api/no-such-thing",
    allowed: EVERYONE,
    note: "404 for everyone",
  },
  {
    file: "app/api/[...path]/route.ts",
    method: "PATCH",
    path: () => "/api/no-such-thing",
    allowed: EVERYONE,
    note: "404 for everyone",
  },
  {
    file: "app/api/[...path]/route.ts",
    method: "DELETE",
    path: () => "/api/no-such-thing",
    allowed: EVERYONE,
    note: "404 for everyone",
  },
  {
    file: "app/api/auth/[...nextauth]/route.ts",
    method: "GET",
    path: () => "/api/auth/providers",
    allowed: EVERYONE,
    note: "public: how a session starts",
  },
  {
    file: "app/api/auth/[...nextauth]/route.ts",
    method: "POST",
    path: () => "/api/auth/_log",
    allowed: EVERYONE,
    status: 404,
    note: "next-auth's browser log endpoint is closed: no one writes lines into the server's log",
  },
  {
    file: "app/api/account/password/route.ts",
    method: "PUT",
    path: () => "/api/account/password",
    body: () => ({ password: "short" }),
    allowed: SIGNED_IN,
  },
  // A person's own data: only ever the caller's. The erasure body has a wrong confirmation, so no one is erased here.
  {
    file: "app/api/account/data/route.ts",
    method: "GET",
    path: () => "/api/account/data?format=json",
    allowed: SIGNED_IN,
  },
  {
    file: "app/api/account/published-name/route.ts",
    method: "PUT",
    path: () => "/api/account/published-name",
    body: () => ({ publishedName: "", consent: true }),
    allowed: SIGNED_IN,
  },
  {
    file: "app/api/account/route.ts",
    method: "DELETE",
    path: () => "/api/account",
    body: () => ({ confirm: "not-my-address@example.org" }),
    allowed: SIGNED_IN,
  },
  // Review desk: coordinators and organisers of the event; the birds coordinator is refused other groups' sightings.
  {
    file: "app/api/events/[eventId]/review/queue/route.ts",
    method: "GET",
    path: (i) => `/api/events/${i.eventId}/review/queue?state=pending&order=oldest`,
    allowed: COORDINATORS,
  },
  {
    file: "app/api/events/[eventId]/review/sightings/[sightingId]/route.ts",
    method: "GET",
    path: (i) => `/api/events/${i.eventId}/review/sightings/${i.sightingId}`,
    allowed: ["coordinator", "organiser", "admin"],
    note: "a non-bird sighting",
  },
  {
    file: "app/api/events/[eventId]/review/sightings/[sightingId]/route.ts",
    method: "GET",
    path: (i) => `/api/events/${i.eventId}/review/sightings/${i.birdSightingId}`,
    allowed: COORDINATORS,
  },
  {
    file: "app/api/events/[eventId]/review/sightings/[sightingId]/decisions/route.ts",
    method: "POST",
    path: (i) => `/api/events/${i.eventId}/review/sightings/${i.sightingId}/decisions`,
    body: () => ({ action: "approve", version: 999_999 }),
    allowed: ["coordinator", "organiser", "admin"],
    note: "a stale version: 409 for those allowed, so nothing changes",
  },
  {
    file: "app/api/events/[eventId]/review/sightings/[sightingId]/undo/route.ts",
    method: "POST",
    path: (i) => `/api/events/${i.eventId}/review/sightings/${i.sightingId}/undo`,
    body: () => ({ reviewId: 1, version: 999_999 }),
    allowed: ["coordinator", "organiser", "admin"],
    note: "a stale version: 409 for those allowed, so nothing is undone",
  },
  {
    file: "app/api/events/[eventId]/review/bulk-approve/route.ts",
    method: "GET",
    path: (i) => `/api/events/${i.eventId}/review/bulk-approve?state=pending&include=outside_area`,
    allowed: COORDINATORS,
  },
  {
    file: "app/api/events/[eventId]/review/bulk-approve/route.ts",
    method: "POST",
    path: (i) => `/api/events/${i.eventId}/review/bulk-approve`,
    body: () => ({ filters: { from: "2020-01-01", to: "2020-01-01" }, expectedCount: 1 }),
    allowed: COORDINATORS,
    note: "matches nothing: 409 for those allowed",
  },
  {
    file: "app/api/events/[eventId]/review/taxa/route.ts",
    method: "GET",
    path: (i) => `/api/events/${i.eventId}/review/taxa?q=robin`,
    allowed: COORDINATORS,
  },
  {
    file: "app/api/events/[eventId]/sync/route.ts",
    method: "POST",
    path: (i) => `/api/events/${i.eventId}/sync`,
    body: () => SYNC_BODY,
    allowed: EVENT_MEMBERS,
    note: "each member sends their own records; the demo event is closed, so every record is refused",
  },
  {
    file: "app/api/events/[eventId]/pack/route.ts",
    method: "GET",
    path: (i) => `/api/events/${i.eventId}/pack`,
    allowed: EVENT_MEMBERS,
    note: "the field log's offline event pack",
  },
  {
    file: "app/api/events/[eventId]/photos/route.ts",
    method: "POST",
    path: (i) => `/api/events/${i.eventId}/photos`,
    body: (i) => ({
      id: "5b7c8f0e-2d1a-4c3b-9e8f-7a6b5c4d3e2f",
      sightingId: i.sightingId,
      contentType: "image/jpeg",
      sizeBytes: 1000,
      sha256: "0".repeat(64),
      width: 40,
      height: 30,
    }),
    allowed: EVENT_MEMBERS,
    note: "presigned upload of a photo of one's own sighting (422 here: not the caller's)",
  },
  {
    file: "app/api/events/[eventId]/photos/[photoId]/confirm/route.ts",
    method: "POST",
    path: (i) => `/api/events/${i.eventId}/photos/${i.sightingId}/confirm`,
    allowed: EVENT_MEMBERS,
    note: "422 for members: nothing uploaded under that id",
  },
  {
    file: "app/api/events/[eventId]/photos/[photoId]/route.ts",
    method: "GET",
    path: (i) => `/api/events/${i.eventId}/photos/${i.sightingId}?size=thumb`,
    allowed: EVENT_MEMBERS,
    note: "404 for members: no such photo; author and reviewers see real ones",
  },
  {
    file: "app/api/events/[eventId]/sightings/mine/route.ts",
    method: "GET",
    path: (i) => `/api/events/${i.eventId}/sightings/mine`,
    allowed: EVENT_MEMBERS,
    note: "only the caller's own sightings",
  },
  {
    file: "app/api/events/[eventId]/results/route.ts",
    method: "GET",
    path: (i) => `/api/events/${i.eventId}/results`,
    allowed: COORDINATORS,
  },
  {
    file: "app/api/events/[eventId]/live/route.ts",
    method: "GET",
    path: (i) => `/api/events/${i.eventId}/live`,
    allowed: COORDINATORS,
  },
  {
    file: "app/api/events/[eventId]/count-units/route.ts",
    method: "GET",
    path: (i) => `/api/events/${i.eventId}/count-units`,
    allowed: COORDINATORS,
  },
  {
    file: "app/api/events/[eventId]/count-units/route.ts",
    method: "PUT",
    path: (i) => `/api/events/${i.eventId}/count-units`,
    body: () => ({ group: "other", unit: "individuals" }),
    allowed: ORGANISERS,
    note: "sets the default again: results unchanged",
  },
  {
    file: "app/api/events/[eventId]/reports/route.ts",
    method: "GET",
    path: (i) => `/api/events/${i.eventId}/reports`,
    allowed: COORDINATORS,
  },
  {
    file: "app/api/events/[eventId]/reports/route.ts",
    method: "POST",
    path: (i) => `/api/events/${i.eventId}/reports`,
    allowed: ORGANISERS,
    note: "publishes a new report version (409 while sightings are pending, without confirmPending)",
  },
  {
    file: "app/api/events/[eventId]/reports/[version]/check/route.ts",
    method: "GET",
    path: (i) => `/api/events/${i.eventId}/reports/1/check`,
    allowed: COORDINATORS,
    note: "404 when no version 1 yet",
  },
  {
    file: "app/api/events/[eventId]/reports/[version]/withdraw/route.ts",
    method: "POST",
    path: (i) => `/api/events/${i.eventId}/reports/1/withdraw`,
    body: () => ({ reason: "" }),
    allowed: ORGANISERS,
    note: "an empty reason: 400 for those allowed (nothing withdrawn)",
  },
  {
    file: "app/api/reports/[reportId]/[file]/route.ts",
    method: "GET",
    path: () => "/api/reports/00000000-0000-0000-0000-000000000000/species.csv",
    allowed: EVERYONE,
    note: "public: published report downloads (404 for an unknown report)",
  },
];

// ---------------------------------------------------------------- event setup (issue 4)
// Aimed at the demo's draft event (SETUP_EVENT in db/seed/demo-scenario.ts), where the
// demo coordinators and volunteer2 hold roles too, so that the organiser's writes and the
// fuzz test never change the two demo events other tests read.
const newEventBody = () => ({
  name: "Role matrix foray",
  slug: "role-matrix-foray",
  description: "",
  startsLocal: "2027-05-01T08:00",
  endsLocal: "2027-05-01T18:00",
  timeZone: "Europe/London",
  languages: ["en"],
  sessionKinds: ["walk"],
  photoRequiredSensitive: true,
  photoRequiredOffList: false,
  accuracyLimitM: 50,
});
const square = (w: number, s: number, e: number, n: number) => [
  [
    [w, s],
    [e, s],
    [e, n],
    [w, n],
    [w, s],
  ],
];
const zonesBody = () => ({
  save: false,
  geojson: {
    type: "FeatureCollection",
    features: [
      {
        type: "Feature",
        properties: { kind: "area" },
        geometry: { type: "Polygon", coordinates: square(-1.82, 52.1, -1.8, 52.11) },
      },
      {
        type: "Feature",
        properties: { name: "Beech slope", habitat: "woodland" },
        geometry: { type: "Polygon", coordinates: square(-1.815, 52.102, -1.805, 52.108) },
      },
    ],
  },
});
ROUTES.push(
  {
    file: "app/api/organisations/[organisationId]/events/route.ts",
    method: "POST",
    path: (i) => `/api/organisations/${i.organisationId}/events`,
    body: newEventBody,
    allowed: ORGANISERS,
  },
  {
    file: "app/api/events/[eventId]/setup/route.ts",
    method: "GET",
    path: (i) => `/api/events/${i.setupEventId}/setup`,
    allowed: ORGANISERS,
  },
  {
    file: "app/api/events/[eventId]/setup/route.ts",
    method: "PATCH",
    path: (i) => `/api/events/${i.setupEventId}/setup`,
    body: () => {
      const { slug: _slug, ...fields } = newEventBody();
      return { ...fields, name: "Harrowmere Vale Autumn Fungus Foray", status: "draft" };
    },
    allowed: ORGANISERS,
  },
  {
    file: "app/api/events/[eventId]/setup/zones/route.ts",
    method: "GET",
    path: (i) => `/api/events/${i.setupEventId}/setup/zones`,
    allowed: ORGANISERS,
  },
  {
    file: "app/api/events/[eventId]/setup/zones/route.ts",
    method: "PUT",
    path: (i) => `/api/events/${i.setupEventId}/setup/zones`,
    body: zonesBody,
    allowed: ORGANISERS,
  },
  {
    file: "app/api/events/[eventId]/setup/species/route.ts",
    method: "GET",
    path: (i) => `/api/events/${i.setupEventId}/setup/species`,
    allowed: ORGANISERS,
  },
  {
    file: "app/api/events/[eventId]/setup/species/route.ts",
    method: "PUT",
    path: (i) => `/api/events/${i.setupEventId}/setup/species`,
    body: () => ({
      csv: "scientific_name,rank,taxon_group,common_name_en\nAmanita muscaria,species,fungi,Fly agaric\n",
      save: false,
    }),
    allowed: ORGANISERS,
  },
  {
    file: "app/api/events/[eventId]/setup/species/[taxonId]/route.ts",
    method: "DELETE",
    path: (i) => `/api/events/${i.setupEventId}/setup/species/00000000-0000-0000-0000-000000000000`,
    allowed: ORGANISERS,
    note: "a taxon not on the list: 404 for those allowed (nothing removed)",
  },
  {
    file: "app/api/events/[eventId]/paper-sheets/route.ts",
    method: "GET",
    path: (i) => `/api/events/${i.eventId}/paper-sheets`,
    allowed: COORDINATORS,
  },
  {
    file: "app/api/events/[eventId]/paper-sheets/route.ts",
    method: "PUT",
    path: (i) => `/api/events/${i.eventId}/paper-sheets`,
    body: () => ({ csv: "line_type,count\nsighting,1\n", save: false }),
    allowed: COORDINATORS,
    note: "checks only (save: false); the line has no place or time, so a coordinator gets the 422 report",
  },
  {
    file: "app/api/events/[eventId]/setup/members/route.ts",
    method: "GET",
    path: (i) => `/api/events/${i.setupEventId}/setup/members`,
    allowed: ORGANISERS,
  },
  {
    file: "app/api/events/[eventId]/setup/members/route.ts",
    method: "POST",
    path: (i) => `/api/events/${i.setupEventId}/setup/members`,
    body: () => ({ email: "matrix-invitee@example.org", name: "", role: "volunteer", taxonGroups: [], locale: "en" }),
    allowed: ORGANISERS,
  },
  {
    file: "app/api/events/[eventId]/setup/members/[userId]/route.ts",
    method: "PATCH",
    path: (i) => `/api/events/${i.setupEventId}/setup/members/${i.setupMemberId}`,
    body: () => ({ role: "volunteer", taxonGroups: [] }),
    allowed: ORGANISERS,
  },
  {
    file: "app/api/events/[eventId]/setup/members/[userId]/route.ts",
    method: "DELETE",
    path: (i) => `/api/events/${i.setupEventId}/setup/members/${i.setupMemberId}`,
    allowed: ORGANISERS,
    note: "removes volunteer5 from the draft event",
  },
  {
    file: "app/api/events/[eventId]/setup/invitations/[invitationId]/route.ts",
    method: "DELETE",
    path: (i) => `/api/events/${i.setupEventId}/setup/invitations/${i.setupInvitationId}`,
    allowed: ORGANISERS,
  },
  {
    file: "app/api/events/[eventId]/setup/join-code/route.ts",
    method: "POST",
    path: (i) => `/api/events/${i.setupEventId}/setup/join-code`,
    allowed: ORGANISERS,
  },
  {
    file: "app/api/join/route.ts",
    method: "POST",
    path: () => "/api/join",
    body: (i) => ({ code: i.setupJoinCode, locale: "en", publishedName: "Matrix walker", consent: true }),
    allowed: EVERYONE,
    note: "public: a join link; without a session it only mails a sign-in link",
  },
  // Organisations that start on their own (issue 19).
  {
    file: "app/api/organisation-requests/route.ts",
    method: "GET",
    path: () => `/api/organisation-requests`,
    allowed: SIGNED_IN,
  },
  {
    file: "app/api/organisation-requests/route.ts",
    method: "POST",
    path: () => `/api/organisation-requests`,
    body: () => ({ name: "" }),
    allowed: SIGNED_IN,
    note: "an incomplete body: the 400 shows the guard let the call through, and no request is made",
  },
  {
    file: "app/api/organisations/[organisationId]/organisers/route.ts",
    method: "GET",
    path: (i) => `/api/organisations/${i.organisationId}/organisers`,
    allowed: ORGANISERS,
  },
  {
    file: "app/api/organisations/[organisationId]/organisers/route.ts",
    method: "POST",
    path: (i) => `/api/organisations/${i.organisationId}/organisers`,
    body: () => ({ email: "organiser@example.org" }),
    allowed: ORGANISERS,
    note: "already an organiser: 409",
  },
  {
    file: "app/api/organisations/[organisationId]/organisers/[userId]/route.ts",
    method: "DELETE",
    path: (i) => `/api/organisations/${i.organisationId}/organisers/${i.volunteerId}`,
    allowed: ORGANISERS,
    note: "not an organiser: 404",
  },
  {
    file: "app/api/admin/organisation-requests/[requestId]/route.ts",
    method: "POST",
    path: () => `/api/admin/organisation-requests/00000000-0000-4000-8000-000000000000`,
    body: () => ({ decision: "decline", reason: "role matrix" }),
    allowed: ADMINS,
    note: "no such request: 404",
  },
  {
    file: "app/api/admin/organisations/[organisationId]/route.ts",
    method: "PATCH",
    path: (i) => `/api/admin/organisations/${i.organisationId}`,
    body: () => ({ suspended: false, reason: "" }),
    allowed: ADMINS,
    note: "not suspended: 409",
  },
  {
    file: "app/api/admin/people/[userId]/route.ts",
    method: "POST",
    path: () => `/api/admin/people/00000000-0000-4000-8000-000000000000`,
    body: () => ({ action: "end_sessions" }),
    allowed: ADMINS,
    note: "no such person: 404",
  },
  {
    file: "app/api/admin/people/[userId]/route.ts",
    method: "DELETE",
    path: () => `/api/admin/people/00000000-0000-4000-8000-000000000000`,
    body: () => ({ confirm: "nobody@example.org", reason: "role matrix" }),
    allowed: ADMINS,
    note: "no such person: 404 (nobody is erased)",
  },
  {
    file: "app/api/admin/mails/[mailId]/route.ts",
    method: "POST",
    path: () => `/api/admin/mails/999999999`,
    allowed: ADMINS,
    note: "no such mail: 404",
  },
);

// ---------------------------------------------------------------- read-only API (issue 19)
const API_READERS: Who[] = ["eventToken", "organisationToken"]; // of the demo event; other tokens get 403
const v1 = (file: string, path: (i: Ids) => string, allowed: Who[], note?: string): RouteCase[] => [
  { file, method: "GET", path, allowed, auth: "token", note },
  ...(["POST", "PUT", "PATCH", "DELETE"] as const).map((method) => ({
    file,
    method,
    path,
    allowed: EVERYONE,
    status: 405,
    note: "a token never writes: 405 for everyone",
  })),
];
ROUTES.push(
  {
    file: "app/api/openapi.json/route.ts",
    method: "GET",
    path: () => "/api/openapi.json",
    allowed: EVERYONE,
    note: "public: the API's description",
  },
  {
    file: "app/api/events/[eventId]/setup/api-tokens/route.ts",
    method: "GET",
    path: (i) => `/api/events/${i.setupEventId}/setup/api-tokens`,
    allowed: ORGANISERS,
  },
  {
    file: "app/api/events/[eventId]/setup/api-tokens/route.ts",
    method: "POST",
    path: (i) => `/api/events/${i.setupEventId}/setup/api-tokens`,
    body: () => ({ name: "Role matrix reader", scope: "event", expiresInDays: 7 }),
    allowed: ORGANISERS,
    note: "answers the new token's secret once",
  },
  {
    file: "app/api/events/[eventId]/setup/api-tokens/[tokenId]/route.ts",
    method: "DELETE",
    path: (i) => `/api/events/${i.setupEventId}/setup/api-tokens/${i.setupApiTokenId}`,
    allowed: ORGANISERS,
  },
  ...v1("app/api/v1/events/route.ts", () => "/api/v1/events", TOKEN_HOLDERS, "each token lists its own events"),
  ...v1(
    "app/api/v1/events/[eventId]/sightings/route.ts",
    (i) => `/api/v1/events/${i.eventId}/sightings?limit=5`,
    API_READERS,
  ),
  ...v1("app/api/v1/events/[eventId]/results/route.ts", (i) => `/api/v1/events/${i.eventId}/results`, API_READERS),
  ...v1("app/api/v1/events/[eventId]/reports/route.ts", (i) => `/api/v1/events/${i.eventId}/reports`, API_READERS),
  ...v1(
    "app/api/v1/events/[eventId]/reports/[version]/route.ts",
    (i) => `/api/v1/events/${i.eventId}/reports/1`,
    API_READERS,
    "404 for readers when no version 1 yet",
  ),
);
