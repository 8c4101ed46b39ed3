import { z } from "zod";
import { endsAfterStarts, eventFields } from "@/app/api/organisations/[organisationId]/events/schema";
import { EVENT_STATUSES } from "@/lib/domain";

// Editing an event's details: the same fields as creating it, plus its status. The slug
// (the public address) does not change once made: links to it are already out.
export const updateEventInput = eventFields
  .extend({
    status: z.enum(EVENT_STATUSES),
  })
  .strict()
  .refine(endsAfterStarts, { error: "endsBeforeStart", path: ["endsLocal"] });
export type UpdateEventInput = z.infer<typeof updateEventInput>;
