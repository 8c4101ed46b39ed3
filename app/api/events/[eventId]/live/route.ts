import { liveFigures, loadResultsInput } from "@/db/queries/results";
import { requireEventRole } from "@/server/auth/guard";
import { handle } from "@/lib/http/errors";
import { parseParams, pathId } from "@/lib/http/params";
import { completeness } from "@/lib/results/live";

export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ eventId: string }> };

/** The live board, polled while the page is open (organisers and coordinators). */
export const GET = handle(async (_request, { params }: Ctx) => {
  const { eventId } = await parseParams(params, { eventId: pathId });
  await requireEventRole(eventId, "coordinator");
  const [figures, input] = await Promise.all([liveFigures(eventId), loadResultsInput(eventId, { sessions: false })]);
  return Response.json(
    { ...figures, completeness: completeness(input), at: new Date().toISOString() },
    { headers: { "Cache-Control": "no-store" } },
  );
});
