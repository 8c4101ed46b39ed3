import { listReports } from "@/db/queries/reports";
import { requireEventRole } from "@/server/auth/guard";
import { handle } from "@/lib/http/errors";
import { parseParams, pathId } from "@/lib/http/params";
import { limitWrites } from "@/lib/http/write-limit";
import { publishReport } from "@/server/results/publish";

export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ eventId: string }> };

/** Report versions of the event, newest first (organisers and coordinators). */
export const GET = handle(async (_request, { params }: Ctx) => {
  const { eventId } = await parseParams(params, { eventId: pathId });
  await requireEventRole(eventId, "coordinator");
  return Response.json({ reports: await listReports(eventId) }, { headers: { "Cache-Control": "no-store" } });
});

/** "Publish": freezes the current results into the next report version (organisers). */
export const POST = handle(async (_request, { params }: Ctx) => {
  const { eventId } = await parseParams(params, { eventId: pathId });
  const { user } = await requireEventRole(eventId, "organiser");
  limitWrites(`publish:${user.id}`, 10, 60_000);
  const report = await publishReport(eventId, user.id);
  return Response.json(report, { status: 201 });
});
