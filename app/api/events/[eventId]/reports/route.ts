import { z } from "zod";
import { listReports } from "@/db/queries/reports";
import { requireEventRole } from "@/server/auth/guard";
import { apiTranslator, handle, requestLocale } from "@/lib/http/errors";
import { parseJson } from "@/lib/http/body";
import { parseParams, pathId } from "@/lib/http/params";
import { limitWrites } from "@/lib/http/write-limit";
import { plainText } from "@/lib/validation/text";
import { PendingRecordsError, PUBLISH_NOTE_MAX, publishReport } from "@/server/results/publish";

export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ eventId: string }> };

/** Report versions of the event, newest first (organisers and coordinators). */
export const GET = handle(async (_request, { params }: Ctx) => {
  const { eventId } = await parseParams(params, { eventId: pathId });
  await requireEventRole(eventId, "coordinator");
  return Response.json({ reports: await listReports(eventId) }, { headers: { "Cache-Control": "no-store" } });
});

const PublishBody = z
  .object({
    confirmPending: z.boolean().optional(),
    // The organiser's optional note on the report page, and whether participants are e-mailed (default yes).
    note: plainText(PUBLISH_NOTE_MAX).optional(),
    notify: z.boolean().optional(),
  })
  .strict();

/**
 * "Publish": freezes the current results into the next report version (organisers).
 * With sightings still pending or returned, it refuses (409, with their numbers) unless
 * the body says `{ "confirmPending": true }`; the report then states the numbers. `note`: shown
 * on the report page; `notify: false` holds back the e-mail to participants.
 */
export const POST = handle(async (request, { params }: Ctx) => {
  const { eventId } = await parseParams(params, { eventId: pathId });
  const { user } = await requireEventRole(eventId, "organiser");
  // No body (an empty POST publishes); a body of any other type than JSON is a 415 from parseJson.
  const hasBody = request.headers.get("content-length") !== "0" && request.headers.get("content-type") !== null;
  const body = hasBody ? await parseJson(request, PublishBody) : {};
  limitWrites(`publish:${user.id}`, 10, 60_000);
  try {
    const report = await publishReport(eventId, user.id, {
      confirmPending: body.confirmPending === true,
      note: body.note,
      notify: body.notify,
    });
    return Response.json(report, { status: 201 });
  } catch (err) {
    if (!(err instanceof PendingRecordsError)) throw err;
    const t = apiTranslator(requestLocale(request));
    const { pending, returned } = err.pending;
    return Response.json(
      {
        error: { code: "conflict", message: t("pendingRecords", { pending, returned }), fields: [] },
        pending: err.pending,
      },
      { status: 409, headers: { "Cache-Control": "no-store" } },
    );
  }
});
