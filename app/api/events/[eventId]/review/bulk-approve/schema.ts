import { z } from "zod";
import { CHECK_MARKS } from "@/lib/domain";
import { queueFilters } from "@/lib/review/filters";

// Check marks the coordinator chose to include explicitly; without them, bulk approval takes
// only pending sightings with no check mark.
const include = z.array(z.enum(CHECK_MARKS)).max(CHECK_MARKS.length);

// The filters the coordinator sees, the marks they included, and the number the confirmation showed them.
export const bulkApproveInput = z
  .object({
    filters: queueFilters,
    include: include.default([]),
    expectedCount: z.number().int().min(1).max(500),
  })
  .strict();
export type BulkApproveInput = z.infer<typeof bulkApproveInput>;

// The confirmation's numbers: the queue's filters plus the included marks (comma-separated).
export const bulkPreviewQuery = queueFilters
  .extend({
    include: z
      .string()
      .max(200)
      .transform((v) => v.split(",").filter(Boolean))
      .pipe(include)
      .optional(),
  })
  .strict();
