import { z } from "zod";
import { queueFilters } from "@/lib/review/filters";

// The filters the coordinator sees, and the number the confirmation showed them.
export const bulkApproveInput = z
  .object({
    filters: queueFilters,
    expectedCount: z.number().int().min(1).max(500),
  })
  .strict();
export type BulkApproveInput = z.infer<typeof bulkApproveInput>;
