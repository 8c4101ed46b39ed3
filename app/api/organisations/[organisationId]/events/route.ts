import { isOrganisationSuspended } from "@/db/queries/organisations";
import { createEvent } from "@/db/queries/setup";
import { requireOrganisationOrganiser } from "@/server/auth/guard";
import { ApiError, handle, requestLocale } from "@/lib/http/errors";
import { parseParams, pathId } from "@/lib/http/params";
import { parseJson } from "@/lib/http/body";
import { limitWrites } from "@/lib/http/write-limit";
import { translator } from "@/lib/i18n/translator";
import { eventInstants } from "@/lib/time/zoned";
import { createEventInput } from "./schema";

type Ctx = { params: Promise<{ organisationId: string }> };

// An organiser of the organisation creates one of its events, as a draft.
export const POST = handle<Ctx>(async (request, { params }) => {
  const { organisationId } = await parseParams(params, { organisationId: pathId });
  const user = await requireOrganisationOrganiser(organisationId);
  limitWrites(`setup:${user.id}`);
  if (await isOrganisationSuspended(organisationId)) throw new ApiError("forbidden"); // suspended by the site admin
  const input = await parseJson(request, createEventInput, { messages: "Setup.errors" });
  const { slug, startsLocal, endsLocal, ...rest } = input;
  const made = await createEvent(organisationId, slug, { ...rest, ...eventInstants(input) });
  if (!made) {
    const t = translator(requestLocale(request), "Setup");
    throw new ApiError("conflict", [{ field: "slug", message: t("errors.slugTaken") }]);
  }
  return Response.json({ id: made.id, slug }, { status: 201 });
});
