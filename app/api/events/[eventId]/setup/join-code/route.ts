import { rotateJoinCode } from "@/db/queries/setup";
import { requireEventRole } from "@/server/auth/guard";
import { handle } from "@/lib/http/errors";
import { limitWrites } from "@/lib/http/write-limit";

type Ctx = { params: Promise<{ eventId: string }> };

// A new join code: the old link stops working (a code shared too widely can be retired).
export const POST = handle<Ctx>(async (_request, { params }) => {
  const { eventId } = await params;
  const { user } = await requireEventRole(eventId, "organiser");
  limitWrites(`setup:${user.id}`);
  return Response.json({ joinCode: await rotateJoinCode(eventId) });
});
