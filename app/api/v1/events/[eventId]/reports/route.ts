import { listReports } from "@/db/queries/reports";
import { handle } from "@/lib/http/errors";
import { parseParams } from "@/lib/http/params";
import { requireApiToken } from "@/server/auth/guard";
import { readOnly } from "../../../read-only";
import { eventIdParams } from "../../../schema";
import type { ReportsResponse } from "./schema";

export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ eventId: string }> };

/** The event's published reports, newest first, each saying whether it was withdrawn (who published is not shown). */
export const GET = handle(async (request, { params }: Ctx) => {
  // A malformed address is a 404 for everyone (the one path-parameter rule), then the token.
  const { eventId } = await parseParams(params, eventIdParams.shape);
  await requireApiToken(request, { eventId });
  const body: ReportsResponse = {
    reports: (await listReports(eventId)).map((r) => ({
      id: r.id,
      version: r.version,
      publishedAt: r.publishedAt.toISOString(),
      inputHash: r.inputHash,
      superseded: r.superseded,
      withdrawal: r.withdrawnAt ? { withdrawnAt: r.withdrawnAt.toISOString(), reason: r.withdrawReason ?? "" } : null,
      url: `/api/v1/events/${eventId}/reports/${r.version}`,
    })),
  };
  return Response.json(body, { headers: { "Cache-Control": "no-store" } });
});

export { readOnly as POST, readOnly as PUT, readOnly as PATCH, readOnly as DELETE };
