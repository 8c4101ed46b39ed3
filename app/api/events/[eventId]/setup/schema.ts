import { z } from "zod";
import { endsAfterStarts, eventFields } from "@/app/api/organisations/[organisationId]/events/schema";
import { EVENT_STATUSES } from "@/lib/domain";
import { DATA_LICENSE_KEYS } from "@/lib/results/licenses";

// Editing an event's details: the same fields as creating it, plus its status. The slug
// (the public address) does not change once made: links to it are already out.
export const updateEventInput = eventFields
  .extend({
    status: z.enum(EVENT_STATUSES),
    // The published data's licence and whether the Darwin Core archive states absences (lib/results/dwc.ts).
    dataLicense: z.enum(DATA_LICENSE_KEYS).optional(),
    publishAbsences: z.boolean().optional(),
  })
  .strict()
  .refine(endsAfterStarts, { error: "endsBeforeStart", path: ["endsLocal"] });
export type UpdateEventInput = z.infer<typeof updateEventInput>;
