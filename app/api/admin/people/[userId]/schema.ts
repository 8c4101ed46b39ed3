import { z } from "zod";
import { plainText } from "@/lib/validation/text";

/** What the site admin does to an account: lock (with a reason), unlock, or end every session. */
export const adminPersonInput = z
  .object({ action: z.enum(["lock", "unlock", "end_sessions"]), reason: plainText(1000).trim().default("") })
  .strict()
  .refine((d) => d.action !== "lock" || d.reason.length > 0, { error: "reasonRequired", path: ["reason"] });

/** Erasing an account from the console: the person's address typed to confirm, and why. */
export const adminEraseInput = z
  .object({ confirm: z.string().max(254), reason: plainText(1000).trim().min(1, { error: "reasonRequired" }) })
  .strict();
