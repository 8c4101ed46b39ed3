import { checkReport } from "@/server/results/check";
import { requireEventRole } from "@/server/auth/guard";
import { ApiError, handle } from "@/lib/http/errors";
import { parseParams, pathId, pathVersion } from "@/lib/http/params";

export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ eventId: string; version: string }> };

/** Re-computes a report from its recorded inputs and says whether every number is the same. */
export const GET = handle(async (_request, { params }: Ctx) => {
  const { eventId, version } = await parseParams(params, { eventId: pathId, version: pathVersion });
  await requireEventRole(eventId, "coordinator");
  const check = await checkReport(eventId, version);
  if (!check) throw new ApiError("not_found");
  return Response.json({ same: check.same, hashSame: check.hashSame }, { headers: { "Cache-Control": "no-store" } });
});
