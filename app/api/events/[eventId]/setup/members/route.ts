import { after } from "next/server";
import { eventForSetup, inviteToEvent, membersOf } from "@/db/queries/setup";
import { createMagicLink } from "@/server/auth/magic-link";
import { invitationMail } from "@/server/auth/mails";
import { ApiError, handle } from "@/lib/http/errors";
import { parseParams, pathId } from "@/lib/http/params";
import { translator } from "@/lib/i18n/translator";
import { drainOutbox } from "@/server/mail/queue";
import { requireSetupReadPermit, requireSetupWritePermit } from "@/server/setup/handler";
import { inviteInput } from "./schema";

type Ctx = { params: Promise<{ eventId: string }> };
export const dynamic = "force-dynamic";
export const INVITATION_MAX_AGE_S = 7 * 24 * 60 * 60;

// Who holds which role, open invitations, and the log of every change.
export const GET = handle<Ctx>(async (request, { params }) => {
  const { eventId } = await parseParams(params, { eventId: pathId });
  await requireSetupReadPermit(request, eventId);
  return Response.json(await membersOf(eventId), { headers: { "Cache-Control": "no-store" } });
});

// Invite by e-mail: invitation, log line and mail are stored together; the outbox sends
// the mail right after the answer (and retries later if the mail server is down).
export const POST = handle<Ctx>(async (request, { params }) => {
  const { eventId } = await parseParams(params, { eventId: pathId });
  const { user, input, locale } = await requireSetupWritePermit(request, eventId, inviteInput, {
    limit: ["invite", 60, 60 * 60_000],
  });
  const event = await eventForSetup(eventId);
  if (!event) throw new ApiError("not_found");
  const tRole = translator(input.locale, "Role");
  const outcome = await inviteToEvent({
    eventId,
    email: input.email,
    name: input.name || null,
    role: input.role,
    taxonGroups: input.role === "coordinator" ? input.taxonGroups : [],
    actorId: user.id,
    mail: async () => {
      const url = await createMagicLink(input.email, `/${input.locale}/account`, INVITATION_MAX_AGE_S);
      const m = invitationMail(input.locale, {
        url,
        eventName: event.name,
        role: tRole(input.role),
        inviter: user.name ?? user.email,
      });
      return { to: input.email.toLowerCase(), kind: "invitation", locale: input.locale, ...m };
    },
  });
  if (outcome === "alreadyMember") {
    throw new ApiError("conflict", [{ field: "email", message: translator(locale, "Setup")("errors.alreadyMember") }]);
  }
  after(() => drainOutbox().catch((err) => console.error("[mail] outbox drain failed", (err as Error).message)));
  return Response.json({ ok: true }, { status: 201 });
});
