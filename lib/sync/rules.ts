import booleanPointInPolygon from "@turf/boolean-point-in-polygon";
import type { ArealGeometry } from "@/lib/geo/areal";
import type { RefusalCode } from "./acks";
import type { SessionRecord, SightingRecord } from "./records";

// The rules a record is judged by, in one pure module for both ends of the sync contract:
// the phone runs them at save, before anything is queued, and shows the same translated
// reason (FieldSync.reason.<code>) the server would answer; the server (db/queries/sync.ts)
// runs them again and refuses with the same codes. Checks that need the database (is the
// taxon known, is the session the person's own) take what the caller knows as arguments.
//
// Refusals stop a record. Cautions do not: they are the reviewers' check marks (design.md
// "Words") that the phone can already see, said to the volunteer before they save.

// A device clock a little ahead of the server's is normal; a time far ahead is a mistake.
// 10 minutes is common practice for clock skew, not a published figure.
export const FUTURE_SKEW_MS = 10 * 60_000;
// The form's time field has whole minutes: a sighting may sit that much outside its session's times.
export const SESSION_SLACK_MS = 60_000;
/** The largest count one sighting may carry (more is a typing slip; a flock that size is several sightings). */
export const MAX_COUNT = 1_000_000;

/** Counts above these are unusually high for a taxon group with few records at the event: the project's own tunable choice, not a published or common figure. */
export const GROUP_THRESHOLDS = {
  birds: 50,
  vascular_plants: 200,
  insects: 100,
  fungi: 50,
  mammals: 10,
  amphibians_reptiles: 30,
  molluscs: 50,
  other: 50,
} as const;

export type Refusal = { code: RefusalCode; field: string; values?: Record<string, string | number> };

const at = (t: string | Date) => (t instanceof Date ? t.getTime() : Date.parse(t));

export type SessionContext = {
  kinds: readonly string[]; // the event's session kinds
  zoneIds: ReadonlySet<string>; // the event's zones
};

export function judgeSession(rec: SessionRecord, ctx: SessionContext): Refusal | null {
  if (!ctx.kinds.includes(rec.kind)) return { code: "kind_not_allowed", field: "kind" };
  if (rec.zoneId !== null && !ctx.zoneIds.has(rec.zoneId.toLowerCase()))
    return { code: "unknown_zone", field: "zoneId" };
  if (rec.endedAt !== null && at(rec.endedAt) <= at(rec.startedAt))
    return { code: "ends_before_start", field: "endedAt" };
  if (rec.allSpeciesNoted && rec.endedAt === null) return { code: "complete_needs_end", field: "allSpeciesNoted" };
  return null;
}

export type SessionTimes = { startedAt: string | Date; endedAt: string | Date | null };

export type SightingContext = {
  now: number; // epoch ms
  /** The taxa the judge knows; null when it cannot tell (the phone), and the server decides. */
  knownTaxa: ReadonlySet<string> | null;
  /** The times of the session the sighting names, when the judge has them. */
  session?: SessionTimes | null;
};

/** Observed outside the session's start and end (a running session has no end yet), give or take a minute. */
export function outsideSession(observedAt: string | Date, session: SessionTimes): boolean {
  const t = at(observedAt);
  if (t < at(session.startedAt) - SESSION_SLACK_MS) return true;
  return session.endedAt !== null && t > at(session.endedAt) + SESSION_SLACK_MS;
}

export function judgeSighting(rec: SightingRecord, ctx: SightingContext): Refusal | null {
  if (rec.taxonId === null && rec.description.trim() === "")
    return { code: "description_required", field: "description" };
  if (rec.count > MAX_COUNT) return { code: "count_too_high", field: "count", values: { maximum: MAX_COUNT } };
  if (at(rec.observedAt) > ctx.now + FUTURE_SKEW_MS) return { code: "future_time", field: "observedAt" };
  if (rec.sessionId !== null && ctx.session && outsideSession(rec.observedAt, ctx.session))
    return { code: "outside_session", field: "observedAt" };
  if (rec.taxonId !== null && ctx.knownTaxa && !ctx.knownTaxa.has(rec.taxonId.toLowerCase()))
    return { code: "unknown_taxon", field: "taxonId" };
  return null;
}

/** The check marks a phone can see before saving (the server computes its own: db/queries/check-marks.ts). */
export type Caution = "outside_area" | "outside_dates" | "high_count";

export type CautionContext = {
  startsAt: string | Date;
  endsAt: string | Date;
  area: ArealGeometry | null; // no area drawn: never outside
  /** The count above which this taxon's count is unusual; null when the judge cannot tell. */
  highCountAbove: number | null;
};

export function sightingCautions(rec: SightingRecord, ctx: CautionContext): Caution[] {
  const out: Caution[] = [];
  if (ctx.area && !booleanPointInPolygon([rec.longitude, rec.latitude], ctx.area)) out.push("outside_area");
  const t = at(rec.observedAt);
  if (t < at(ctx.startsAt) || t > at(ctx.endsAt)) out.push("outside_dates");
  if (ctx.highCountAbove !== null && rec.count > ctx.highCountAbove) out.push("high_count");
  return out;
}
