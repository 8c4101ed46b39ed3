import { and, desc, eq, sql } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { acceptPendingInvitations } from "@/db/queries/auth";
import {
  changeMemberRole,
  eventByJoinCode,
  inviteToEvent,
  joinAsVolunteer,
  membersOf,
  removeMember,
  revokeInvitation,
} from "@/db/queries/setup";
import * as s from "@/db/schema";
import { db, makeFixture, refusal } from "./helpers";

const mail = (to: string) => async (invitationId: string) => ({
  to,
  kind: "invitation",
  locale: "en",
  subject: `Invitation ${invitationId}`,
  text: `link for ${to}`,
});

describe("people of an event", () => {
  it("invites by e-mail: invitation, log line and outbox mail together; signing in gives the role", async () => {
    const f = await makeFixture("people-invite");
    const to = "new-coordinator@example.org";
    expect(
      await inviteToEvent({
        eventId: f.event.id,
        email: "New-Coordinator@Example.org",
        name: "Nia",
        role: "coordinator",
        taxonGroups: ["birds"],
        actorId: f.user.id,
        mail: mail(to),
      }),
    ).toBe("invited");
    const [queued] = await db()
      .select()
      .from(s.emailOutbox)
      .where(eq(s.emailOutbox.toAddress, to))
      .orderBy(desc(s.emailOutbox.id))
      .limit(1);
    expect(queued).toMatchObject({ kind: "invitation", status: "queued" });
    const people = await membersOf(f.event.id);
    expect(people.pending).toMatchObject([
      { email: to, role: "coordinator", taxonGroups: ["birds"], selfService: false },
    ]);
    expect(people.log[0]).toMatchObject({
      action: "invited",
      subjectEmail: to,
      toRole: "coordinator",
      actorEmail: f.user.email,
    });

    const [person] = await db().insert(s.users).values({ email: to }).returning();
    await acceptPendingInvitations(person!.id, to);
    const after = await membersOf(f.event.id);
    expect(after.members.find((m) => m.email === to)).toMatchObject({ role: "coordinator", taxonGroups: ["birds"] });
    expect(after.pending).toEqual([]);
    expect(
      await inviteToEvent({
        eventId: f.event.id,
        email: to,
        name: null,
        role: "volunteer",
        taxonGroups: [],
        actorId: f.user.id,
        mail: mail(to),
      }),
    ).toBe("alreadyMember");
  });

  it("logs every change of role and every removal, and the log cannot be edited", async () => {
    const f = await makeFixture("people-change");
    const [v] = await db().insert(s.users).values({ email: "people-change-vol@example.org" }).returning();
    await db().insert(s.eventMembers).values({ eventId: f.event.id, userId: v!.id, role: "volunteer" });
    expect(await changeMemberRole(f.event.id, v!.id, "coordinator", ["fungi", "birds"], f.user.id)).toBe("changed");
    expect(await changeMemberRole(f.event.id, v!.id, "coordinator", ["birds", "fungi"], f.user.id)).toBe("unchanged");
    expect(await removeMember(f.event.id, v!.id, f.user.id)).toBe(true);
    expect(await removeMember(f.event.id, v!.id, f.user.id)).toBe(false);
    const { log, members } = await membersOf(f.event.id);
    expect(members).toEqual([]);
    expect(log.map((l) => [l.action, l.fromRole, l.toRole, l.taxonGroups])).toEqual([
      ["removed", "coordinator", null, ["birds", "fungi"]],
      ["role_changed", "volunteer", "coordinator", ["birds", "fungi"]],
    ]);
    const refused = await refusal(() =>
      db().execute(sql`UPDATE membership_log SET action = 'joined' WHERE event_id = ${f.event.id}`),
    );
    expect(refused.message).toMatch(/append-only/);
  });

  it("withdraws an invitation so that its sign-in no longer gives the role", async () => {
    const f = await makeFixture("people-revoke");
    const to = "people-revoke-invitee@example.org";
    await inviteToEvent({
      eventId: f.event.id,
      email: to,
      name: null,
      role: "volunteer",
      taxonGroups: [],
      actorId: f.user.id,
      mail: mail(to),
    });
    const [inv] = (await membersOf(f.event.id)).pending;
    expect(await revokeInvitation(f.event.id, inv!.id, f.user.id)).toBe(true);
    const [person] = await db().insert(s.users).values({ email: to }).returning();
    await acceptPendingInvitations(person!.id, to);
    const after = await membersOf(f.event.id);
    expect(after.members).toEqual([]);
    expect(after.log[0]).toMatchObject({ action: "invitation_revoked", subjectEmail: to });
  });

  it("lets a person join with the event's code as a volunteer, once, and finds the event by its code", async () => {
    const f = await makeFixture("people-join");
    await db().update(s.events).set({ joinCode: "PEOPLE-JOIN-1" }).where(eq(s.events.id, f.event.id));
    expect((await eventByJoinCode("people-join-1"))?.id).toBe(f.event.id);
    expect(await joinAsVolunteer(f.event.id, f.user.id, f.user.email)).toBe("joined");
    expect(await joinAsVolunteer(f.event.id, f.user.id, f.user.email)).toBe("alreadyMember");
    const rows = await db()
      .select()
      .from(s.membershipLog)
      .where(and(eq(s.membershipLog.eventId, f.event.id), eq(s.membershipLog.action, "joined")));
    expect(rows).toHaveLength(1);
  });
});
