import { listReports } from "@/db/queries/reports";
import { handle } from "@/lib/http/errors";
import { parseParams } from "@/lib/http/params";
import { requireApiToken } from "@/server/auth/guard";
import { readOnly } from "../../../read-only";
import { eventIdParams } from "../../../schema";
import type { ReportsResponse } from "./schema";

export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ eventId: string }> };

/** The event's published reports, newest first (who published is not shown). */
export const GET = handle(async (request, { params }: Ctx) => {
  // The token first: a caller without one hears 401 whatever the address (an unknown or malformed event is a 404 after it).
  const raw = await params;
  await requireApiToken(request, { eventId: raw.eventId });
  const { eventId } = await parseParams(Promise.resolve(raw), eventIdParams.shape);
  const body: ReportsResponse = {
    reports: (await listReports(eventId)).map((r) => ({
      id: r.id,
      version: r.version,
      publishedAt: r.publishedAt.toISOString(),
      inputHash: r.inputHash,
      superseded: r.superseded,
      url: `/api/v1/events/${eventId}/reports/${r.version}`,
    })),
  };
  return Response.json(body, { headers: { "Cache-Control": "no-store" } });
});

export { readOnly as POST, readOnly as PUT, readOnly as PATCH, readOnly as DELETE };
