import { listMySightings } from "@/db/queries/my-sightings";
import { requireEventRole } from "@/server/auth/guard";
import { handle } from "@/lib/http/errors";
import { parseParams, pathId } from "@/lib/http/params";
import { jsonWithEtag } from "@/lib/http/etag";
import type { MineResponse } from "@/lib/sync/mine";

type Ctx = { params: Promise<{ eventId: string }> };

// The caller's own sightings at this event, with review states, questions and reasons.
// ETag'd, so the field log can ask often and download only when something changed.
export const GET = handle<Ctx>(async (request, { params }) => {
  const { eventId } = await parseParams(params, { eventId: pathId });
  const permit = await requireEventRole(eventId, "volunteer");
  return jsonWithEtag(request, { sightings: await listMySightings(permit.user.id, eventId) } satisfies MineResponse);
});
