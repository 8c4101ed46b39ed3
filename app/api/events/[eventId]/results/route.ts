import { loadResultsInput } from "@/db/queries/results";
import { requireEventRole } from "@/lib/auth/guard";
import { handle } from "@/lib/http/errors";
import { computeResults } from "@/lib/results/compute";

export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ eventId: string }> };

/** The event's current results (organisers and coordinators): aggregates in PostgreSQL, statistics in lib/diversity. */
export const GET = handle(async (_request, { params }: Ctx) => {
  const { eventId } = await params;
  await requireEventRole(eventId, "coordinator");
  const results = computeResults(await loadResultsInput(eventId));
  return Response.json(results, { headers: { "Cache-Control": "no-store" } });
});
