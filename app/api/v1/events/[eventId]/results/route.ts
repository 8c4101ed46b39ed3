import { handle } from "@/lib/http/errors";
import { parseParams } from "@/lib/http/params";
import { requireApiToken } from "@/server/auth/guard";
import { currentResults } from "@/server/results/current";
import { readOnly } from "../../../read-only";
import { eventIdParams } from "../../../schema";

export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ eventId: string }> };

/** The event's current results: the same JSON the results page reads (server/results/current.ts). */
export const GET = handle(async (request, { params }: Ctx) => {
  // A malformed address is a 404 for everyone (the one path-parameter rule), then the token.
  const { eventId } = await parseParams(params, eventIdParams.shape);
  await requireApiToken(request, { eventId });
  const { json } = await currentResults(eventId);
  return new Response(json, { headers: { "Content-Type": "application/json", "Cache-Control": "no-store" } });
});

export { readOnly as POST, readOnly as PUT, readOnly as PATCH, readOnly as DELETE };
