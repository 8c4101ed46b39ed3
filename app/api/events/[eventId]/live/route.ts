import { liveFigures } from "@/db/queries/results";
import { requireEventRole } from "@/server/auth/guard";
import { handle } from "@/lib/http/errors";
import { parseParams, pathId } from "@/lib/http/params";
import { completeness } from "@/lib/results/live";
import { currentResults } from "@/server/results/current";
import { liveBesideEarlier } from "@/server/results/compare-events";

export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ eventId: string }> };

/** The live board, polled while the page is open (organisers and coordinators). */
export const GET = handle(async (_request, { params }: Ctx) => {
  const { eventId } = await parseParams(params, { eventId: pathId });
  await requireEventRole(eventId, "coordinator");
  // The same Results as the results page (cached per change), so the board's Chao1 and
  // coverage are the results table's numbers.
  // Beside the earlier event of the site, by the results page's rule (at most a minute old).
  const [figures, { results }, beside] = await Promise.all([
    liveFigures(eventId),
    currentResults(eventId),
    liveBesideEarlier(eventId),
  ]);
  return Response.json(
    { ...figures, completeness: completeness(results), beside, at: new Date().toISOString() },
    { headers: { "Cache-Control": "no-store" } },
  );
});
