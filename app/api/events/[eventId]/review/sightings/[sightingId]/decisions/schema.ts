import { z } from "zod";
import { REJECT_REASONS } from "@/lib/domain";
import { freeText } from "@/lib/validation/text";

const version = z.number().int().min(1).max(2_147_483_647); // the version the coordinator saw
const note = freeText().max(2000).optional();

// One decision: approve; reject with a reason (and free text); return with a question;
// re-identify (the new taxon; the original stays in the history).
export const decisionInput = z.discriminatedUnion("action", [
  z.object({ action: z.literal("approve"), version, message: note }).strict(),
  z.object({ action: z.literal("reject"), version, reason: z.enum(REJECT_REASONS), message: note }).strict(),
  z.object({ action: z.literal("return"), version, message: freeText().trim().min(3).max(2000) }).strict(),
  // approve: true makes "re-identify and approve" one decision.
  z
    .object({
      action: z.literal("reidentify"),
      version,
      taxonId: z.uuid(),
      approve: z.boolean().optional(),
      message: note,
    })
    .strict(),
]);
export type DecisionInput = z.infer<typeof decisionInput>;
