import { eventForSetup, updateEvent } from "@/db/queries/setup";
import { requireEventRole } from "@/server/auth/guard";
import { ApiError, handle, parseQuery } from "@/lib/http/errors";
import { limitWrites } from "@/lib/http/write-limit";
import { eventInstants, parseSetupBody } from "@/lib/setup/api";
import { utcToZonedLocal } from "@/lib/time/zoned";
import { setupQuery, updateEventInput } from "./schema";

type Ctx = { params: Promise<{ eventId: string }> };
export const dynamic = "force-dynamic";

// The event's details for its organisers: read them, and change them.
export const GET = handle<Ctx>(async (request, { params }) => {
  const { eventId } = await params;
  await requireEventRole(eventId, "organiser");
  parseQuery(request, setupQuery);
  const event = await eventForSetup(eventId);
  if (!event) throw new ApiError("not_found");
  return Response.json({
    ...event,
    startsLocal: utcToZonedLocal(event.startsAt, event.timeZone),
    endsLocal: utcToZonedLocal(event.endsAt, event.timeZone),
  }, { headers: { "Cache-Control": "no-store" } });
});

export const PATCH = handle<Ctx>(async (request, { params }) => {
  const { eventId } = await params;
  const { user } = await requireEventRole(eventId, "organiser");
  limitWrites(`setup:${user.id}`);
  const input = await parseSetupBody(request, updateEventInput);
  const { startsLocal, endsLocal, ...rest } = input;
  await updateEvent(eventId, { ...rest, ...eventInstants(input) });
  return Response.json({ ok: true });
});
