import { requireEventRole } from "@/server/auth/guard";
import { handle } from "@/lib/http/errors";
import { parseJson } from "@/lib/http/body";
import { parseParams, pathId, pathVersion } from "@/lib/http/params";
import { limitWrites } from "@/lib/http/write-limit";
import { withdrawReport } from "@/server/results/withdraw";
import { withdrawInput } from "./schema";

export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ eventId: string; version: string }> };

/**
 * "Withdraw" a published version with a reason (organisers). The version stays readable, with a
 * notice and the reason; 404 for a version that does not exist, 409 when it is already withdrawn.
 */
export const POST = handle(async (request, { params }: Ctx) => {
  const { eventId, version } = await parseParams(params, { eventId: pathId, version: pathVersion });
  const { user } = await requireEventRole(eventId, "organiser");
  const { reason } = await parseJson(request, withdrawInput, { messages: "Report.errors" });
  limitWrites(`withdraw:${user.id}`, 10, 60_000);
  return Response.json(await withdrawReport(eventId, version, user.id, reason), { status: 201 });
});
