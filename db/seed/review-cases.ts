// Demo sightings crafted for the review desk: each raises one automatic check mark, so
// every mark has something to show, and the birds coordinator has a known set of pending
// bird records (three outside the event area, ten with poor location accuracy) to decide
// in the browser test. Invented, like the rest of the demo.
import type { NodePgDatabase } from "drizzle-orm/node-postgres";
import * as s from "../schema";
import { demoId } from "./random";

type Tx = Pick<NodePgDatabase<typeof s>, "insert">;

/** A real species that is on neither demo species list (a rare visitor), for "not on the species list". */
export const OFF_LIST_TAXON = {
  scientificName: "Upupa epops",
  group: "birds" as const,
  // Common names from memory.
  names: { en: "Eurasian hoopoe", es: "Abubilla", fr: "Huppe fasciée" },
};

type Case = {
  key: string;
  taxon: string;
  person: string;
  lon: number;
  lat: number;
  zone: string | null;
  at: string;
  count?: number;
  accuracyM?: number;
  notes?: string;
};

const BIRDS = [
  "Erithacus rubecula",
  "Turdus merula",
  "Fringilla coelebs",
  "Parus major",
  "Cyanistes caeruleus",
  "Troglodytes troglodytes",
  "Sylvia atricapilla",
  "Phylloscopus collybita",
  "Columba palumbus",
  "Prunella modularis",
];

export const REVIEW_CASES: Case[] = [
  // Outside the event area: just east of the reserve's boundary (three birds, one plant).
  {
    key: "outside-area:1",
    taxon: "Erithacus rubecula",
    person: "vol-1",
    lon: -1.7992,
    lat: 52.105,
    zone: null,
    at: "2026-06-21T07:10:00Z",
    notes: "Singing from the hedge across the lane.",
  },
  {
    key: "outside-area:2",
    taxon: "Turdus merula",
    person: "vol-2",
    lon: -1.7988,
    lat: 52.1062,
    zone: null,
    at: "2026-06-21T07:25:00Z",
    count: 2,
  },
  {
    key: "outside-area:3",
    taxon: "Fringilla coelebs",
    person: "vol-3",
    lon: -1.7985,
    lat: 52.1071,
    zone: null,
    at: "2026-06-21T07:40:00Z",
  },
  {
    key: "outside-area:plant",
    taxon: "Urtica dioica",
    person: "vol-4",
    lon: -1.8212,
    lat: 52.106,
    zone: null,
    at: "2026-06-21T08:00:00Z",
    count: 30,
  },
  // Outside the event dates: the evening before the start.
  {
    key: "outside-dates",
    taxon: "Parus major",
    person: "vol-5",
    lon: -1.815,
    lat: 52.106,
    zone: "meadow",
    at: "2026-06-19T18:30:00Z",
  },
  // An unusually high count.
  {
    key: "high-count",
    taxon: "Columba palumbus",
    person: "vol-6",
    lon: -1.814,
    lat: 52.108,
    zone: "meadow",
    at: "2026-06-21T09:00:00Z",
    count: 400,
    notes: "Flock feeding on the cut hay.",
  },
  // Not on the species list (and so, without a photo, "photo missing" too).
  {
    key: "not-on-list",
    taxon: OFF_LIST_TAXON.scientificName,
    person: "vol-2",
    lon: -1.816,
    lat: 52.1045,
    zone: "meadow",
    at: "2026-06-21T09:30:00Z",
    notes: "Flew across the meadow, crest raised.",
  },
  // A sensitive taxon (no photo: "photo missing" too).
  {
    key: "sensitive",
    taxon: "Accipiter gentilis",
    person: "vol-3",
    lon: -1.804,
    lat: 52.107,
    zone: "beech",
    at: "2026-06-21T10:00:00Z",
  },
  // A possible duplicate: the same volunteer and taxon, three minutes and about ten metres apart.
  {
    key: "duplicate:a",
    taxon: "Sitta europaea",
    person: "vol-4",
    lon: -1.806,
    lat: 52.106,
    zone: "beech",
    at: "2026-06-21T10:30:00Z",
  },
  {
    key: "duplicate:b",
    taxon: "Sitta europaea",
    person: "vol-4",
    lon: -1.80605,
    lat: 52.10608,
    zone: "beech",
    at: "2026-06-21T10:33:00Z",
  },
  // Poor location accuracy (the event's limit is 50 m): ten birds and one plant.
  ...BIRDS.map((taxon, i): Case => ({
    key: `poor-accuracy:${i + 1}`,
    taxon,
    person: "vol-6",
    lon: -1.8105 + (i % 5) * 0.0004,
    lat: 52.104 + Math.floor(i / 5) * 0.002,
    zone: "alder",
    at: new Date(Date.parse("2026-06-21T12:00:00Z") + i * 15 * 60_000).toISOString(),
    accuracyM: 80,
  })),
  {
    key: "poor-accuracy:plant",
    taxon: "Bellis perennis",
    person: "vol-5",
    lon: -1.818,
    lat: 52.109,
    zone: "meadow",
    at: "2026-06-21T13:00:00Z",
    count: 12,
    accuracyM: 120,
  },
];

export const reviewCaseId = (key: string) => demoId(`review-case:${key}`);

/** Inserts the crafted sightings (pending, outside any count session); returns their ids. */
export async function seedReviewCases(
  tx: Tx,
  opts: { eventId: string; people: Map<string, string>; zoneIds: Map<string, string>; taxonIds: Map<string, string> },
): Promise<string[]> {
  const offListId = demoId(`taxon:${OFF_LIST_TAXON.scientificName}`);
  await tx
    .insert(s.taxa)
    .values({ id: offListId, scientificName: OFF_LIST_TAXON.scientificName, taxonGroup: OFF_LIST_TAXON.group })
    .onConflictDoNothing();
  await tx
    .insert(s.taxonNames)
    .values(
      (["en", "es", "fr"] as const).map((locale) => ({
        taxonId: offListId,
        locale,
        name: OFF_LIST_TAXON.names[locale],
      })),
    )
    .onConflictDoNothing();
  const taxonId = (name: string) => (name === OFF_LIST_TAXON.scientificName ? offListId : opts.taxonIds.get(name)!);
  const rows = REVIEW_CASES.map((c) => ({
    id: reviewCaseId(c.key),
    eventId: opts.eventId,
    userId: opts.people.get(c.person)!,
    taxonId: taxonId(c.taxon),
    count: c.count ?? 1,
    observedAt: new Date(c.at),
    location: { longitude: c.lon, latitude: c.lat },
    accuracyM: c.accuracyM ?? 12,
    zoneId: c.zone ? opts.zoneIds.get(c.zone)! : null,
    notes: c.notes ?? "",
  }));
  await tx.insert(s.sightings).values(rows).onConflictDoNothing();
  return rows.map((r) => r.id);
}
