// The demo scenario of design.md: invented people, places and records. Demo only.
import type { SeedTaxon } from "./taxa";
import { REJECT_REASONS, type EventRole, type Habitat, type TaxonGroup } from "@/lib/domain";

export const DEMO_ORG = { slug: "friends-of-harrowmere-vale", name: "Friends of Harrowmere Vale" };

export const DEMO_EVENT = {
  slug: "harrowmere-vale-midsummer-count",
  name: "Harrowmere Vale Midsummer Count",
  description:
    "Forty-eight hours to find every species we can across the vale's meadow, woodland and millpond. " +
    "Records from all four zones help us compare the woodland and wetland edges with the interiors.",
  timeZone: "Europe/London",
  // 48 hours from 06:00 local time (BST, UTC+1) on 20 June 2026.
  startsAt: new Date("2026-06-20T05:00:00Z"),
  endsAt: new Date("2026-06-22T05:00:00Z"),
  languages: ["en", "es", "fr"],
  status: "closed" as const,
  // Closed for new records, but the organiser keeps review open until the next midsummer count
  // (the default would have closed it 30 days after the end): the demo's returned records can
  // still be answered and corrected, and the desk still has work (design.md "review period").
  reviewClosesAt: new Date("2027-06-19T05:00:00Z"),
  joinCode: "HARROW-MIDSUMMER",
  accuracyLimitM: 50,
};

type Ring = [number, number][];
const rect = (w: number, s: number, e: number, n: number): Ring => [
  [w, s],
  [e, s],
  [e, n],
  [w, n],
  [w, s],
];

// A fictional reserve; coordinates are [longitude, latitude] (GeoJSON order, WGS84).
export const DEMO_AREA: Ring = [
  [-1.82, 52.1],
  [-1.804, 52.1],
  [-1.8, 52.102],
  [-1.8, 52.11],
  [-1.81, 52.1102],
  [-1.82, 52.11],
  [-1.82, 52.1],
];

export type DemoZone = {
  key: string;
  name: string;
  habitat: Extract<Habitat, "interior" | "edge">;
  description: string;
  ring: Ring;
  box: [number, number, number, number];
  pools: SeedTaxon["habitat"][];
};

// Edge zones draw from both neighbouring habitats, as edges do.
export const DEMO_ZONES: DemoZone[] = [
  {
    key: "meadow",
    name: "Harrowmere Meadow",
    habitat: "interior",
    description: "Grassland interior: unimproved hay meadow.",
    box: [-1.8195, 52.1035, -1.811, 52.1095],
    ring: rect(-1.8195, 52.1035, -1.811, 52.1095),
    pools: ["grassland", "any"],
  },
  {
    key: "alder",
    name: "Alder Fringe",
    habitat: "edge",
    description: "Woodland edge: alder and hazel where the meadow meets the wood.",
    box: [-1.811, 52.1035, -1.8085, 52.1095],
    ring: rect(-1.811, 52.1035, -1.8085, 52.1095),
    pools: ["woodland", "grassland", "any"],
  },
  {
    key: "beech",
    name: "Beechwood Heart",
    habitat: "interior",
    description: "Woodland interior: closed-canopy beech.",
    box: [-1.8085, 52.1035, -1.8005, 52.1095],
    ring: rect(-1.8085, 52.1035, -1.8005, 52.1095),
    pools: ["woodland", "any"],
  },
  {
    key: "millpond",
    name: "Millpond Margin",
    habitat: "edge",
    description: "Wetland edge: reedbed and wet grassland around the old millpond.",
    box: [-1.815, 52.1005, -1.805, 52.1035],
    ring: rect(-1.815, 52.1005, -1.805, 52.1035),
    pools: ["wetland", "grassland", "any"],
  },
];

export type DemoPerson = {
  key: string;
  name: string;
  email: string;
  locale: "en" | "es" | "fr";
  role: EventRole;
  groups?: TaxonGroup[];
};

export const DEMO_PEOPLE: DemoPerson[] = [
  { key: "organiser", name: "Maren Oakley", email: "organiser@example.org", locale: "en", role: "organiser" },
  { key: "coord-all", name: "Tomás Ferreira", email: "coordinator@example.org", locale: "es", role: "coordinator" },
  {
    key: "coord-birds",
    name: "Hélène Marchand",
    email: "birds@example.org",
    locale: "fr",
    role: "coordinator",
    groups: ["birds"],
  },
  { key: "vol-1", name: "Priya Nandakumar", email: "volunteer1@example.org", locale: "en", role: "volunteer" },
  { key: "vol-2", name: "Owen Pritchard", email: "volunteer2@example.org", locale: "en", role: "volunteer" },
  { key: "vol-3", name: "Lucía Robles", email: "volunteer3@example.org", locale: "es", role: "volunteer" },
  { key: "vol-4", name: "Bastien Lefèvre", email: "volunteer4@example.org", locale: "fr", role: "volunteer" },
  { key: "vol-5", name: "Ada Whitlock", email: "volunteer5@example.org", locale: "en", role: "volunteer" },
  { key: "vol-6", name: "Jonah Greaves", email: "volunteer6@example.org", locale: "en", role: "volunteer" },
];

