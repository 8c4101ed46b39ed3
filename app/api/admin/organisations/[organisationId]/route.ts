import { setOrganisationSuspended } from "@/db/queries/organisations";
import { parseJson } from "@/lib/http/body";
import { ApiError, handle } from "@/lib/http/errors";
import { parseParams, pathId } from "@/lib/http/params";
import { limitWrites } from "@/lib/http/write-limit";
import { requireSiteAdmin } from "@/server/auth/guard";
import { organisationStatusInput } from "./schema";

type Ctx = { params: Promise<{ organisationId: string }> };

// The site admin suspends (its organisers can no longer create events) or reinstates an organisation.
export const PATCH = handle<Ctx>(async (request, { params }) => {
  const { organisationId } = await parseParams(params, { organisationId: pathId });
  const admin = await requireSiteAdmin();
  limitWrites(`admin:${admin.id}`);
  const { suspended, reason } = await parseJson(request, organisationStatusInput, { messages: "Organisations.errors" });
  if (!(await setOrganisationSuspended(admin.id, organisationId, suspended, reason))) throw new ApiError("conflict");
  return Response.json({ ok: true, suspended });
});
