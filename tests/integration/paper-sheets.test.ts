import { eq, sql } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { importPaperSheet, paperSheetChoices } from "@/db/queries/paper-sheets";
import * as s from "@/db/schema";
import { parseSheetCsv, sheetTemplate } from "@/lib/paper/sheet";
import { db, lonLat, makeFixture, sightingValues } from "./helpers";

/** What the paper-sheet handler does with a file: parse, and import only a file without problems. */
async function upload(eventId: string, uploaderId: string, csv: string, save: boolean) {
  const parsed = parseSheetCsv(csv);
  if (parsed.problems.length) return { problems: parsed.problems, saved: false };
  return importPaperSheet(eventId, uploaderId, parsed, save);
}

const paperRows = async (eventId: string) =>
  db()
    .select()
    .from(s.sightings)
    .where(sql`${s.sightings.eventId} = ${eventId} AND ${s.sightings.source} = 'paper_sheet'`);

async function sheetFixture(tag: string) {
  const f = await makeFixture(tag);
  await db().insert(s.eventSpecies).values({ eventId: f.event.id, taxonId: f.taxon.id });
  await db()
    .insert(s.taxonNames)
    .values({ taxonId: f.taxon.id, locale: "en", name: `Common ${tag}` });
  const [observer] = await db()
    .insert(s.users)
    .values({ email: `obs-${tag}@example.org`, name: `Observer ${tag}` })
    .returning();
  await db().insert(s.eventMembers).values({ eventId: f.event.id, userId: observer!.id, role: "volunteer" });
  return { ...f, observer: observer! };
}

// Europe/London is UTC+1 in June: 10:05 on the sheet is 09:05Z.
const sheet = (tag: string, taxonOnLine5: string) =>
  [
    "line_type,session_ref,observer_email,zone,session_kind,start,end,full_list,taxon,description,count,count_is_estimate,observed_at,latitude,longitude,accuracy_m,notes",
    `count_session,A,obs-${tag}@example.org,Zone A,walk,2026-06-20 10:00,2026-06-20 11:00,yes,,,,,,,,,wet morning`,
    `sighting,A,,,,,,,Testus ${tag},,2,no,2026-06-20 10:05,0.2,0.2,10,`,
    `sighting,A,,,,,,,Common ${tag},,5,yes,,,,,by the gate`,
    `sighting,,,Zone A,,,,,${taxonOnLine5},,1,no,2026-06-20 12:00,,,,`,
    `sighting,A,,,,,,,,small brown moth,1,no,,,,,`,
  ].join("\n");