export const DEMO_PASSWORD = "harrowmere-demo";

/** The site admin of the demo (users.is_admin): approves organisations, runs the admin console. */
export const DEMO_ADMIN = { key: "admin", name: "Rowan Ashby", email: "admin@example.org", locale: "en" } as const;

export const SEED_REJECT_REASONS = REJECT_REASONS.filter((r) => r !== "other");
export const RETURN_QUESTIONS = [
  "Could you add a photo of the underside of the leaves? It would separate this from a close relative.",
  "Was this a sighting or a call only? Please say in the notes.",
  "The count looks high for this spot. Did you count the same flock twice?",
];

// A second, invented event that is open now: the field log's demo, and the "member of
// another event" in the role tests.
export const SECOND_ORG = { slug: "kestrel-moor-naturalists", name: "Kestrel Moor Naturalists" };
export const SECOND_EVENT = {
  slug: "kestrel-moor-winter-count",
  name: "Kestrel Moor Winter Count",
  description: "A fortnight of winter recording on the moor's heath and its gorse-scrub margin.",
  timeZone: "Europe/London",
  startsAt: new Date("2026-11-28T08:00:00Z"),
  endsAt: new Date("2026-12-13T17:00:00Z"),
  languages: ["en", "es", "fr"],
  status: "open" as const,
  joinCode: "KESTREL-WINTER",
  accuracyLimitM: 100,
};
export const SECOND_AREA: Ring = [
  [-2.1, 53.3],
  [-2.09, 53.3],
  [-2.09, 53.306],
  [-2.1, 53.306],
  [-2.1, 53.3],
];
export const SECOND_ZONES = [
  {
    key: "crest",
    name: "Heather Crest",
    habitat: "interior" as const,
    description: "Heath interior: open heather on the ridge.",
    ring: rect(-2.1, 53.303, -2.09, 53.306),
  },
  {
    key: "gorse",
    name: "Gorse Margin",
    habitat: "edge" as const,
    description: "Heath edge: gorse scrub where the heath meets rough pasture.",
    ring: rect(-2.1, 53.3, -2.09, 53.303),
  },
];
export const SECOND_PEOPLE: DemoPerson[] = [
  { key: "moor-organiser", name: "Idris Bevan", email: "moor-organiser@example.org", locale: "en", role: "organiser" },
  { key: "moor-volunteer", name: "Carmen Solís", email: "moor-volunteer@example.org", locale: "es", role: "volunteer" },
];

// A third invented event, still in preparation (draft), for the event-setup screens: the
// organiser has people lined up but no zones or species list yet. The role tests aim the
// setup handlers at it, so their writes never touch the two events above.
export const SETUP_EVENT = {
  slug: "harrowmere-vale-autumn-fungus-foray",
  name: "Harrowmere Vale Autumn Fungus Foray",
  description: "A weekend looking for fungi in the beechwood and the meadow margins after the first autumn rains.",
  timeZone: "Europe/London",
  startsAt: new Date("2027-10-16T08:00:00Z"),
  endsAt: new Date("2027-10-17T16:00:00Z"),
  languages: ["en", "es", "fr"],
  status: "draft" as const,
  joinCode: "HARROW-AUTUMN",
  // Demo people (by key) who already hold a role there.
  members: [
    { key: "coord-all", role: "coordinator" as const, groups: [] as "birds"[] },
    { key: "coord-birds", role: "coordinator" as const, groups: ["birds"] as "birds"[] },
    { key: "vol-2", role: "volunteer" as const, groups: [] as "birds"[] },
    { key: "vol-5", role: "volunteer" as const, groups: [] as "birds"[] },
  ],
  invitation: { email: "autumn-helper@example.org", role: "volunteer" as const },
};

// The same reserve's count a year earlier (invented, closed): shorter, fewer volunteers and
// only timed counts, so the results page has an earlier event of the site to compare with.
// Its name does not contain this year's name (tests find events by their visible names).
export const EARLIER_EVENT = {
  slug: "harrowmere-vale-midsummer-count-2025",
  name: "Midsummer Count 2025, Harrowmere Vale",
  description:
    "Last year's first count of the vale: one long day of timed counts in the meadow, the woodland and by the millpond.",
  timeZone: "Europe/London",
  // 24 hours from 06:00 local time (BST, UTC+1) on 21 June 2025.
  startsAt: new Date("2025-06-21T05:00:00Z"),
  endsAt: new Date("2025-06-22T05:00:00Z"),
  languages: ["en", "es", "fr"],
  status: "closed" as const,
  joinCode: "HARROW-MIDSUMMER-2025",
  accuracyLimitM: 50,
  // Demo people (by key) who took part then; none of them is a test's signed-in volunteer.
  members: [
    { key: "coord-all", role: "coordinator" as const },
    { key: "vol-4", role: "volunteer" as const },
    { key: "vol-6", role: "volunteer" as const },
  ],
};
