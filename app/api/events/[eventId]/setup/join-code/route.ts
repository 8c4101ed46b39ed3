import { rotateJoinCode } from "@/db/queries/setup";
import { handle } from "@/lib/http/errors";
import { parseParams, pathId } from "@/lib/http/params";
import { requireSetupWritePermit } from "@/server/setup/handler";

type Ctx = { params: Promise<{ eventId: string }> };

// A new join code: the old link stops working (a code shared too widely can be retired).
export const POST = handle<Ctx>(async (request, { params }) => {
  const { eventId } = await parseParams(params, { eventId: pathId });
  await requireSetupWritePermit(request, eventId);
  return Response.json({ joinCode: await rotateJoinCode(eventId) });
});
