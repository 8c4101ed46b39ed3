import { createHash } from "node:crypto";
import { sql } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { GET as listEvents } from "@/app/api/v1/events/route";
import {
  GET as sightingsGet,
  POST as sightingsPost,
  DELETE as sightingsDelete,
} from "@/app/api/v1/events/[eventId]/sightings/route";
import { GET as resultsGet } from "@/app/api/v1/events/[eventId]/results/route";
import { GET as reportsGet } from "@/app/api/v1/events/[eventId]/reports/route";
import { GET as reportGet } from "@/app/api/v1/events/[eventId]/reports/[version]/route";
import { GET as openapiGet } from "@/app/api/openapi.json/route";
import { createApiToken, revokeApiToken, recordApiTokenCall } from "@/db/queries/api-tokens";
import { publishReport } from "@/server/results/publish";
import { withdrawReport } from "@/server/results/withdraw";
import { decide } from "@/db/queries/review";
import * as s from "@/db/schema";
import { DWC_TERMS, generalise } from "@/lib/results/exports";
import { makeApiToken } from "@/server/auth/api-token-secret";
import { currentResults } from "@/server/results/current";
import { publicResultsOf } from "@/db/queries/reports";
import { db, makeFixture, lonLat, sightingValues } from "./helpers";

// The read-only API through its real handlers and PostgreSQL: what a records centre's
// script gets with a token, and what it never gets.
type Fixture = Awaited<ReturnType<typeof makeFixture>>;
let f: Fixture;
let other: Fixture;
const secrets: Record<string, string> = {};
const ids: Record<string, string> = {};
const approvedOpen: string[] = [];
let generalisedId = "";

async function token(name: string, fx: Fixture, scope: "event" | "organisation", days = 30) {
  const t = makeApiToken();
  const row = await createApiToken({
    organisationId: fx.org.id,
    eventId: scope === "event" ? fx.event.id : null,
    name,
    prefix: t.prefix,
    tokenHash: t.hash,
    createdBy: fx.user.id,
    expiresAt: new Date(Date.now() + days * 86_400_000),
  });
  secrets[name] = t.secret;
  ids[name] = row.id;
}

const call = (
  handler: (r: Request, c: never) => Promise<Response>,
  path: string,
  secret: string | null,
  params: Record<string, string> = {},
  method = "GET",
) =>
  handler(
    new Request(`http://localhost:3000${path}`, {
      method,
      headers: secret ? { authorization: `Bearer ${secret}` } : {},
    }),
    { params: Promise.resolve(params) } as never,
  );

const sightings = (query: string, secret = secrets.event!, eventId = f.event.id) =>
  call(sightingsGet, `/api/v1/events/${eventId}/sightings${query}`, secret, { eventId });

beforeAll(async () => {
  f = await makeFixture("apitok");
  other = await makeFixture("apitok-other");
  const [generalised] = await db()
    .insert(s.taxa)
    .values({ scientificName: "Generalis apitok", taxonGroup: "birds", sensitivity: "generalised" })
    .returning();
  const [restricted] = await db()
    .insert(s.taxa)
    .values({ scientificName: "Restrictus apitok", taxonGroup: "birds", sensitivity: "restricted" })
    .returning();
  // Changed one minute apart, so `since` can pick a known part of them.
  const at = (i: number) => new Date(Date.UTC(2026, 5, 21, 0, i));
  const rows = [
    ...[0, 1, 2].map((i) => sightingValues(f, { reviewState: "approved", count: i + 1, updatedAt: at(i) })),
    sightingValues(f, {
      reviewState: "approved",
      taxonId: generalised!.id,
      location: lonLat(0.234, 0.345),
      accuracyM: 12,
      updatedAt: at(3),
    }),
    sightingValues(f, { reviewState: "approved", taxonId: restricted!.id, updatedAt: at(4) }),
    sightingValues(f, { reviewState: "pending", updatedAt: at(5) }),
    sightingValues(other, { reviewState: "approved", updatedAt: at(6) }),
  ];
  await db().insert(s.sightings).values(rows);
  approvedOpen.push(...rows.slice(0, 3).map((r) => r.id));
  generalisedId = rows[3]!.id;
  await token("event", f, "event");
  await token("organisation", f, "organisation");
  await token("other", other, "event");
  await token("revoked", f, "event");
});

