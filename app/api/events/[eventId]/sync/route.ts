import { requireEventRole } from "@/server/auth/guard";
import { answerBatch } from "@/server/sync/answer";
import { env } from "@/lib/env";
import { parseJson } from "@/lib/http/body";
import { handle, requestLocale } from "@/lib/http/errors";
import { parseParams, pathId } from "@/lib/http/params";
import { limitWrites } from "@/lib/http/write-limit";
import type { SyncResponse } from "@/lib/sync/acks";
import { syncBatch } from "@/lib/sync/records";

type Ctx = { params: Promise<{ eventId: string }> };

// The field log's outbox sends its waiting sessions and sightings here. Every member of
// the event (volunteer or above) may send their own records: membership is checked here,
// once. Each record is then parsed, stored and answered on its own (server/sync/answer.ts,
// db/queries/sync.ts), so a bad record never refuses its neighbours.
export const POST = handle<Ctx>(async (request, { params }) => {
  const { eventId } = await parseParams(params, { eventId: pathId });
  const permit = await requireEventRole(eventId, "volunteer");
  limitWrites(`sync:${permit.user.id}`, env().SYNC_BATCHES_PER_MINUTE);
  const batch = await parseJson(request, syncBatch);
  const acks = await answerBatch({ userId: permit.user.id, eventId, locale: requestLocale(request) }, batch);
  return Response.json({ acks } satisfies SyncResponse, { headers: { "Cache-Control": "no-store" } });
});
