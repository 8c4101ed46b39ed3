import { and, eq, sql } from "drizzle-orm";
import type { NodePgDatabase } from "drizzle-orm/node-postgres";
import * as s from "../schema";
import {
  DEMO_AREA,
  DEMO_EVENT,
  DEMO_ORG,
  DEMO_ADMIN,
  DEMO_PEOPLE,
  DEMO_ZONES,
  RETURN_QUESTIONS,
  SEED_REJECT_REASONS,
  SECOND_AREA,
  SECOND_EVENT,
  SECOND_ORG,
  SECOND_PEOPLE,
  SECOND_ZONES,
  SETUP_EVENT,
  type DemoPerson,
  type DemoZone,
} from "./demo-scenario";
import { refreshCheckMarks } from "../queries/check-marks";
import { demoId, seededRandom } from "./random";
import { SENSITIVE_DEMO_RECORDS } from "./sensitive";
import { seedReviewCases } from "./review-cases";
import { seedEarlierEvent } from "./earlier-event";
import { SEED_TAXA, type SeedTaxon } from "./taxa";

type Db = NodePgDatabase<typeof s>;
type Ring = [number, number][];
type DemoEvent = Pick<
  typeof s.events.$inferInsert,
  | "slug"
  | "name"
  | "description"
  | "status"
  | "startsAt"
  | "endsAt"
  | "timeZone"
  | "languages"
  | "joinCode"
  | "accuracyLimitM"
  | "reviewClosesAt"
>;
type EventZone = Pick<DemoZone, "key" | "name" | "habitat" | "description" | "ring">;

const polygonSql = (ring: Ring) =>
  sql`ST_SetSRID(ST_GeomFromGeoJSON(${JSON.stringify({ type: "Polygon", coordinates: [ring] })}), 4326)`;

export type SeedSummary = {
  taxa: number;
  people: number;
  sessions: number;
  sightings: number;
  reviews: number;
  byState: Record<string, number>;
};

/**
 * Seeds the demo scenario. Deterministic (fixed PRNG seed, ids derived from names) and
 * idempotent: a second run finds every row and adds nothing.
 */
