import { handle } from "@/lib/http/errors";
import { parseParams } from "@/lib/http/params";
import { requireApiToken } from "@/server/auth/guard";
import { currentResults } from "@/server/results/current";
import { publicResultsOf } from "@/db/queries/reports";
import { readOnly } from "../../../read-only";
import { eventIdParams } from "../../../schema";

export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ eventId: string }> };

/**
 * The event's current results: the JSON the results page reads (server/results/current.ts), with
 * sensitive taxa as public as on the report page (never by zone; lib/results/public.ts).
 */
export const GET = handle(async (request, { params }: Ctx) => {
  // The token first: a caller without one hears 401 whatever the address (an unknown or malformed event is a 404 after it).
  const raw = await params;
  await requireApiToken(request, { eventId: raw.eventId });
  const { eventId } = await parseParams(Promise.resolve(raw), eventIdParams.shape);
  const { results } = await currentResults(eventId);
  const json = JSON.stringify(await publicResultsOf(eventId, results));
  return new Response(json, { headers: { "Content-Type": "application/json", "Cache-Control": "no-store" } });
});

export { readOnly as POST, readOnly as PUT, readOnly as PATCH, readOnly as DELETE };
