import { z } from "zod";
import { queueFilters } from "@/lib/review/filters";

export const queueQuery = queueFilters
  .extend({
    cursor: z.string().max(200).optional(),
    limit: z.coerce.number().int().min(1).max(200).default(50),
  })
  .strict();
export type QueueQuery = z.infer<typeof queueQuery>;