export async function seedDemo(db: Db, options: { passwordHash?: string } = {}): Promise<SeedSummary> {
  return db.transaction(async (tx) => {
    const rand = seededRandom(20260620);
    const pick = <T>(xs: readonly T[]): T => xs[Math.floor(rand() * xs.length)]!;

    // Organisation, people and roles.
    const orgId = demoId("org");
    await tx
      .insert(s.organisations)
      .values({ id: orgId, ...DEMO_ORG })
      .onConflictDoNothing();
    const people = new Map<string, string>();
    const addPerson = async (p: DemoPerson) => {
      const id = demoId(`user:${p.key}`);
      people.set(p.key, id);
      await tx
        .insert(s.users)
        .values({
          id,
          name: p.name,
          email: p.email,
          locale: p.locale,
          emailVerified: new Date("2026-05-01T00:00:00Z"),
          passwordHash: options.passwordHash ?? null,
        })
        .onConflictDoNothing();
      return id;
    };
    for (const p of DEMO_PEOPLE) await addPerson(p);
    await tx
      .insert(s.users)
      .values({
        id: demoId(`user:${DEMO_ADMIN.key}`),
        name: DEMO_ADMIN.name,
        email: DEMO_ADMIN.email,
        locale: DEMO_ADMIN.locale,
        isAdmin: true,
        emailVerified: new Date("2026-05-01T00:00:00Z"),
        passwordHash: options.passwordHash ?? null,
      })
      .onConflictDoNothing();
    await tx
      .insert(s.organisationMembers)
      .values({ organisationId: orgId, userId: people.get("organiser")!, role: "organiser" })
      .onConflictDoNothing();

    // One event of the scenario with its area and zones (the three events differ only in their values).
    const addEvent = async (
      id: string,
      organisationId: string,
      e: DemoEvent,
      area?: Ring,
      zones: readonly EventZone[] = [],
    ) => {
      await tx
        .insert(s.events)
        .values({
          id,
          organisationId,
          slug: e.slug,
          name: e.name,
          description: e.description,
          status: e.status,
          startsAt: e.startsAt,
          endsAt: e.endsAt,
          timeZone: e.timeZone,
          languages: e.languages,
          area: area ? polygonSql(area) : undefined,
          joinCode: e.joinCode,
          accuracyLimitM: e.accuracyLimitM,
          reviewClosesAt: e.reviewClosesAt ?? null,
        })
        .onConflictDoNothing();
      // Every demo event is invented: its Darwin Core archives say so (lib/results/dwc.ts).
      await tx.update(s.events).set({ isDemo: true }).where(eq(s.events.id, id));
      const zoneIds = new Map<string, string>();
      for (const z of zones) {
        const zoneId = demoId(`zone:${z.key}`);
        zoneIds.set(z.key, zoneId);
        await tx
          .insert(s.zones)
          .values({
            id: zoneId,
            eventId: id,
            name: z.name,
            habitat: z.habitat,
            description: z.description,
            geom: polygonSql(z.ring),
          })
          .onConflictDoNothing();
      }
      return zoneIds;
    };

    const eventId = demoId("event:midsummer");
    const zoneIds = await addEvent(eventId, orgId, DEMO_EVENT, DEMO_AREA, DEMO_ZONES);
    for (const p of DEMO_PEOPLE) {
      await tx
        .insert(s.eventMembers)
        .values({ eventId, userId: people.get(p.key)!, role: p.role, taxonGroups: p.groups ?? [] })
        .onConflictDoNothing();
    }

    // Taxa, names in three languages, and the event's species list.
    const taxonIds = new Map<string, string>();
    for (const t of SEED_TAXA) {
      const id = demoId(`taxon:${t.scientificName}`);
      taxonIds.set(t.scientificName, id);
      await tx
        .insert(s.taxa)
        .values({ id, scientificName: t.scientificName, rank: t.rank, taxonGroup: t.group, sensitivity: t.sensitivity })
        .onConflictDoNothing();
      await tx
        .insert(s.taxonNames)
        .values((["en", "es", "fr"] as const).map((locale) => ({ taxonId: id, locale, name: t.names[locale] })))
        .onConflictDoNothing();
      await tx.insert(s.eventSpecies).values({ eventId, taxonId: id }).onConflictDoNothing();
    }

    // Count sessions and sightings over the two days.
    const volunteers = DEMO_PEOPLE.filter((p) => p.role === "volunteer");
    const poolFor = (z: DemoZone) => SEED_TAXA.filter((t) => z.pools.includes(t.habitat));
    const sessionRows: (typeof s.countSessions.$inferInsert)[] = [];
    const sightingRows: (typeof s.sightings.$inferInsert)[] = [];
    const kinds = ["timed_count", "walk", "plot_search"] as const;
    const countFor = (t: SeedTaxon) => {
      const base = t.group === "vascular_plants" ? 12 : t.group === "insects" ? 6 : t.group === "birds" ? 4 : 2;
      return 1 + Math.floor(rand() * rand() * base * t.abundance);
    };
    const pointIn = (z: DemoZone) => {
      const [w, so, e, n] = z.box;
      return { lon: w + (e - w) * (0.05 + 0.9 * rand()), lat: so + (n - so) * (0.05 + 0.9 * rand()) };
    };

    for (let day = 0; day < 2; day++) {
      for (const v of volunteers) {
        const sessionsToday = 2 + Math.floor(rand() * 3);
        for (let k = 0; k < sessionsToday; k++) {
          const zone = pick(DEMO_ZONES);
          const kind = pick(kinds);
          const key = `session:${v.key}:${day}:${k}`;
          const startMs = DEMO_EVENT.startsAt.getTime() + day * 86_400_000 + (1 + k * 3 + rand() * 2) * 3_600_000;
          const minutes = kind === "walk" ? 45 + Math.floor(rand() * 45) : kind === "timed_count" ? 20 : 30;
          const complete = kind !== "walk" || rand() < 0.6;
          const sessionId = demoId(key);
          sessionRows.push({
            id: sessionId,
            eventId,
            userId: people.get(v.key)!,
            zoneId: zoneIds.get(zone.key)!,
            kind,
            startedAt: new Date(startMs),
            endedAt: new Date(startMs + minutes * 60_000),
            allSpeciesNoted: complete,
            distanceM: kind === "walk" ? Math.round(600 + rand() * 1400) : null,
          });
          const pool = poolFor(zone);
          const weighted = pool.flatMap((t) => Array.from({ length: t.abundance * t.abundance }, () => t));
          const found = new Set<SeedTaxon>();
          const target = 4 + Math.floor(rand() * 10);
          for (let tries = 0; found.size < target && tries < 200; tries++) found.add(pick(weighted));
          let i = 0;
          for (const taxon of found) {
            const at = pointIn(zone);
            sightingRows.push({
              id: demoId(`${key}:sighting:${i}`),
              eventId,
              userId: people.get(v.key)!,
              sessionId,
              taxonId: taxonIds.get(taxon.scientificName)!,
              count: countFor(taxon),
              countIsEstimate: rand() < 0.1,
              observedAt: new Date(startMs + Math.floor(rand() * minutes) * 60_000),
              location: { longitude: at.lon, latitude: at.lat },
              accuracyM: Math.round(4 + rand() * 30),
              zoneId: zoneIds.get(zone.key)!,
            });
            i++;
          }
        }
        // One incidental record a day, outside any session, and now and then an unidentified one.
        const zone = pick(DEMO_ZONES);
        const at = pointIn(zone);
        const unidentified = day === 1 && rand() < 0.5;
        sightingRows.push({
          id: demoId(`incidental:${v.key}:${day}`),
          eventId,
          userId: people.get(v.key)!,
          taxonId: unidentified ? null : taxonIds.get(pick(poolFor(zone)).scientificName)!,
          description: unidentified
            ? "Small brown moth, pale cross-band on forewing; flew before I could photograph it."
            : "",
          count: 1,
          observedAt: new Date(DEMO_EVENT.startsAt.getTime() + day * 86_400_000 + 14 * 3_600_000 + rand() * 3_600_000),
          location: { longitude: at.lon, latitude: at.lat },
          accuracyM: Math.round(8 + rand() * 20),
          zoneId: zoneIds.get(zone.key)!,
        });
      }
    }

    if (sessionRows.length) await tx.insert(s.countSessions).values(sessionRows).onConflictDoNothing();
    for (let i = 0; i < sightingRows.length; i += 200) {
      await tx
        .insert(s.sightings)
        .values(sightingRows.slice(i, i + 200))
        .onConflictDoNothing();
    }

    // Review decisions: every state appears. Only sightings still pending and never
    // reviewed are decided, so a re-run leaves the history as it was.
    const reviewed = await tx
      .select({ id: s.reviews.sightingId })
      .from(s.reviews)
      .innerJoin(s.sightings, and(eq(s.sightings.eventId, s.reviews.eventId), eq(s.sightings.id, s.reviews.sightingId)))
      .where(eq(s.sightings.eventId, eventId))
      .limit(1);
    if (reviewed.length === 0) {
      const groupOf = new Map(SEED_TAXA.map((t) => [taxonIds.get(t.scientificName)!, t.group]));
      const reviewRows: (typeof s.reviews.$inferInsert)[] = [];
      for (const row of sightingRows) {
        const r = rand();
        const group = row.taxonId ? groupOf.get(row.taxonId) : undefined;
        const reviewer = people.get(group === "birds" ? "coord-birds" : "coord-all")!;
        const decidedAt = new Date(row.observedAt.getTime() + (2 + rand() * 30) * 3_600_000);
        const toState: (typeof s.reviewState.enumValues)[number] = !row.taxonId
          ? r < 0.5
            ? "returned"
            : "pending"
          : r < 0.68
            ? "approved"
            : r < 0.86
              ? "pending"
              : r < 0.93
                ? "rejected"
                : "returned";
        if (toState === "pending") continue;
        const base = {
          sightingId: row.id,
          eventId,
          reviewerId: reviewer,
          decidedAt,
          fromState: "pending" as const,
          toState,
        };
        if (toState === "rejected") reviewRows.push({ ...base, reason: pick(SEED_REJECT_REASONS) });
        else if (toState === "returned")
          reviewRows.push({
            ...base,
            message: row.taxonId
              ? pick(RETURN_QUESTIONS)
              : "Can you describe the hindwing colour? That would narrow it down a lot.",
          });
        else reviewRows.push(base);
        await tx
          .update(s.sightings)
          .set({ reviewState: toState, version: 2, updatedAt: decidedAt })
          .where(and(eq(s.sightings.eventId, eventId), eq(s.sightings.id, row.id)));
      }
      for (let i = 0; i < reviewRows.length; i += 200) await tx.insert(s.reviews).values(reviewRows.slice(i, i + 200));
    }

    // Approved records of the sensitive taxa, outside sessions (db/seed/sensitive.ts).
    for (const r of SENSITIVE_DEMO_RECORDS) {
      const id = demoId(`sensitive:${r.key}`);
      const observedAt = new Date(DEMO_EVENT.startsAt.getTime() + r.hour * 3_600_000);
      const inserted = await tx
        .insert(s.sightings)
        .values({
          id,
          eventId,
          userId: people.get(r.volunteer)!,
          taxonId: taxonIds.get(r.scientificName)!,
          count: r.count,
          observedAt,
          location: { longitude: r.lon, latitude: r.lat },
          accuracyM: 10,
          zoneId: zoneIds.get(r.zone)!,
          reviewState: "approved",
          version: 2,
          checkMarks: ["sensitive_taxon"],
        })
        .onConflictDoNothing()
        .returning({ id: s.sightings.id });
      if (inserted.length) {
        await tx.insert(s.reviews).values({
          sightingId: id,
          eventId,
          reviewerId: people.get("coord-all")!,
          decidedAt: new Date(observedAt.getTime() + 3 * 3_600_000),
          fromState: "pending",
          toState: "approved",
        });
      }
    }
    // Pending sightings crafted for the review desk (one per check mark, and known sets
    // for the birds coordinator), then every check mark of the event computed as the
    // server does when sightings arrive.
    await seedReviewCases(tx, { eventId, people, zoneIds, taxonIds });
    const allIds = await tx.select({ id: s.sightings.id }).from(s.sightings).where(eq(s.sightings.eventId, eventId));
    await refreshCheckMarks(
      tx,
      allIds.map((r) => r.id),
    );

    // The second event, open now; volunteer1 records at both events.
    const org2 = demoId("org:second");
    await tx
      .insert(s.organisations)
      .values({ id: org2, ...SECOND_ORG })
      .onConflictDoNothing();
    const event2 = demoId("event:second");
    await addEvent(event2, org2, SECOND_EVENT, SECOND_AREA, SECOND_ZONES);
    for (const p of SECOND_PEOPLE) {
      const id = await addPerson(p);
      if (p.role === "organiser")
        await tx
          .insert(s.organisationMembers)
          .values({ organisationId: org2, userId: id, role: "organiser" })
          .onConflictDoNothing();
      else await tx.insert(s.eventMembers).values({ eventId: event2, userId: id, role: p.role }).onConflictDoNothing();
    }
    await tx
      .insert(s.eventMembers)
      .values({ eventId: event2, userId: people.get("vol-1")!, role: "volunteer" })
      .onConflictDoNothing();
    const winter = SEED_TAXA.filter(
      (t) =>
        t.group === "birds" ||
        t.group === "fungi" ||
        t.group === "mammals" ||
        (t.group === "vascular_plants" && t.habitat !== "wetland"),
    );
    await tx
      .insert(s.eventSpecies)
      .values(winter.map((t) => ({ eventId: event2, taxonId: taxonIds.get(t.scientificName)! })))
      .onConflictDoNothing();

    // The third event, in preparation, for the setup screens (appended; see SETUP_EVENT).
    const event3 = demoId("event:setup");
    await addEvent(event3, orgId, SETUP_EVENT);
    for (const m of SETUP_EVENT.members) {
      await tx
        .insert(s.eventMembers)
        .values({ eventId: event3, userId: people.get(m.key)!, role: m.role, taxonGroups: m.groups })
        .onConflictDoNothing();
    }
    await tx
      .insert(s.invitations)
      .values({
        id: demoId("invitation:setup"),
        eventId: event3,
        email: SETUP_EVENT.invitation.email,
        role: SETUP_EVENT.invitation.role,
        invitedBy: people.get("organiser")!,
      })
      .onConflictDoNothing();

    // The same reserve's count a year earlier, for the comparison between events.
    await seedEarlierEvent(tx, { orgId, people, taxonIds });

    const [counts] = await tx
      .execute<{ sessions: number; sightings: number; reviews: number }>(
        sql`
      SELECT (SELECT count(*) FROM count_sessions WHERE event_id = ${eventId})::int AS sessions,
             (SELECT count(*) FROM sightings WHERE event_id = ${eventId})::int AS sightings,
             (SELECT count(*) FROM reviews r JOIN sightings x ON x.id = r.sighting_id WHERE x.event_id = ${eventId})::int AS reviews`,
      )
      .then((r) => r.rows);
    const states = await tx.execute<{ state: string; n: number }>(sql`
      SELECT review_state AS state, count(*)::int AS n FROM sightings WHERE event_id = ${eventId} GROUP BY 1`);
    return {
      taxa: SEED_TAXA.length,
      people: DEMO_PEOPLE.length,
      sessions: counts!.sessions,
      sightings: counts!.sightings,
      reviews: counts!.reviews,
      byState: Object.fromEntries(states.rows.map((r) => [r.state, r.n])),
    };
  });
}
