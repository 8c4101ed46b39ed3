import { after } from "next/server";
import { eventAccess } from "@/db/queries/auth";
import { eventByJoinCode, inviteToEvent, joinAsVolunteer } from "@/db/queries/setup";
import { setPublishedName } from "@/db/queries/my-data";
import { getSessionUser } from "@/server/auth/guard";
import { createMagicLink } from "@/server/auth/magic-link";
import { invitationMail } from "@/server/auth/mails";
import { clientIp } from "@/server/auth/sign-in-limit";
import { parseJson } from "@/lib/http/body";
import { ApiError, handle, requestLocale } from "@/lib/http/errors";
import { limitWrites } from "@/lib/http/write-limit";
import { translator } from "@/lib/i18n/translator";
import { drainOutbox } from "@/server/mail/queue";
import { joinInput } from "./schema";

const JOIN_LINK_MAX_AGE_S = 7 * 24 * 60 * 60;

// Public by design: a volunteer who was handed an event's join link or code may not have
// an account yet. Without a session nothing is granted here: a sign-in link goes to the
// address given, and the volunteer role is given when that link is used. Limited per IP.
export const POST = handle(async (request) => {
  limitWrites(`join:${clientIp(request.headers)}`, 20, 15 * 60_000);
  const input = await parseJson(request, joinInput, { messages: "Setup.errors" });
  const t = translator(requestLocale(request), "Setup");
  const event = await eventByJoinCode(input.code);
  if (!event) throw new ApiError("not_found", [{ field: "code", message: t("errors.codeUnknown") }]);
  if (event.status === "closed")
    throw new ApiError("unprocessable", [{ field: "code", message: t("errors.eventClosed") }]);

  const user = await getSessionUser();
  if (user) {
    // Whoever already holds a role there (or organises the organisation) keeps it.
    const access = await eventAccess(user.id, event.id);
    const outcome =
      access?.role || access?.isOrganisationOrganiser
        ? "alreadyMember"
        : await joinAsVolunteer(event.id, user.id, user.email);
    await setPublishedName(user.id, input.publishedName);
    return Response.json({ ok: true, outcome, eventSlug: event.slug, eventName: event.name });
  }
  if (!input.email) throw new ApiError("bad_request", [{ field: "email", message: t("errors.email") }]);
  const email = input.email.toLowerCase();
  const tRole = translator(input.locale, "Role");
  await inviteToEvent({
    eventId: event.id,
    email,
    // A self-service join's name is the published name consented to here; it is stored on the
    // person when they first sign in with this address (acceptPendingInvitations).
    name: input.publishedName,
    role: "volunteer",
    taxonGroups: [],
    actorId: null,
    mail: async () => {
      const url = await createMagicLink(email, `/${input.locale}/account`, JOIN_LINK_MAX_AGE_S);
      return {
        to: email,
        kind: "join",
        locale: input.locale,
        ...invitationMail(input.locale, { url, eventName: event.name, role: tRole("volunteer"), inviter: null }),
      };
    },
  });
  after(() => drainOutbox().catch((err) => console.error("[mail] outbox drain failed", (err as Error).message)));
  return Response.json({ ok: true, outcome: "mailed", eventName: event.name });
});
