import { describe, expect, it } from "vitest";
import type { SessionRecord, SightingRecord } from "./records";
import {
  FUTURE_SKEW_MS,
  judgeSession,
  judgeSighting,
  MAX_COUNT,
  outsideSession,
  SESSION_SLACK_MS,
  type SessionTimes,
  sightingCautions,
} from "./rules";

// The rules both ends of the sync contract judge a record by (the phone at save, the server on arrival).
const ZONE = "22222222-2222-4222-8222-222222222222";
const TAXON = "33333333-3333-4333-8333-333333333333";
const NOW = Date.parse("2026-06-20T12:00:00Z");

const session = (over: Partial<SessionRecord> = {}): SessionRecord => ({
  id: "11111111-1111-4111-8111-111111111111",
  zoneId: ZONE,
  kind: "walk",
  startedAt: "2026-06-20T08:00:00Z",
  endedAt: "2026-06-20T09:00:00Z",
  allSpeciesNoted: true,
  distanceM: 800,
  notes: "",
  ...over,
});
const sighting = (over: Partial<SightingRecord> = {}): SightingRecord => ({
  id: "44444444-4444-4444-8444-444444444444",
  sessionId: null,
  taxonId: TAXON,
  description: "",
  count: 3,
  countIsEstimate: false,
  observedAt: "2026-06-20T08:30:00Z",
  latitude: 0.5,
  longitude: 0.5,
  accuracyM: 5,
  zoneId: null,
  notes: "",
  photoIds: [],
  ...over,
});
const sessionCtx = { kinds: ["walk", "timed_count"], zoneIds: new Set([ZONE]) };
const sightingCtx = { now: NOW, knownTaxa: new Set([TAXON]) };

describe("session rules", () => {
  it("accept a good session, and refuse a kind, zone or times the event cannot take, naming the field", () => {
    expect(judgeSession(session(), sessionCtx)).toBeNull();
    expect(judgeSession(session({ kind: "plot_search" }), sessionCtx)).toEqual({
      code: "kind_not_allowed",
      field: "kind",
    });
    expect(judgeSession(session({ zoneId: TAXON }), sessionCtx)).toEqual({ code: "unknown_zone", field: "zoneId" });
    expect(judgeSession(session({ endedAt: "2026-06-20T08:00:00Z" }), sessionCtx)).toEqual({
      code: "ends_before_start",
      field: "endedAt",
    });
    expect(judgeSession(session({ endedAt: null }), sessionCtx)).toEqual({
      code: "complete_needs_end",
      field: "allSpeciesNoted",
    });
    expect(judgeSession(session({ endedAt: null, allSpeciesNoted: false }), sessionCtx)).toBeNull();
  });
});

describe("sighting rules", () => {
  it("refuse a time in the future beyond the clock allowance, but not within it", () => {
    const soon = new Date(NOW + FUTURE_SKEW_MS - 1000).toISOString();
    const later = new Date(NOW + FUTURE_SKEW_MS + 1000).toISOString();
    expect(judgeSighting(sighting({ observedAt: soon }), sightingCtx)).toBeNull();
    expect(judgeSighting(sighting({ observedAt: later }), sightingCtx)).toEqual({
      code: "future_time",
      field: "observedAt",
    });
  });

  it("refuse a count above the limit with the limit in the reason, and an unidentified record without a description", () => {
    expect(judgeSighting(sighting({ count: MAX_COUNT }), sightingCtx)).toBeNull();
    expect(judgeSighting(sighting({ count: MAX_COUNT + 1 }), sightingCtx)).toEqual({
      code: "count_too_high",
      field: "count",
      values: { maximum: MAX_COUNT },
    });
    expect(judgeSighting(sighting({ taxonId: null, description: "  " }), sightingCtx)).toEqual({
      code: "description_required",
      field: "description",
    });
  });

  it("refuse a time outside the session's start and end (a minute either side is allowed; a running session has no end)", () => {
    const times = { startedAt: "2026-06-20T08:00:00Z", endedAt: "2026-06-20T09:00:00Z" };
    const inSession = (observedAt: string, s: SessionTimes = times) =>
      judgeSighting(sighting({ sessionId: session().id, observedAt }), { ...sightingCtx, session: s });
    expect(inSession("2026-06-20T08:30:00Z")).toBeNull();
    expect(inSession(new Date(Date.parse(times.startedAt) - SESSION_SLACK_MS).toISOString())).toBeNull();
    expect(inSession("2026-06-20T07:58:00Z")).toEqual({ code: "outside_session", field: "observedAt" });
    expect(inSession("2026-06-20T09:02:00Z")).toEqual({ code: "outside_session", field: "observedAt" });
    expect(inSession("2026-06-20T11:00:00Z", { ...times, endedAt: null })).toBeNull();
    expect(
      outsideSession(new Date("2026-06-20T07:00:00Z"), { startedAt: new Date(times.startedAt), endedAt: null }),
    ).toBe(true);
  });

  it("refuse an unknown taxon only when the judge knows the taxa", () => {
    const other = sighting({ taxonId: ZONE });
    expect(judgeSighting(other, sightingCtx)).toEqual({ code: "unknown_taxon", field: "taxonId" });
    expect(judgeSighting(other, { ...sightingCtx, knownTaxa: null })).toBeNull();
  });
});

describe("cautions (check marks the phone can see)", () => {
  const area = {
    type: "Polygon" as const,
    coordinates: [
      [
        [0, 0],
        [1, 0],
        [1, 1],
        [0, 1],
        [0, 0],
      ],
    ],
  };
  const ctx = { startsAt: "2026-06-20T06:00:00Z", endsAt: "2026-06-21T18:00:00Z", area, highCountAbove: 50 };

  it("say nothing for a sighting inside the area and dates with an ordinary count", () => {
    expect(sightingCautions(sighting(), ctx)).toEqual([]);
    // On the boundary counts as inside, as PostGIS ST_Covers does.
    expect(sightingCautions(sighting({ latitude: 0, longitude: 0.5 }), ctx)).toEqual([]);
  });

  it("name outside the area, outside the dates and an unusually high count", () => {
    expect(sightingCautions(sighting({ latitude: 2, observedAt: "2026-06-22T08:00:00Z", count: 51 }), ctx)).toEqual([
      "outside_area",
      "outside_dates",
      "high_count",
    ]);
    expect(sightingCautions(sighting({ latitude: 2 }), { ...ctx, area: null, highCountAbove: null })).toEqual([]);
  });
});
