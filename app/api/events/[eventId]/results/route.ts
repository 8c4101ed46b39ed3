import { requireEventRole } from "@/server/auth/guard";
import { handle } from "@/lib/http/errors";
import { parseParams, pathId } from "@/lib/http/params";
import { currentResults } from "@/server/results/current";

export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ eventId: string }> };

/** The event's current results (organisers and coordinators): aggregates in PostgreSQL, statistics in lib/diversity. */
export const GET = handle(async (_request, { params }: Ctx) => {
  const { eventId } = await parseParams(params, { eventId: pathId });
  await requireEventRole(eventId, "coordinator");
  const { json } = await currentResults(eventId);
  return new Response(json, { headers: { "Content-Type": "application/json", "Cache-Control": "no-store" } });
});
