import { checkReport } from "@/server/results/check";
import { requireEventRole } from "@/server/auth/guard";
import { ApiError, handle } from "@/lib/http/errors";

export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ eventId: string; version: string }> };

/** Re-computes a report from its recorded inputs and says whether every number is the same. */
export const GET = handle(async (_request, { params }: Ctx) => {
  const { eventId, version } = await params;
  await requireEventRole(eventId, "coordinator");
  const v = Number(version);
  if (!Number.isInteger(v) || v < 1 || v > 1_000_000) throw new ApiError("not_found");
  const check = await checkReport(eventId, v);
  if (!check) throw new ApiError("not_found");
  return Response.json({ same: check.same, hashSame: check.hashSame }, { headers: { "Cache-Control": "no-store" } });
});
