import { liveFigures } from "@/db/queries/results";
import { requireEventRole } from "@/server/auth/guard";
import { handle } from "@/lib/http/errors";
import { parseParams, pathId } from "@/lib/http/params";
import { completeness } from "@/lib/results/live";
import { currentResults } from "@/server/results/current";

export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ eventId: string }> };

/** The live board, polled while the page is open (organisers and coordinators). */
export const GET = handle(async (_request, { params }: Ctx) => {
  const { eventId } = await parseParams(params, { eventId: pathId });
  await requireEventRole(eventId, "coordinator");
  // The same Results as the results page (cached per change), so the board's Chao1 and
  // coverage are the results table's numbers.
  const [figures, { results }] = await Promise.all([liveFigures(eventId), currentResults(eventId)]);
  return Response.json(
    { ...figures, completeness: completeness(results), at: new Date().toISOString() },
    { headers: { "Cache-Control": "no-store" } },
  );
});
