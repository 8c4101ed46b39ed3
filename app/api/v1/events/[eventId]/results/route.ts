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
  // A malformed address is a 404 for everyone (the one path-parameter rule), then the token.
  const { eventId } = await parseParams(params, eventIdParams.shape);
  await requireApiToken(request, { eventId });
  const { results } = await currentResults(eventId);
  const json = JSON.stringify(await publicResultsOf(eventId, results));
  return new Response(json, { headers: { "Content-Type": "application/json", "Cache-Control": "no-store" } });
});

export { readOnly as POST, readOnly as PUT, readOnly as PATCH, readOnly as DELETE };
