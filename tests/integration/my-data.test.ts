import { sql } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { acceptPendingInvitations } from "@/db/queries/auth";
import { eraseAccount, myData, publishedNameOf, setPublishedName } from "@/db/queries/my-data";
import { getReport, reportOccurrences } from "@/db/queries/reports";
import { composeDigests } from "@/db/queries/review-digest";
import * as s from "@/db/schema";
import { MY_SIGHTINGS_COLUMNS, mySightingsCsv } from "@/lib/account/my-data-csv";
import { checkReport } from "@/server/results/check";
import { publishReport } from "@/server/results/publish";
import { db, lonLat, makeFixture, refusal, sightingValues } from "./helpers";

// A volunteer's own data (issue 15): what they download, and an erasure that leaves every
// published report valid while their e-mail, name and sign-in go from every table.

let f: Awaited<ReturnType<typeof makeFixture>>;
let coordinatorId = "";
const email = "heron.volunteer@example.org";
const ids = { approved1: crypto.randomUUID(), approved2: crypto.randomUUID(), pending: crypto.randomUUID() };

beforeAll(async () => {
  f = await makeFixture("mydata");
  await db()
    .update(s.users)
    .set({ email, name: "Hana Heron", passwordHash: "x".repeat(60) })
    .where(sql`id = ${f.user.id}`);
  const [coordinator] = await db()
    .insert(s.users)
    .values({ email: "coord.mydata@example.org", name: "Coordinator" })
    .returning();
  coordinatorId = coordinator!.id;
  await db()
    .insert(s.eventMembers)
    .values([
      { eventId: f.event.id, userId: f.user.id, role: "volunteer" },
      { eventId: f.event.id, userId: coordinatorId, role: "coordinator" },
    ]);
  // Logged before the person had an account (no subject id), and when they joined.
  await db()
    .insert(s.membershipLog)
    .values([
      { eventId: f.event.id, subjectEmail: email, actorId: coordinatorId, action: "invited", toRole: "volunteer" },
      { eventId: f.event.id, subjectEmail: email, subjectUserId: f.user.id, action: "joined", toRole: "volunteer" },
    ]);
  await db()
    .insert(s.accounts)
    .values({ userId: f.user.id, type: "email", provider: "email", providerAccountId: email });
  await db()
    .insert(s.verificationTokens)
    .values({ identifier: email, token: "a".repeat(64), expires: new Date(Date.now() + 3600_000) });
  await db()
    .insert(s.signInAttempts)
    .values({ key: `email:${email}` });
  await db().insert(s.emailOutbox).values({ toAddress: email, kind: "digest", subject: "s", textBody: "t" });
  const sessionId = crypto.randomUUID();
  await db()
    .insert(s.countSessions)
    .values({
      id: sessionId,
      eventId: f.event.id,
      userId: f.user.id,
      kind: "walk",
      startedAt: new Date("2026-06-20T08:00:00Z"),
      endedAt: new Date("2026-06-20T09:30:00Z"),
      allSpeciesNoted: true,
    });
  await db()
    .insert(s.sightings)
    .values([
      sightingValues(f, { id: ids.approved1, sessionId, count: 3, notes: "=by the pond" }),
      sightingValues(f, { id: ids.approved2, count: 1, location: lonLat(0.3, 0.1) }),
      sightingValues(f, { id: ids.pending, count: 2 }),
    ]);
  for (const id of [ids.approved1, ids.approved2]) {
    await db().insert(s.reviews).values({
      sightingId: id,
      eventId: f.event.id,
      reviewerId: coordinatorId,
      fromState: "pending",
      toState: "returned",
      message: "Which side of the pond?",
    });
    await db().insert(s.reviews).values({
      sightingId: id,
      eventId: f.event.id,
      reviewerId: coordinatorId,
      fromState: "returned",
      toState: "approved",
    });
    await db()
      .update(s.sightings)
      .set({ reviewState: "approved" })
      .where(sql`id = ${id}`);
  }
  await setPublishedName(f.user.id, "Heron Spotter");
});

