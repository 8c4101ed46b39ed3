import { z } from "zod";

// Undo a decision: which one (the latest on the sighting), and the version the coordinator sees.
export const undoInput = z
  .object({
    reviewId: z.number().int().min(1).max(Number.MAX_SAFE_INTEGER),
    version: z.number().int().min(1).max(2_147_483_647),
  })
  .strict();
export type UndoInput = z.infer<typeof undoInput>;
