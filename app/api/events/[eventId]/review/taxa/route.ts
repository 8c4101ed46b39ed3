import { searchTaxa } from "@/db/queries/review";
import { handle, parseQuery } from "@/lib/http/errors";
import { parseParams, pathId } from "@/lib/http/params";
import { requireReviewPermit } from "@/server/review/permit";
import { taxaQuery } from "./schema";

export const dynamic = "force-dynamic";

// Taxa to re-identify a sighting as, by common or scientific name, within the coordinator's groups.
export const GET = handle(async (request, ctx: { params: Promise<{ eventId: string }> }) => {
  const { eventId } = await parseParams(ctx.params, { eventId: pathId });
  const { scope } = await requireReviewPermit(eventId, request);
  const { q } = parseQuery(request, taxaQuery);
  return Response.json({ taxa: await searchTaxa(scope, q) }, { headers: { "Cache-Control": "no-store" } });
});
