import { removeEventSpecies } from "@/db/queries/setup";
import { ApiError, handle } from "@/lib/http/errors";
import { parseParams, pathId } from "@/lib/http/params";
import { translator } from "@/lib/i18n/translator";
import { requireSetupWritePermit } from "@/server/setup/handler";

type Ctx = { params: Promise<{ eventId: string; taxonId: string }> };
export const dynamic = "force-dynamic";

// Remove one species from the event's list (issue 16). Refused (409) with the number of the
// event's sightings of it while any exist, whatever their review state: the list is what they
// were checked against. 404 when the taxon is not on the list.
export const DELETE = handle<Ctx>(async (request, { params }) => {
  const { eventId, taxonId } = await parseParams(params, { eventId: pathId, taxonId: pathId });
  const { locale } = await requireSetupWritePermit(request, eventId);
  const outcome = await removeEventSpecies(eventId, taxonId);
  if (outcome === "notListed") throw new ApiError("not_found");
  if (typeof outcome === "number")
    throw new ApiError("conflict", [
      { field: "taxonId", message: translator(locale, "Setup")("errors.speciesInUse", { count: outcome }) },
    ]);
  return Response.json({ ok: true });
});
