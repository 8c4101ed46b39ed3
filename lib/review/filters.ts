import { z } from "zod";
import { CHECK_MARKS, REVIEW_STATES, TAXON_GROUPS } from "@/lib/domain";

// The review queue's filters: the same object in the desk's filter bar (page state), in the queue
// handler's query string and in the bulk-approve body, so "approve what I see" means
// exactly the set the coordinator filtered.
// A calendar day between 1900 and 2099 that exists (no 30 February).
const isoDate = z
  .string()
  .regex(/^(19|20)\d{2}-\d{2}-\d{2}$/)
  .refine(
    (v) => !Number.isNaN(Date.parse(`${v}T00:00:00Z`)) && new Date(`${v}T00:00:00Z`).toISOString().startsWith(v),
    "invalid date",
  );

export const queueFilters = z
  .object({
    state: z.enum(REVIEW_STATES).optional(),
    zone: z.union([z.uuid(), z.literal("none")]).optional(),
    group: z.enum(TAXON_GROUPS).optional(),
    // Comma-separated: a sighting must carry every mark named.
    marks: z
      .string()
      .max(200)
      .transform((v) => v.split(",").filter(Boolean))
      .pipe(z.array(z.enum(CHECK_MARKS)).max(CHECK_MARKS.length))
      .optional(),
    volunteer: z.uuid().optional(),
    from: isoDate.optional(), // observed on or after this day, in the event's time zone
    to: isoDate.optional(), // observed on or before this day, in the event's time zone
    photo: z.enum(["yes", "no"]).optional(),
    order: z.enum(["newest", "oldest"]).default("newest"),
  })
  .strict();
export type QueueFilters = z.infer<typeof queueFilters>;
