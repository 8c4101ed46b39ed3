import { z } from "zod";

export const apiEvent = z
  .object({
    id: z.uuid(),
    slug: z.string(),
    name: z.string(),
    status: z.enum(["draft", "open", "closed"]),
    startsAt: z.iso.datetime(),
    endsAt: z.iso.datetime(),
    timeZone: z.string().meta({ description: "IANA time zone of the event." }),
  })
  .meta({ id: "Event" });

export const eventsResponse = z.object({
  scope: z
    .enum(["event", "organisation"])
    .meta({ description: "Whether the token reads one event or every event of its organisation." }),
  events: z.array(apiEvent),
});
export type EventsResponse = z.infer<typeof eventsResponse>;