describe("read-only API tokens", () => {
  it("keeps only the SHA-256 of the secret and a short prefix", async () => {
    const { rows } = await db().execute<{ token_hash: string; prefix: string }>(
      sql`SELECT token_hash, prefix FROM api_tokens WHERE id = ${ids.event}`,
    );
    expect(rows[0]!.token_hash).toBe(createHash("sha256").update(secrets.event!).digest("hex"));
    expect(secrets.event!.startsWith(rows[0]!.prefix)).toBe(true);
    expect(rows[0]!.prefix.length).toBeLessThan(secrets.event!.length / 3);
    const { rows: found } = await db().execute(
      sql`SELECT 1 FROM api_tokens WHERE token_hash = ${secrets.event} OR prefix = ${secrets.event}`,
    );
    expect(found).toHaveLength(0);
  });

  it("pulls approved sightings as Darwin Core, sensitive taxa as in the public downloads", async () => {
    const res = await sightings("");
    expect(res.status).toBe(200);
    const body = await res.json();
    const got = body.records.map((r: { occurrenceID: string }) => r.occurrenceID.replace("urn:uuid:", ""));
    expect(got.sort()).toEqual([...approvedOpen, generalisedId].sort()); // not pending, not restricted, not another event's
    expect(body.withheld).toBe(1);
    const g = body.records.find((r: { occurrenceID: string }) => r.occurrenceID === `urn:uuid:${generalisedId}`);
    const cell = generalise(0.234, 0.345, 12);
    expect([g.decimalLongitude, g.decimalLatitude, g.coordinateUncertaintyInMeters]).toEqual([
      cell.lon,
      cell.lat,
      cell.uncertaintyM,
    ]);
    expect(g.dataGeneralizations).toMatch(/generalised/);
    const open = body.records.find((r: { occurrenceID: string }) => r.occurrenceID === `urn:uuid:${approvedOpen[0]}`);
    expect([open.decimalLongitude, open.decimalLatitude, open.dataGeneralizations]).toEqual([0.2, 0.2, ""]);
    expect(open.basisOfRecord).toBe("HumanObservation");
    expect(body.nextCursor).toBeNull();
    expect(body.modifiedUntil).toBe("2026-06-21T00:04:00.000Z"); // the restricted one changed last, and was seen
  });

  it("pages by cursor without losing or repeating a sighting", async () => {
    const seen: string[] = [];
    let cursor: string | null = null;
    let pages = 0;
    do {
      const res = await sightings(`?limit=2${cursor ? `&cursor=${cursor}` : ""}`);
      const body = await res.json();
      seen.push(...body.records.map((r: { occurrenceID: string }) => r.occurrenceID));
      cursor = body.nextCursor;
      pages++;
    } while (cursor && pages < 10);
    expect(pages).toBe(3); // five approved rows (one withheld), two a page
    expect(new Set(seen).size).toBe(seen.length);
    expect(seen).toHaveLength(4);
    expect((await sightings("?cursor=bm90LWEtY3Vyc29y")).status).toBe(400);
  });

  it("pulls only what changed since a time, and sees a later change", async () => {
    const body = await (await sightings("?since=2026-06-21T00:02:00Z")).json();
    expect(body.records.map((r: { individualCount: number }) => r.individualCount).sort()).toEqual([1, 3]); // the third open one and the generalised one
    await db().execute(
      sql`UPDATE sightings SET count = 7, updated_at = '2026-06-21T01:00:00Z' WHERE id = ${approvedOpen[0]}`,
    );
    const next = await (await sightings(`?since=${encodeURIComponent(body.modifiedUntil)}`)).json();
    expect(
      next.records.map((r: { occurrenceID: string; individualCount: number }) => [r.occurrenceID, r.individualCount]),
    ).toContainEqual([`urn:uuid:${approvedOpen[0]}`, 7]);
    expect(next.records.find((r: { modified: string }) => r.modified === "2026-06-21T01:00:00.000Z")).toBeTruthy();
    expect(next.withdrawn).toEqual([]);
  });

  it("lists, on an incremental pull, a sighting approved once and rejected since", async () => {
    const id = approvedOpen[1]!;
    // Seeded as approved: the desk's approval on record, then a reviewer rejects it.
    await db()
      .execute(sql`INSERT INTO reviews (sighting_id, event_id, reviewer_id, from_state, to_state, from_taxon_id, to_taxon_id, reason, message)
      VALUES (${id}, ${f.event.id}, ${f.user.id}, 'pending', 'approved', ${f.taxon.id}, ${f.taxon.id}, '', '')`);
    const before = new Date().toISOString();
    const v = (await db().execute<{ version: number }>(sql`SELECT version FROM sightings WHERE id = ${id}`)).rows[0]!
      .version;
    const rejected = await decide({ eventId: f.event.id, taxonGroups: [], locale: "en" }, f.user.id, id, {
      action: "reject",
      version: v,
      reason: "misidentified",
    });
    expect(rejected.outcome).toBe("ok");
    const body = await (await sightings(`?since=${encodeURIComponent(before)}`)).json();
    expect(body.withdrawn).toEqual([`urn:uuid:${id}`]);
    expect(body.records.map((r: { occurrenceID: string }) => r.occurrenceID)).not.toContain(`urn:uuid:${id}`);
    const paged = await (
      await sightings(`?since=${encodeURIComponent(before)}&cursor=${Buffer.from(`0.${id}`).toString("base64url")}`)
    ).json();
    expect(paged.withdrawn).toEqual([]);
  });

  it("answers CSV with the Darwin Core terms as header, and the next cursor in headers", async () => {
    const res = await sightings("?format=csv&limit=1");
    expect(res.headers.get("content-type")).toMatch(/^text\/csv/);
    const lines = (await res.text()).trim().split("\r\n");
    expect(lines[0]).toBe([...DWC_TERMS, "modified"].join(","));
    expect(lines).toHaveLength(2);
    expect(res.headers.get("x-next-cursor")).toMatch(/^[A-Za-z0-9_-]+$/);
    expect(res.headers.get("link")).toMatch(/rel="next"/);
  });

  it("refuses another event's token, an unknown event, and a missing, revoked or expired token", async () => {
    expect((await sightings("", secrets.other!)).status).toBe(403);
    expect((await sightings("", secrets.event!, other.event.id)).status).toBe(403);
    expect((await sightings("", secrets.organisation!, other.event.id)).status).toBe(403);
    expect((await sightings("", secrets.event!, "00000000-0000-4000-8000-000000000000")).status).toBe(404);
    const none = await call(sightingsGet, `/api/v1/events/${f.event.id}/sightings`, null, { eventId: f.event.id });
    expect(none.status).toBe(401);
    expect((await none.json()).error).toMatchObject({
      code: "api_token_refused",
      message: expect.stringContaining('"Authorization: Bearer <token>"'),
    });
    expect((await sightings("", "eco_not-a-real-token-at-all-0000")).status).toBe(401);
    // A malformed address is a 404 for everyone, token or not (the one path-parameter rule).
    expect(
      (await call(sightingsGet, "/api/v1/events/not-an-id/sightings", null, { eventId: "not-an-id" })).status,
    ).toBe(404);
    expect((await sightings("", secrets.event!, "not-an-id")).status).toBe(404);
    expect((await sightings("", secrets.revoked!)).status).toBe(200);
    expect(await revokeApiToken(ids.revoked!, f.user.id)).toBe("ok");
    expect(await revokeApiToken(ids.revoked!, f.user.id)).toBe("already");
    expect((await sightings("", secrets.revoked!)).status).toBe(401);
    await db().execute(
      sql`UPDATE api_tokens SET created_at = now() - interval '2 days', expires_at = now() - interval '1 second' WHERE id = ${ids.organisation}`,
    );
    expect((await sightings("", secrets.organisation!)).status).toBe(401);
    await db().execute(sql`UPDATE api_tokens SET expires_at = now() + interval '1 day' WHERE id = ${ids.organisation}`);
    expect((await sightings("", secrets.organisation!)).status).toBe(200);
  });

  it("never writes: any other method is 405, token or not", async () => {
    for (const handler of [sightingsPost, sightingsDelete]) {
      const res = await call(
        handler,
        `/api/v1/events/${f.event.id}/sightings`,
        secrets.event!,
        { eventId: f.event.id },
        handler === sightingsPost ? "POST" : "DELETE",
      );
      expect(res.status).toBe(405);
    }
  });

  it("lists the token's events: one for an event token, every one of the organisation for an organisation token", async () => {
    const [second] = await db()
      .insert(s.events)
      .values({
        organisationId: f.org.id,
        slug: "event-apitok-second",
        name: "Second apitok",
        startsAt: new Date("2027-01-01T00:00:00Z"),
        endsAt: new Date("2027-01-02T00:00:00Z"),
        timeZone: "UTC",
      })
      .returning();
    const mine = await (await call(listEvents, "/api/v1/events", secrets.event!)).json();
    expect(mine).toMatchObject({ scope: "event", events: [{ id: f.event.id }] });
    const org = await (await call(listEvents, "/api/v1/events", secrets.organisation!)).json();
    expect(org.scope).toBe("organisation");
    expect(org.events.map((e: { id: string }) => e.id).sort()).toEqual([f.event.id, second!.id].sort());
    expect(
      (
        await call(sightingsGet, `/api/v1/events/${second!.id}/sightings`, secrets.organisation!, {
          eventId: second!.id,
        })
      ).status,
    ).toBe(200);
    expect(
      (await call(sightingsGet, `/api/v1/events/${second!.id}/sightings`, secrets.event!, { eventId: second!.id }))
        .status,
    ).toBe(403);
  });

  it("serves the current results and the published reports, without their input records", async () => {
    const results = await call(resultsGet, `/api/v1/events/${f.event.id}/results`, secrets.event!, {
      eventId: f.event.id,
    });
    // The results page's JSON, with sensitive taxa as public as on the report page (never by zone).
    const own = (await currentResults(f.event.id)).results;
    expect(await results.text()).toBe(JSON.stringify(await publicResultsOf(f.event.id, own)));
    expect(own.species.some((s) => s.sensitivity !== "open" && Object.keys(s.byZone).length > 0)).toBe(true);
    expect(
      await (
        await call(reportsGet, `/api/v1/events/${f.event.id}/reports`, secrets.event!, { eventId: f.event.id })
      ).json(),
    ).toEqual({ reports: [] });
    await publishReport(f.event.id, f.user.id, { confirmPending: true });
    const list = await (
      await call(reportsGet, `/api/v1/events/${f.event.id}/reports`, secrets.event!, { eventId: f.event.id })
    ).json();
    expect(list.reports).toHaveLength(1);
    expect(list.reports[0]).toMatchObject({
      version: 1,
      superseded: false,
      withdrawal: null,
      url: `/api/v1/events/${f.event.id}/reports/1`,
    });
    const one = await (
      await call(reportGet, `/api/v1/events/${f.event.id}/reports/1`, secrets.event!, {
        eventId: f.event.id,
        version: "1",
      })
    ).json();
    expect(one.version).toBe(1);
    expect(one.results.species.length).toBeGreaterThan(0);
    expect(one).not.toHaveProperty("inputRecords");
    expect(one.downloads.darwinCoreArchive).toBe(`/api/reports/${one.id}/darwin-core-archive.zip`);
    expect(
      (
        await call(reportGet, `/api/v1/events/${f.event.id}/reports/2`, secrets.event!, {
          eventId: f.event.id,
          version: "2",
        })
      ).status,
    ).toBe(404);
    expect(
      (
        await call(reportGet, `/api/v1/events/${other.event.id}/reports/1`, secrets.event!, {
          eventId: other.event.id,
          version: "1",
        })
      ).status,
    ).toBe(403);

    // Withdrawn by the organiser: a script reading the API is told so, with the reason, in the list and the report.
    await withdrawReport(f.event.id, 1, f.user.id, "a count entered twice");
    const after = await (
      await call(reportsGet, `/api/v1/events/${f.event.id}/reports`, secrets.event!, { eventId: f.event.id })
    ).json();
    expect(after.reports[0].withdrawal).toMatchObject({ reason: "a count entered twice" });
    expect(Date.parse(after.reports[0].withdrawal.withdrawnAt)).not.toBeNaN();
    const withdrawn = await (
      await call(reportGet, `/api/v1/events/${f.event.id}/reports/1`, secrets.event!, {
        eventId: f.event.id,
        version: "1",
      })
    ).json();
    expect(withdrawn.withdrawal).toMatchObject({ reason: "a count entered twice" });
  });

  it("records the last use and limits calls per token in a window kept in PostgreSQL", async () => {
    const t = makeApiToken();
    await createApiToken({
      organisationId: f.org.id,
      eventId: f.event.id,
      name: "limited",
      prefix: t.prefix,
      tokenHash: t.hash,
      createdBy: f.user.id,
      expiresAt: new Date(Date.now() + 86_400_000),
    });
    const limit = { calls: 2, windowSeconds: 60 };
    expect((await recordApiTokenCall(t.hash, limit)).outcome).toBe("ok");
    expect((await recordApiTokenCall(t.hash, limit)).outcome).toBe("ok");
    const third = await recordApiTokenCall(t.hash, limit);
    expect(third).toMatchObject({ outcome: "rate_limited" });
    const { rows } = await db().execute<{ last: string | null }>(
      sql`SELECT last_used_at AS last FROM api_tokens WHERE token_hash = ${t.hash}`,
    );
    expect(Date.now() - new Date(rows[0]!.last!).getTime()).toBeLessThan(60_000);
    // A new window starts once the old one is over.
    await db().execute(
      sql`UPDATE api_tokens SET window_started_at = now() - interval '61 seconds' WHERE token_hash = ${t.hash}`,
    );
    expect((await recordApiTokenCall(t.hash, limit)).outcome).toBe("ok");
  });

  it("serves its OpenAPI description in the caller's language", async () => {
    const res = await openapiGet(
      new Request("http://localhost:3000/api/openapi.json", { headers: { "accept-language": "fr" } }),
      {} as never,
    );
    const doc = await res.json();
    expect(doc.openapi).toBe("3.1.0");
    expect(doc.paths["/api/v1/events/{eventId}/sightings"].get.summary).toBe("Observations validées en Darwin Core");
  });
});
