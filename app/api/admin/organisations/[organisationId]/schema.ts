import { z } from "zod";
import { plainText } from "@/lib/validation/text";

/** Suspend (with a reason) or reinstate an organisation. */
export const organisationStatusInput = z
  .object({ suspended: z.boolean(), reason: plainText(1000).trim() })
  .strict()
  .refine((d) => !d.suspended || d.reason.length > 0, { error: "reasonRequired", path: ["reason"] });
