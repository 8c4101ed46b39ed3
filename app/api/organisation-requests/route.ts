import { myOrganisationRequests, requestOrganisation, siteAdmins } from "@/db/queries/organisations";
import { parseJson } from "@/lib/http/body";
import { handle } from "@/lib/http/errors";
import { limitWrites } from "@/lib/http/write-limit";
import { requireUser } from "@/server/auth/guard";
import { newRequestMail } from "@/server/organisations/mails";
import { organisationRequestInput } from "./schema";

export const dynamic = "force-dynamic";

// The signed-in person's own requests for a new organisation.
export const GET = handle(async () => {
  const user = await requireUser();
  return Response.json(
    { requests: await myOrganisationRequests(user.id) },
    { headers: { "Cache-Control": "no-store" } },
  );
});

// A signed-in person asks for a new organisation; every site admin is mailed (through the outbox).
export const POST = handle(async (request) => {
  const user = await requireUser();
  limitWrites(`org-request:${user.id}`, 5, 60 * 60_000);
  const input = await parseJson(request, organisationRequestInput, { messages: "Organisations.errors" });
  const requester = user.name ? `${user.name} <${user.email}>` : user.email;
  const mails = (await siteAdmins()).map((admin) => newRequestMail(admin, { ...input, requester }));
  const id = await requestOrganisation(user.id, input, mails);
  return Response.json({ id, state: "pending" }, { status: 201 });
});
