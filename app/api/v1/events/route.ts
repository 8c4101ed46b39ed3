import { apiEvents } from "@/db/queries/api-tokens";
import { handle } from "@/lib/http/errors";
import { requireApiToken } from "@/server/auth/guard";
import { readOnly } from "../read-only";
import type { EventsResponse } from "./schema";

export const dynamic = "force-dynamic";

/** The events the token may read: its own event, or every event of its organisation. */
export const GET = handle(async (request) => {
  const token = await requireApiToken(request, "token's own events");
  const events = await apiEvents(token);
  const body: EventsResponse = {
    scope: token.eventId ? "event" : "organisation",
    events: events.map((e) => ({
      ...e,
      status: e.status as EventsResponse["events"][number]["status"],
      startsAt: e.startsAt.toISOString(),
      endsAt: e.endsAt.toISOString(),
    })),
  };
  return Response.json(body, { headers: { "Cache-Control": "no-store" } });
});

export { readOnly as POST, readOnly as PUT, readOnly as PATCH, readOnly as DELETE };
