import { z } from "zod";
import { plainText } from "@/lib/validation/text";

/** What the site admin does to an account: lock (with a reason), unlock, or end every session. */
export const adminPersonInput = z
  .object({ action: z.enum(["lock", "unlock", "end_sessions"]), reason: plainText(1000).trim().default("") })
  .strict()
  .refine((d) => d.action !== "lock" || d.reason.length > 0, { error: "reasonRequired", path: ["reason"] });
