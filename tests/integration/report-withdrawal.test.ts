import { sql } from "drizzle-orm";
import { strFromU8, unzipSync } from "fflate";
import { describe, expect, it } from "vitest";
import { GET as fileGet } from "@/app/api/reports/[reportId]/[file]/route";
import { withdrawInput } from "@/app/api/events/[eventId]/reports/[version]/withdraw/schema";
import { getReport, latestStandingVersion, listReports } from "@/db/queries/reports";
import * as s from "@/db/schema";
import { ApiError } from "@/lib/http/errors";
import { publishReport } from "@/server/results/publish";
import { withdrawReport } from "@/server/results/withdraw";
import { db, makeFixture, refusal, sightingValues } from "./helpers";

// Issue 16: a published version can be withdrawn with a reason. The report row never changes;
// the withdrawal is an append-only row of its own, and the version stays readable.
describe("withdrawing a report version", () => {
  it("keeps the version and its data, records the reason once, and its files say so", async () => {
    const f = await makeFixture("withdraw");
    await db()
      .insert(s.sightings)
      .values([sightingValues(f, { reviewState: "approved", count: 2 })]);
    const v1 = await publishReport(f.event.id, f.user.id);
    await db()
      .insert(s.sightings)
      .values([sightingValues(f, { reviewState: "approved", count: 5 })]);
    const v2 = await publishReport(f.event.id, f.user.id);
    const before = (await getReport(f.event.id, 1))!;
    expect(before.withdrawal).toBeNull();
    expect(await latestStandingVersion(f.event.id)).toBe(2);

    await withdrawReport(f.event.id, 2, f.user.id, "A count was typed in twice.");
    const after = (await getReport(f.event.id, 2))!;
    expect(after.withdrawal).toMatchObject({ reason: "A count was typed in twice." });
    expect(after.withdrawal!.withdrawnAt).toBeInstanceOf(Date);
    // The data stay: the same results, hash and inputs as when published.
    expect(after.inputHash).toBe((await getReport(f.event.id, 2))!.inputHash);
    expect(after.results.totals.individuals).toBe(7);
    expect(after.latestVersion).toBe(2);
    // Version 1 is the latest one standing; the list names the withdrawn one and its reason.
    expect(await latestStandingVersion(f.event.id)).toBe(1);
    const list = await listReports(f.event.id);
    expect(list.map((r) => [r.version, r.withdrawReason])).toEqual([
      [2, "A count was typed in twice."],
      [1, null],
    ]);

    // Once only; an unknown version is not found.
    const twice = await withdrawReport(f.event.id, 2, f.user.id, "again").catch((e: unknown) => e);
    expect(twice).toBeInstanceOf(ApiError);
    expect((twice as ApiError).code).toBe("conflict");
    const missing = await withdrawReport(f.event.id, 9, f.user.id, "none").catch((e: unknown) => e);
    expect((missing as ApiError).code).toBe("not_found");

    // The withdrawal row is append-only, like the report itself.
    expect(
      await refusal(() => db().execute(sql`UPDATE report_withdrawals SET reason = 'x' WHERE report_id = ${v2.id}`)),
    ).toMatchObject({ code: "23000" });
    expect(
      await refusal(() => db().execute(sql`DELETE FROM report_withdrawals WHERE report_id = ${v2.id}`)),
    ).toMatchObject({ code: "23000" });

    // Its files stay downloadable, as its page stays readable, and the archive's metadata says why.
    const zip = await fileGet(new Request(`http://localhost:3000/api/reports/${v2.id}/darwin-core-archive.zip`), {
      params: Promise.resolve({ reportId: v2.id, file: "darwin-core-archive.zip" }),
    } as never);
    expect(zip.status).toBe(200);
    const eml = strFromU8(unzipSync(new Uint8Array(await zip.arrayBuffer()))["eml.xml"]!);
    expect(eml).toContain("This report version was withdrawn on");
    expect(eml).toContain("A count was typed in twice.");
    expect(v1.version).toBe(1);
  });

  it("publishing keeps the organiser's note and can hold back the participants' mail", async () => {
    const f = await makeFixture("publish-note");
    await db().insert(s.eventMembers).values({ eventId: f.event.id, userId: f.user.id, role: "volunteer" });
    await db()
      .insert(s.sightings)
      .values([sightingValues(f, { reviewState: "approved" })]);
    const mails = async () =>
      (
        await db().execute<{ n: number }>(
          sql`SELECT count(*)::int AS n FROM email_outbox WHERE kind = 'report_published' AND to_address = ${f.user.email}`,
        )
      ).rows[0]!.n;
    await publishReport(f.event.id, f.user.id, { note: "  Thanks, all.  ", notify: false });
    expect((await getReport(f.event.id, 1))!.note).toBe("Thanks, all.");
    expect(await mails()).toBe(0);
    await publishReport(f.event.id, f.user.id);
    expect((await getReport(f.event.id, 2))!.note).toBe("");
    expect(await mails()).toBe(1);
  });

  it("needs a reason", () => {
    expect(withdrawInput.safeParse({ reason: "  " }).success).toBe(false);
    expect(withdrawInput.safeParse({}).success).toBe(false);
    expect(withdrawInput.safeParse({ reason: "Wrong zone file." }).success).toBe(true);
  });
});
