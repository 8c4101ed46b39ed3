import { readFileSync } from "node:fs";
import { sql } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { removeEventSpecies } from "@/db/queries/setup";
import { importSpecies, listEventSpecies } from "@/db/queries/setup-species";
import { seedDemo } from "@/db/seed/demo";
import * as s from "@/db/schema";
import { parseSpeciesCsv, problemLines } from "@/lib/species/csv";
import { db, makeFixture } from "./helpers";

const fixture = (name: string) => readFileSync(`tests/fixtures/setup/${name}`, "utf8");
const counts = async (eventId: string) => {
  const { rows } = await db().execute<{ taxa: number; names: number; listed: number }>(sql`
    SELECT (SELECT count(*) FROM taxa)::int AS taxa, (SELECT count(*) FROM taxon_names)::int AS names,
           (SELECT count(*) FROM event_species WHERE event_id = ${eventId})::int AS listed`);
  return rows[0]!;
};

/** What the species handler does with a file: parse, and import only a file without problems. */
async function importFile(eventId: string, csv: string, save: boolean) {
  const parsed = parseSpeciesCsv(csv);
  if (parsed.problems.length) return { problems: parsed.problems, saved: false };
  return importSpecies(eventId, parsed.rows, save);
}

// The example file shares three taxa with the demo's list: seed it first, as on a real
// site, so that the import meets taxa other events already show.
beforeAll(async () => {
  await seedDemo(db() as never);
});

describe("species-list import", () => {
  it("reports exactly the three bad lines of a file and saves nothing of it", async () => {
    const f = await makeFixture("species-bad");
    const before = await counts(f.event.id);
    const result = await importFile(f.event.id, fixture("species-bad.csv"), true);
    expect(result.saved).toBe(false);
    expect(problemLines(result.problems)).toEqual([3, 5, 7]);
    expect(await counts(f.event.id)).toEqual(before);
  });

  it("refuses a whole file when one line contradicts a shared taxon, even with the other lines valid", async () => {
    const f = await makeFixture("species-conflict");
    await db()
      .insert(s.taxa)
      .values({ scientificName: "Erica conflicta", taxonGroup: "vascular_plants" })
      .onConflictDoNothing();
    const before = await counts(f.event.id);
    const csv = "scientific_name,rank,taxon_group\nNewus fungus,species,fungi\nErica conflicta,species,insects\n";
    const result = await importFile(f.event.id, csv, true);
    expect(result.saved).toBe(false);
    expect(result.problems).toMatchObject([{ line: 3, column: "taxon_group", code: "groupConflict" }]);
    expect(await counts(f.event.id)).toEqual(before);
  });

  it("saves a valid file in one go, and a second import merges without duplicating anything", async () => {
    const f = await makeFixture("species-merge");
    const first = await importFile(f.event.id, fixture("species.csv"), true);
    expect(first).toMatchObject({ saved: true, problems: [], summary: { newTaxa: 3, addedToList: 6 } });
    // Amanita muscaria keeps the demo's Spanish name; the file's is not applied.
    expect(
      "notices" in first && first.notices.filter((n) => n.code === "nameKept").map((n) => [n.line, n.values?.stored]),
    ).toEqual([
      [2, "Falsa oronja"],
      [3, "Boleto comestible"],
      [4, "Golden chanterelle"],
    ]);
    const once = await counts(f.event.id);
    expect(once.listed).toBe(6);
    const second = await importFile(f.event.id, fixture("species.csv"), true);
    expect(second).toMatchObject({
      saved: true,
      summary: { alreadyListed: 6, addedToList: 0, newTaxa: 0, namesAdded: 0 },
    });
    expect(await counts(f.event.id)).toEqual(once);
    const list = await listEventSpecies(f.event.id);
    expect(list.find((t) => t.scientificName === "Hericium erinaceus")).toMatchObject({
      sensitivity: "restricted",
      names: { en: "Bearded tooth", es: "Melena de león" },
    });
  });

  it("never renames a shared taxon or lowers its sensitivity; adds only missing names and raises sensitivity", async () => {
    const other = await makeFixture("species-other-event");
    await importFile(
      other.event.id,
      "scientific_name,rank,taxon_group,sensitivity,common_name_en\nLactarius shareus,species,fungi,generalised,Shared milkcap\nBoletus shareus,species,fungi,,Shared bolete\n",
      true,
    );
    const mine = await makeFixture("species-mine");
    const csv =
      "scientific_name,rank,taxon_group,sensitivity,common_name_en,common_name_fr\nlactarius shareus,species,fungi,open,My milkcap,Lactaire partagé\nBoletus shareus,species,fungi,restricted,,\n";
    const checked = await importFile(mine.event.id, csv, false);
    expect(checked.saved).toBe(false);
    expect("notices" in checked && checked.notices.map((n) => [n.line, n.code])).toEqual([
      [2, "nameKept"],
      [2, "nameAdded"],
      [2, "sensitivityKept"],
      [3, "sensitivityRaised"],
    ]);
    expect(await listEventSpecies(mine.event.id)).toEqual([]);
    await importFile(mine.event.id, csv, true);
    // The other event still shows its own English name; the French one was missing and is added.
    const theirs = await listEventSpecies(other.event.id);
    expect(theirs.find((t) => t.scientificName === "Lactarius shareus")).toMatchObject({
      sensitivity: "generalised",
      names: { en: "Shared milkcap", fr: "Lactaire partagé" },
    });
    expect(theirs.find((t) => t.scientificName === "Boletus shareus")).toMatchObject({ sensitivity: "restricted" });
    expect((await listEventSpecies(mine.event.id)).map((t) => t.scientificName)).toEqual([
      "Boletus shareus",
      "Lactarius shareus",
    ]);
  });
});

describe("removing a species from an event's list (issue 16)", () => {
  it("is refused with the number of the event's sightings of it, and done when none use it", async () => {
    const f = await makeFixture("species-remove");
    const [unused] = await db()
      .insert(s.taxa)
      .values({ scientificName: "Testus unusedus", taxonGroup: "birds" })
      .returning();
    await db()
      .insert(s.eventSpecies)
      .values([f.taxon, unused!].map((t) => ({ eventId: f.event.id, taxonId: t.id })));
    const sighting = (state: "pending" | "rejected") => ({
      id: crypto.randomUUID(),
      eventId: f.event.id,
      userId: f.user.id,
      taxonId: f.taxon.id,
      count: 1,
      observedAt: new Date("2026-06-20T09:00:00Z"),
      location: { longitude: 0.2, latitude: 0.2 },
      accuracyM: 10,
      reviewState: state,
    });
    await db()
      .insert(s.sightings)
      .values([sighting("pending"), sighting("rejected")]);
    // Any review state counts: the sightings were checked against this list.
    expect(await removeEventSpecies(f.event.id, f.taxon.id)).toBe(2);
    expect(await removeEventSpecies(f.event.id, unused!.id)).toBe("removed");
    expect(await removeEventSpecies(f.event.id, unused!.id)).toBe("notListed");
    const listed = await db().execute<{ id: string }>(
      sql`SELECT taxon_id AS id FROM event_species WHERE event_id = ${f.event.id}`,
    );
    expect(listed.rows.map((r) => r.id)).toEqual([f.taxon.id]);
  });
});
