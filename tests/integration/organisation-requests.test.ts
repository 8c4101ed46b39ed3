import { eq, sql } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import {
  addOrganiser,
  decideOrganisationRequest,
  listOrganisers,
  organisationLogOf,
  removeOrganiser,
  requestOrganisation,
  setOrganisationSuspended,
  siteAdmins,
} from "@/db/queries/organisations";
import * as s from "@/db/schema";
import { organisationDecisionInput, organisationRequestInput } from "@/lib/organisations/request";
import { decisionMail, newRequestMail } from "@/server/organisations/mails";
import { db, refusal } from "./helpers";

async function person(tag: string, isAdmin = false) {
  const [u] = await db()
    .insert(s.users)
    .values({ email: `${tag}@example.org`, name: `Person ${tag}`, isAdmin, locale: isAdmin ? "en" : "es" })
    .returning();
  return u!;
}
const mailsTo = (address: string) => db().select().from(s.emailOutbox).where(eq(s.emailOutbox.toAddress, address));

async function ask(tag: string) {
  const requester = await person(`req-${tag}`);
  const input = organisationRequestInput.parse({
    name: `Vale Society ${tag}`,
    contactEmail: `contact-${tag}@example.org`,
    country: "GB",
    description: "Counts the moths of the vale every summer.",
  });
  const admins = await siteAdmins();
  const id = await requestOrganisation(
    requester.id,
    input,
    admins.map((a) => newRequestMail(a, { ...input, requester: requester.email })),
  );
  return { requester, id };
}

describe("organisation requests", () => {
  it("mails the site admins, and on approval makes the organisation with the person as its first organiser", async () => {
    const admin = await person("orgreq-admin", true);
    const { requester, id } = await ask("approve");
    const [adminMail] = await mailsTo(admin.email);
    expect(adminMail).toMatchObject({ kind: "organisation_request", status: "queued" });
    expect(adminMail!.subject).toContain("Vale Society approve");

    const decided = await decideOrganisationRequest(admin.id, id, "approve", "", decisionMail);
    expect(decided).toMatchObject({ ok: true, request: { state: "approved" } });
    const orgId = decided.ok ? decided.organisationId! : "";
    const [org] = await db().select().from(s.organisations).where(eq(s.organisations.id, orgId));
    expect(org).toMatchObject({ name: "Vale Society approve", slug: "vale-society-approve", country: "GB" });
    expect((await listOrganisers(orgId)).map((o) => o.email)).toEqual([requester.email]);
    // The person's mail is in their language (Spanish).
    const [answer] = await mailsTo(requester.email);
    expect(answer).toMatchObject({ kind: "organisation_decision", locale: "es" });
    expect(answer!.subject).toContain("Tu organización está lista");
    expect((await organisationLogOf(orgId)).map((l) => l.action).sort()).toEqual(
      ["approved", "organiser_added", "requested"].sort(),
    );
    // Decided once only.
    expect(await decideOrganisationRequest(admin.id, id, "decline", "late", decisionMail)).toEqual({
      ok: false,
      reason: "already_decided",
    });
  });

  it("declines with a reason: no organisation, the reason mailed", async () => {
    const admin = await person("orgreq-admin2", true);
    const { requester, id } = await ask("decline");
    const before = (await db().select().from(s.organisations)).length;
    const decided = await decideOrganisationRequest(admin.id, id, "decline", "Not a survey body.", decisionMail);
    expect(decided).toMatchObject({ ok: true, organisationId: null, request: { state: "declined" } });
    expect((await db().select().from(s.organisations)).length).toBe(before);
    const [answer] = await mailsTo(requester.email);
    expect(answer!.textBody).toContain("Not a survey body.");
  });

  it("refuses a decline without a reason and a country that is not one", () => {
    expect(organisationDecisionInput.safeParse({ decision: "decline", reason: " " }).success).toBe(false);
    expect(organisationDecisionInput.safeParse({ decision: "approve", reason: "" }).success).toBe(true);
    expect(
      organisationRequestInput.safeParse({
        name: "Abc",
        contactEmail: "a@b.org",
        country: "EU",
        description: "x".repeat(12),
      }).success,
    ).toBe(false);
  });

  it("lets organisers add and remove organisers, never the last one, every change logged and the log append-only", async () => {
    const admin = await person("orgreq-admin3", true);
    const { requester, id } = await ask("members");
    const decided = await decideOrganisationRequest(admin.id, id, "approve", "", decisionMail);
    const orgId = decided.ok ? decided.organisationId! : "";
    expect(await removeOrganiser(requester.id, orgId, requester.id)).toEqual({ ok: false, reason: "last_organiser" });
    const second = await person("orgreq-second");
    expect(await addOrganiser(requester.id, orgId, "nobody-here@example.org")).toEqual({
      ok: false,
      reason: "no_account",
    });
    expect(await addOrganiser(requester.id, orgId, second.email.toUpperCase())).toEqual({ ok: true });
    expect(await addOrganiser(requester.id, orgId, second.email)).toEqual({ ok: false, reason: "already_organiser" });
    expect(await removeOrganiser(second.id, orgId, requester.id)).toEqual({ ok: true });
    expect((await listOrganisers(orgId)).map((o) => o.email)).toEqual([second.email]);
    expect(await removeOrganiser(second.id, orgId, second.id)).toEqual({ ok: false, reason: "last_organiser" });

    expect(await setOrganisationSuspended(admin.id, orgId, true, "Spam events")).toBe(true);
    expect(await setOrganisationSuspended(admin.id, orgId, true, "again")).toBe(false);
    const log = await organisationLogOf(orgId);
    expect(log.map((l) => [l.action, l.subjectEmail ?? ""])).toEqual(
      expect.arrayContaining([
        ["organiser_added", second.email],
        ["organiser_removed", requester.email],
        ["suspended", ""],
      ]),
    );
    const r = await refusal(() =>
      db().execute(sql`UPDATE organisation_log SET reason = 'x' WHERE organisation_id = ${orgId}`),
    );
    expect(r.message).toContain("append-only");
  });
});