describe("paper data sheets", () => {
  it("checks every line against the event, names the bad one and saves nothing", async () => {
    const f = await sheetFixture("paper-bad");
    const result = await upload(f.event.id, f.user.id, sheet("paper-bad", "Nonexistens vulgaris"), true);
    expect(result.saved).toBe(false);
    expect(result.problems).toEqual([
      { line: 5, column: "taxon", code: "unknownTaxon", values: { value: "Nonexistens vulgaris" } },
    ]);
    expect(await paperRows(f.event.id)).toHaveLength(0);
    expect(await db().select().from(s.countSessions).where(eq(s.countSessions.eventId, f.event.id))).toHaveLength(0);
  });

  it("refuses a file with format problems by line, before looking at the event", () => {
    const parsed = parseSheetCsv(
      [
        "line_type,session_ref,zone,session_kind,start,end,full_list,taxon,count,observed_at",
        "count_session,A,Zone A,walk,2026-06-20 10:00,,yes,,,",
        "sighting,B,,,,,,Testus,2,",
        "sighting,,,,,,,Testus,two,2026-06-31 10:00",
        "count_session,A,Zone A,hover,2026-06-20 10:00,2026-06-20 09:00,no,,,",
      ].join("\n"),
    );
    expect(parsed.problems.map((p) => [p.line, p.code])).toEqual([
      [2, "fullListNeedsEnd"],
      [3, "unknownSessionRef"],
      [4, "notNumber"],
      [4, "notDateTime"],
      [4, "noPlace"],
      [5, "duplicateSessionRef"],
      [5, "unknownSessionKind"],
      [5, "endBeforeStart"],
    ]);
  });

  it("stores a good sheet pending, marked paper sheet, with sessions as full lists and check marks", async () => {
    const f = await sheetFixture("paper-good");
    // The observer's own record sent from a phone, 3 minutes and a few metres from line 3's.
    const phone = sightingValues(f, {
      userId: f.observer.id,
      observedAt: new Date("2026-06-20T09:08:00Z"),
      location: lonLat(0.2001, 0.2),
    });
    await db().insert(s.sightings).values(phone);

    const checked = await upload(f.event.id, f.user.id, sheet("paper-good", "Testus paper-good"), false);
    expect(checked).toMatchObject({ problems: [], saved: false, summary: { sessions: 1, sightings: 4, fullLists: 1 } });
    expect(await paperRows(f.event.id)).toHaveLength(0);

    const saved = await upload(f.event.id, f.user.id, sheet("paper-good", "Testus paper-good"), true);
    expect(saved).toMatchObject({ problems: [], saved: true });

    const [session] = await db().select().from(s.countSessions).where(eq(s.countSessions.eventId, f.event.id));
    expect(session).toMatchObject({
      userId: f.observer.id,
      zoneId: f.zone.id,
      kind: "walk",
      allSpeciesNoted: true,
      startedAt: new Date("2026-06-20T09:00:00Z"),
      endedAt: new Date("2026-06-20T10:00:00Z"),
      notes: "wet morning",
    });
    const rows = (await paperRows(f.event.id)).sort((a, b) => a.observedAt.getTime() - b.observedAt.getTime());
    expect(rows).toHaveLength(4);
    for (const r of rows) expect(r).toMatchObject({ reviewState: "pending", transcribedBy: f.user.id });
    // Observer: line 5 has none of its own and no session, so it is the uploader's.
    expect(rows.map((r) => r.userId).sort()).toEqual([f.observer.id, f.observer.id, f.observer.id, f.user.id].sort());
    const byCount = (n: number, description = "") => rows.find((r) => r.count === n && r.description === description)!;
    // Line 3: its own time and point, in the session.
    expect(byCount(2)).toMatchObject({
      sessionId: session!.id,
      observedAt: new Date("2026-06-20T09:05:00Z"),
      accuracyM: 10,
      zoneId: f.zone.id,
    });
    // Line 4: named by its common name, the session's start, placed inside the session's zone.
    const line4 = byCount(5);
    expect(line4).toMatchObject({ taxonId: f.taxon.id, countIsEstimate: true, observedAt: session!.startedAt });
    const inside = await db().execute<{ inside: boolean }>(
      sql`SELECT ST_Covers(z.geom, s.location) AS inside FROM sightings s JOIN zones z ON z.id = ${f.zone.id} WHERE s.id = ${line4.id}`,
    );
    expect(inside.rows[0]!.inside).toBe(true);
    expect(line4.accuracyM).toBeGreaterThan(10_000); // covers the whole zone (about 0.5° square)
    // Line 6: unidentified, with its description.
    expect(byCount(1, "small brown moth")).toMatchObject({ taxonId: null, sessionId: session!.id });

    // Check marks: the paper record and the phone record are a possible duplicate pair.
    expect(byCount(2).checkMarks).toContain("possible_duplicate");
    const [phoneNow] = await db().select().from(s.sightings).where(eq(s.sightings.id, phone.id));
    expect(phoneNow!.checkMarks).toContain("possible_duplicate");
    expect(phoneNow!.source).toBe("phone");
  });

  it("refuses observers who are not members of the event and session kinds the event does not use", async () => {
    const f = await sheetFixture("paper-who");
    await db()
      .update(s.events)
      .set({ sessionKinds: ["timed_count"] })
      .where(eq(s.events.id, f.event.id));
    const csv = [
      "line_type,session_ref,observer_email,zone,session_kind,start,end,full_list,taxon,count",
      "count_session,A,stranger@example.org,Zone A,walk,2026-06-20 10:00,2026-06-20 11:00,no,,",
      "sighting,A,,Zone Z,,,,,Testus paper-who,1",
    ].join("\n");
    const result = await upload(f.event.id, f.user.id, csv, true);
    expect(result.problems.map((p) => [p.line, p.column, p.code])).toEqual([
      [2, "session_kind", "sessionKindNotUsed"],
      [2, "observer_email", "unknownObserver"],
      [3, "zone", "unknownZone"],
    ]);
    expect(await paperRows(f.event.id)).toHaveLength(0);
  });

  it("writes a template whose notes list the event's zones and species, and which parses as an empty sheet", async () => {
    const f = await sheetFixture("paper-tpl");
    const choices = await paperSheetChoices(f.event.id, "en");
    expect(choices).toMatchObject({ zones: ["Zone A"], taxa: ["Testus paper-tpl (Common paper-tpl)"] });
    const notes = { intro: "Template", lines: "Lines", times: "Times", kinds: "Kinds", zones: "Zones", taxa: "Taxa" };
    const csv = sheetTemplate({ ...choices!, notes });
    expect(csv).toContain("#   Testus paper-tpl (Common paper-tpl)");
    expect(parseSheetCsv(csv).problems.map((p) => p.code)).toEqual(["empty"]);
    // The template's listing of a taxon is accepted as its name.
    const filled = `${csv}sighting,,,Zone A,,,,,,Testus paper-tpl (Common paper-tpl),,3,no,2026-06-20 12:00,,,,\n`;
    const result = await upload(f.event.id, f.user.id, filled, false);
    expect(result.problems).toEqual([]);
  });
});
