import { eventForSetup, updateEvent } from "@/db/queries/setup";
import { ApiError, handle } from "@/lib/http/errors";
import { parseParams, pathId } from "@/lib/http/params";
import { eventInstants, utcToZonedLocal } from "@/lib/time/zoned";
import { requireSetupReadPermit, requireSetupWritePermit } from "@/server/setup/handler";
import { updateEventInput } from "./schema";

type Ctx = { params: Promise<{ eventId: string }> };
export const dynamic = "force-dynamic";

// The event's details for its organisers: read them, and change them.
export const GET = handle<Ctx>(async (request, { params }) => {
  const { eventId } = await parseParams(params, { eventId: pathId });
  await requireSetupReadPermit(request, eventId);
  const event = await eventForSetup(eventId);
  if (!event) throw new ApiError("not_found");
  return Response.json(
    {
      ...event,
      startsLocal: utcToZonedLocal(event.startsAt, event.timeZone),
      endsLocal: utcToZonedLocal(event.endsAt, event.timeZone),
    },
    { headers: { "Cache-Control": "no-store" } },
  );
});

export const PATCH = handle<Ctx>(async (request, { params }) => {
  const { eventId } = await parseParams(params, { eventId: pathId });
  const { input } = await requireSetupWritePermit(request, eventId, updateEventInput);
  const { startsLocal, endsLocal, ...rest } = input;
  await updateEvent(eventId, { ...rest, ...eventInstants(input) });
  return Response.json({ ok: true });
});
