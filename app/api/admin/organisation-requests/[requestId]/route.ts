import { decideOrganisationRequest } from "@/db/queries/organisations";
import { parseJson } from "@/lib/http/body";
import { ApiError, handle } from "@/lib/http/errors";
import { parseParams, pathId } from "@/lib/http/params";
import { limitWrites } from "@/lib/http/write-limit";
import { requireSiteAdmin } from "@/server/auth/guard";
import { decisionMail } from "@/server/organisations/mails";
import { organisationDecisionInput } from "./schema";

type Ctx = { params: Promise<{ requestId: string }> };

// The site admin approves a request (the organisation is made, the person its first
// organiser) or declines it with a reason; the person is mailed either way.
export const POST = handle<Ctx>(async (request, { params }) => {
  const { requestId } = await parseParams(params, { requestId: pathId });
  const admin = await requireSiteAdmin();
  limitWrites(`admin:${admin.id}`);
  const { decision, reason } = await parseJson(request, organisationDecisionInput, {
    messages: "Organisations.errors",
  });
  const result = await decideOrganisationRequest(admin.id, requestId, decision, reason, decisionMail);
  if (!result.ok) throw new ApiError(result.reason === "not_found" ? "not_found" : "conflict");
  return Response.json({ ok: true, state: result.request.state, organisationId: result.organisationId });
});