describe("a volunteer's own data", () => {
  it("the download holds the account, roles, membership log, sessions and every sighting with its decisions", async () => {
    const data = (await myData(f.user.id))!;
    expect(data.account).toMatchObject({
      email,
      name: "Hana Heron",
      publishedName: "Heron Spotter",
      hasPassword: true,
    });
    expect(data.account.publishConsentAt).not.toBeNull();
    expect(JSON.stringify(data)).not.toContain("x".repeat(60)); // never the password hash
    expect(data.eventRoles).toEqual([expect.objectContaining({ event: f.event.name, role: "volunteer" })]);
    expect(data.membershipLog.map((l) => l.action)).toEqual(["invited", "joined"]);
    expect(data.countSessions).toHaveLength(1);
    expect(data.sightings.map((x) => x.id).sort()).toEqual(Object.values(ids).sort());
    const first = data.sightings.find((x) => x.id === ids.approved1)!;
    expect(first).toMatchObject({
      count: 3,
      reviewState: "approved",
      scientificName: f.taxon.scientificName,
      zone: "Zone A",
    });
    expect(first.decisions.map((d) => [d.fromState, d.toState])).toEqual([
      ["pending", "returned"],
      ["returned", "approved"],
    ]);
    expect(first.decisions[0]!.message).toBe("Which side of the pond?");
    expect(data.sightings.find((x) => x.id === ids.pending)!.decisions).toEqual([]);

    // CSV: one row per sighting and decision; an undecided sighting has one row with empty decision cells.
    const lines = mySightingsCsv(data).trimEnd().split("\r\n");
    expect(lines[0]).toBe(MY_SIGHTINGS_COLUMNS.join(","));
    expect(lines).toHaveLength(1 + 2 + 2 + 1);
    const pendingRow = lines.find((l) => l.startsWith(ids.pending))!;
    expect(
      pendingRow.endsWith(",pending," + data.sightings.find((x) => x.id === ids.pending)!.receivedAt + ",,,,,,,"),
    ).toBe(true);
    expect(lines.find((l) => l.startsWith(ids.approved1))).toContain(",'=by the pond,"); // formula rule
  });

  it("a self-service join's name becomes the published name, with the join as the time of consent", async () => {
    const [u] = await db().insert(s.users).values({ email: "joiner.mydata@example.org" }).returning();
    const [inv] = await db()
      .insert(s.invitations)
      .values({ eventId: f.event.id, email: "joiner.mydata@example.org", name: "Moss Walker", role: "volunteer" })
      .returning();
    await acceptPendingInvitations(u!.id, "joiner.mydata@example.org");
    expect(await publishedNameOf(u!.id)).toEqual({ name: "Moss Walker", consentAt: inv!.createdAt });
  });

  it("erasure removes e-mail, name and sign-in everywhere; the published report re-computes identically", async () => {
    const v1 = await publishReport(f.event.id, coordinatorId, { confirmPending: true });
    const before = (await getReport(f.event.id, v1.version, { withInputs: true }))!;
    const occBefore = await reportOccurrences(before);
    expect(occBefore.map((o) => o.recordedBy)).toEqual(["Heron Spotter", "Heron Spotter"]);
    const reviewsBefore = (await db().execute(sql`SELECT * FROM reviews ORDER BY id`)).rows;
    const logBefore = (await db().execute<{ id: number }>(sql`SELECT id FROM membership_log ORDER BY id`)).rows;
    const [{ v: versionBefore }] = (
      await db().execute<{ v: number }>(sql`SELECT session_version AS v FROM users WHERE id = ${f.user.id}`)
    ).rows as [{ v: number }];

    const erased = (await eraseAccount(f.user.id))!;
    expect(erased.recorder).toMatch(/^recorder-[0-9a-f]{8}$/);
    expect(await eraseAccount(f.user.id)).toBeNull(); // once only
    expect(await myData(f.user.id)).toBeNull();

    // The tombstone: no personal data, every token already issued refused (session version raised).
    const [u] = (await db().execute<Record<string, unknown>>(sql`SELECT * FROM users WHERE id = ${f.user.id}`)).rows;
    expect(u).toMatchObject({ name: null, password_hash: null, image: null, published_name: erased.recorder });
    expect(u!.email).toMatch(/^erased-[0-9a-f]{12}@erased\.invalid$/);
    expect(u!.erased_at).not.toBeNull();
    expect(u!.session_version).toBe(versionBefore + 1);

    // The address and the name are nowhere in the database any more.
    const tables = (
      await db().execute<{ t: string }>(sql`SELECT tablename AS t FROM pg_tables WHERE schemaname = 'public'`)
    ).rows.map((r) => r.t);
    for (const t of tables) {
      const [hit] = (
        await db().execute<{ n: number }>(
          sql`SELECT count(*)::int AS n FROM ${sql.identifier(t)} x WHERE x::text ILIKE '%heron.volunteer%' OR x::text ILIKE '%Hana Heron%'`,
        )
      ).rows;
      expect(`${t}: ${hit!.n}`).toBe(`${t}: 0`);
    }
    for (const t of ["accounts", "sessions", "event_members"] as const) {
      const [n] = (
        await db().execute<{ n: number }>(
          sql`SELECT count(*)::int AS n FROM ${sql.identifier(t)} WHERE user_id = ${f.user.id}`,
        )
      ).rows;
      expect(n!.n).toBe(0);
    }

    // Records stay, under the anonymous recorder; the append-only history is as it was (the log only redacted, plus "removed").
    expect((await db().execute(sql`SELECT * FROM reviews ORDER BY id`)).rows).toEqual(reviewsBefore);
    const logAfter = (
      await db().execute<{ id: number; action: string; subject_email: string }>(
        sql`SELECT id, action::text AS action, subject_email FROM membership_log WHERE event_id = ${f.event.id} AND subject_user_id = ${f.user.id} ORDER BY id`,
      )
    ).rows;
    expect(logAfter.map((l) => l.action)).toEqual(["invited", "joined", "removed"]);
    expect(new Set(logAfter.map((l) => l.subject_email))).toEqual(new Set([u!.email]));
    expect(
      (await db().execute(sql`SELECT id FROM membership_log ORDER BY id`)).rows.slice(0, logBefore.length),
    ).toEqual(logBefore);
    const [kept] = (
      await db().execute<{ n: number }>(sql`SELECT count(*)::int AS n FROM sightings WHERE user_id = ${f.user.id}`)
    ).rows;
    expect(kept!.n).toBe(3);

    // The published report: unchanged, and it re-computes to the same numbers from the same inputs.
    const after = (await getReport(f.event.id, v1.version, { withInputs: true }))!;
    expect(after.results).toEqual(before.results);
    expect(after.inputRecords).toEqual(before.inputRecords);
    const check = (await checkReport(f.event.id, v1.version))!;
    expect(check.same).toBe(true);
    expect(check.hashSame).toBe(true);
    const occAfter = await reportOccurrences(after);
    expect(occAfter.map(({ recordedBy: _, ...o }) => o)).toEqual(occBefore.map(({ recordedBy: _, ...o }) => o));
    expect(occAfter.map((o) => o.recordedBy)).toEqual([erased.recorder, erased.recorder]);
    // A decision on the erased person's pending sighting is recorded, but no digest is mailed to the tombstone.
    const [late] = await db()
      .insert(s.reviews)
      .values({
        sightingId: ids.pending,
        eventId: f.event.id,
        reviewerId: coordinatorId,
        fromState: "pending",
        toState: "rejected",
        reason: "r",
      })
      .returning();
    await db().execute(sql`INSERT INTO review_notices (review_id, volunteer_id) VALUES (${late!.id}, ${f.user.id})`);
    await composeDigests(0, () => ({ subject: "s", text: "t", html: "h" }));
    const [mailed] = (
      await db().execute<{ n: number }>(sql`SELECT count(*)::int AS n FROM email_outbox WHERE to_address = ${u!.email}`)
    ).rows;
    expect(mailed!.n).toBe(0);
    // A new version publishes the same numbers too.
    const v2 = await publishReport(f.event.id, coordinatorId, { confirmPending: true });
    expect((await getReport(f.event.id, v2.version))!.results.species).toEqual(before.results.species);
  });

  it("the membership log stays append-only: nothing but redaction to an erased person's tombstone is allowed", async () => {
    const [row] = (
      await db().execute<{ id: number }>(
        sql`SELECT id FROM membership_log WHERE subject_user_id = ${coordinatorId} OR actor_id = ${coordinatorId} LIMIT 1`,
      )
    ).rows;
    expect(row).toBeDefined();
    const refused = (q: ReturnType<typeof sql>) => refusal(() => db().execute(q));
    expect((await refused(sql`UPDATE membership_log SET action = 'removed' WHERE id = ${row!.id}`)).code).toBe("23000");
    expect((await refused(sql`DELETE FROM membership_log WHERE id = ${row!.id}`)).code).toBe("23000");
    // Redacting a person who is not erased is refused.
    const [other] = (
      await db().execute<{ id: number }>(
        sql`INSERT INTO membership_log (event_id, subject_email, subject_user_id, action, to_role)
            VALUES (${f.event.id}, 'coord.mydata@example.org', ${coordinatorId}, 'joined', 'coordinator') RETURNING id`,
      )
    ).rows;
    expect(
      (
        await refused(
          sql`UPDATE membership_log SET subject_email = 'erased-000000000000@erased.invalid' WHERE id = ${other!.id}`,
        )
      ).code,
    ).toBe("23000");
    // An erased person's rows cannot be changed again either (the address already is the tombstone's; anything else is refused).
    expect(
      (
        await refused(
          sql`UPDATE membership_log SET subject_email = 'someone@example.org' WHERE subject_user_id = ${f.user.id}`,
        )
      ).code,
    ).toBe("23000");
  });
});
