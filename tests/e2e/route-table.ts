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
export type Ids = {
  eventId: string; organisationId: string; sightingId: string; birdSightingId: string; volunteerId: string;
  // The draft event of the setup screens, a member there to change, an open invitation, its join code.
  setupEventId: string; setupMemberId: string; setupInvitationId: string; setupJoinCode: string;
};

export type RouteCase = {
  file: string; // app/api/.../route.ts
  method: "GET" | "POST" | "PUT" | "PATCH" | "DELETE";
  path: (ids: Ids) => string;
  body?: (ids: Ids) => unknown;
  allowed: Who[];
  note?: string;
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
];

// ---------------------------------------------------------------- event setup (issue 4)
// Aimed at the demo's draft event (SETUP_EVENT in db/seed/demo-scenario.ts), where the
// demo coordinators and volunteer2 hold roles too, so that the organiser's writes and the
// fuzz test never change the two demo events other tests read.
const newEventBody = () => ({
  name: "Role matrix foray", slug: "role-matrix-foray", description: "", startsLocal: "2027-05-01T08:00", endsLocal: "2027-05-01T18:00",
  timeZone: "Europe/London", languages: ["en"], sessionKinds: ["walk"], photoRequiredSensitive: true, photoRequiredOffList: false, accuracyLimitM: 50,
});
const square = (w: number, s: number, e: number, n: number) => [[[w, s], [e, s], [e, n], [w, n], [w, s]]];
const zonesBody = () => ({
  save: false,
  geojson: {
    type: "FeatureCollection",
    features: [
      { type: "Feature", properties: { kind: "area" }, geometry: { type: "Polygon", coordinates: square(-1.82, 52.10, -1.80, 52.11) } },
      { type: "Feature", properties: { name: "Beech slope", habitat: "woodland" }, geometry: { type: "Polygon", coordinates: square(-1.815, 52.102, -1.805, 52.108) } },
    ],
  },
});
ROUTES.push(
  { file: "app/api/organisations/[organisationId]/events/route.ts", method: "POST", path: (i) => `/api/organisations/${i.organisationId}/events`, body: newEventBody, allowed: ORGANISERS },
  { file: "app/api/events/[eventId]/setup/route.ts", method: "GET", path: (i) => `/api/events/${i.setupEventId}/setup`, allowed: ORGANISERS },
  { file: "app/api/events/[eventId]/setup/route.ts", method: "PATCH", path: (i) => `/api/events/${i.setupEventId}/setup`, body: () => { const { slug: _slug, ...fields } = newEventBody(); return { ...fields, name: "Harrowmere Vale Autumn Fungus Foray", status: "draft" }; }, allowed: ORGANISERS },
  { file: "app/api/events/[eventId]/setup/zones/route.ts", method: "GET", path: (i) => `/api/events/${i.setupEventId}/setup/zones`, allowed: ORGANISERS },
  { file: "app/api/events/[eventId]/setup/zones/route.ts", method: "PUT", path: (i) => `/api/events/${i.setupEventId}/setup/zones`, body: zonesBody, allowed: ORGANISERS },
  { file: "app/api/events/[eventId]/setup/species/route.ts", method: "GET", path: (i) => `/api/events/${i.setupEventId}/setup/species`, allowed: ORGANISERS },
  { file: "app/api/events/[eventId]/setup/species/route.ts", method: "PUT", path: (i) => `/api/events/${i.setupEventId}/setup/species`, body: () => ({ csv: "scientific_name,rank,taxon_group,common_name_en\nAmanita muscaria,species,fungi,Fly agaric\n", save: false }), allowed: ORGANISERS },
  { file: "app/api/events/[eventId]/setup/members/route.ts", method: "GET", path: (i) => `/api/events/${i.setupEventId}/setup/members`, allowed: ORGANISERS },
  { file: "app/api/events/[eventId]/setup/members/route.ts", method: "POST", path: (i) => `/api/events/${i.setupEventId}/setup/members`, body: () => ({ email: "matrix-invitee@example.org", name: "", role: "volunteer", taxonGroups: [], locale: "en" }), allowed: ORGANISERS },
  { file: "app/api/events/[eventId]/setup/members/[userId]/route.ts", method: "PATCH", path: (i) => `/api/events/${i.setupEventId}/setup/members/${i.setupMemberId}`, body: () => ({ role: "volunteer", taxonGroups: [] }), allowed: ORGANISERS },
  { file: "app/api/events/[eventId]/setup/members/[userId]/route.ts", method: "DELETE", path: (i) => `/api/events/${i.setupEventId}/setup/members/${i.setupMemberId}`, allowed: ORGANISERS, note: "removes volunteer5 from the draft event" },
  { file: "app/api/events/[eventId]/setup/invitations/[invitationId]/route.ts", method: "DELETE", path: (i) => `/api/events/${i.setupEventId}/setup/invitations/${i.setupInvitationId}`, allowed: ORGANISERS },
  { file: "app/api/events/[eventId]/setup/join-code/route.ts", method: "POST", path: (i) => `/api/events/${i.setupEventId}/setup/join-code`, allowed: ORGANISERS },
  { file: "app/api/join/route.ts", method: "POST", path: () => "/api/join", body: (i) => ({ code: i.setupJoinCode, locale: "en" }), allowed: EVERYONE, note: "public: a join link; without a session it only mails a sign-in link" },
);
