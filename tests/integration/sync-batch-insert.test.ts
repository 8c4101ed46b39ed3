import { inArray, sql } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { ingestBatch } from "@/db/queries/sync";
import * as s from "@/db/schema";
import type { SightingRecord } from "@/lib/sync/records";
import { db, makeFixture, syncSighting } from "./helpers";

// New sightings of a sync batch are stored by one INSERT over arrays (issue 18). Each field
// must arrive as it was sent, whatever its text holds, and a resent batch must still find
// every record unchanged ("already_had").
let f: Awaited<ReturnType<typeof makeFixture>>;
const NOW = new Date("2026-06-21T00:00:00Z");

const sighting = (over: Record<string, unknown>): SightingRecord => syncSighting(f.taxon.id, over);

beforeAll(async () => {
  f = await makeFixture("batchinsert");
});

describe("a sync batch's new sightings", () => {
  it("are stored field for field, awkward text and all, and a resend finds them unchanged", async () => {
    const records = [
      sighting({ notes: 'a "quoted", {braced} note\\ with a backslash', count: 7, countIsEstimate: true }),
      sighting({ taxonId: null, description: "NULL", notes: "ثلاثة طيور — été", accuracyM: 12.345678 }),
      sighting({ notes: "", observedAt: "2026-06-20T08:11:12.345Z", latitude: 0.123456789012, longitude: 0.987654321 }),
      sighting({ description: "  spaces  ", latitude: 0.6, longitude: 0.6, accuracyM: 0 }),
    ];
    const batch = { userId: f.user.id, eventId: f.event.id, sessions: [], now: NOW };
    const indexed = records.map((record, index) => ({ index, record }));
    const first = await ingestBatch({ ...batch, sightings: indexed });
    expect(first.map((a) => a.outcome)).toEqual(["created", "created", "created", "created"]);

    const stored = await db()
      .select({
        id: s.sightings.id,
        taxonId: s.sightings.taxonId,
        description: s.sightings.description,
        notes: s.sightings.notes,
        count: s.sightings.count,
        countIsEstimate: s.sightings.countIsEstimate,
        observedAt: s.sightings.observedAt,
        accuracyM: s.sightings.accuracyM,
        longitude: sql<number>`ST_X(${s.sightings.location})`,
        latitude: sql<number>`ST_Y(${s.sightings.location})`,
        zoneId: s.sightings.zoneId,
        userId: s.sightings.userId,
        eventId: s.sightings.eventId,
      })
      .from(s.sightings)
      .where(
        inArray(
          s.sightings.id,
          records.map((r) => r.id),
        ),
      );
    for (const r of records) {
      const row = stored.find((x) => x.id === r.id)!;
      expect(row).toMatchObject({
        taxonId: r.taxonId,
        description: r.description,
        notes: r.notes,
        count: r.count,
        countIsEstimate: r.countIsEstimate,
        userId: f.user.id,
        eventId: f.event.id,
      });
      // real: single precision, as the column holds it.
      expect(Math.fround(row.accuracyM)).toBe(Math.fround(r.accuracyM));
      expect(row.observedAt.toISOString()).toBe(new Date(r.observedAt).toISOString());
      expect([Number(row.longitude), Number(row.latitude)]).toEqual([r.longitude, r.latitude]);
    }
    // The zone is the server's: the fixture's zone covers (0, 0)–(0.5, 0.5), nothing covers (0.6, 0.6).
    expect(stored.find((x) => x.id === records[0]!.id)!.zoneId).toBe(f.zone.id);
    expect(stored.find((x) => x.id === records[3]!.id)!.zoneId).toBeNull();

    const again = await ingestBatch({ ...batch, sightings: indexed });
    expect(again.map((a) => a.outcome)).toEqual(["already_had", "already_had", "already_had", "already_had"]);
  });
});
