import { addOrganiser, listOrganisers, organisationLogOf } from "@/db/queries/organisations";
import { parseJson } from "@/lib/http/body";
import { ApiError, handle, requestLocale } from "@/lib/http/errors";
import { parseParams, pathId } from "@/lib/http/params";
import { limitWrites } from "@/lib/http/write-limit";
import { translator } from "@/lib/i18n/translator";
import { requireOrganisationOrganiser } from "@/server/auth/guard";
import { addOrganiserInput } from "./schema";

type Ctx = { params: Promise<{ organisationId: string }> };
export const dynamic = "force-dynamic";

// The organisation's organisers and its log (its organisers, site admins).
export const GET = handle<Ctx>(async (_request, { params }) => {
  const { organisationId } = await parseParams(params, { organisationId: pathId });
  await requireOrganisationOrganiser(organisationId);
  const [organisers, log] = await Promise.all([listOrganisers(organisationId), organisationLogOf(organisationId)]);
  return Response.json({ organisers, log }, { headers: { "Cache-Control": "no-store" } });
});

// An organiser adds another organiser by the address of their account.
export const POST = handle<Ctx>(async (request, { params }) => {
  const { organisationId } = await parseParams(params, { organisationId: pathId });
  const user = await requireOrganisationOrganiser(organisationId);
  limitWrites(`setup:${user.id}`);
  const { email } = await parseJson(request, addOrganiserInput, { messages: "Organisations.errors" });
  const result = await addOrganiser(user.id, organisationId, email);
  if (!result.ok) {
    const t = translator(requestLocale(request), "Organisations");
    throw new ApiError(result.reason === "no_account" ? "unprocessable" : "conflict", [
      { field: "email", message: t(`errors.${result.reason === "not_organiser" ? "failed" : result.reason}`) },
    ]);
  }
  return Response.json({ ok: true }, { status: 201 });
});
