import { z } from "zod";
import { plainText } from "@/lib/validation/text";

export const WITHDRAW_REASON_MAX = 1000;

/** Withdrawing a report version: the reason is required and shown on the version's public page. */
export const withdrawInput = z
  .object({ reason: plainText(WITHDRAW_REASON_MAX).trim().min(1, { error: "reasonRequired" }) })
  .strict();
export type WithdrawInput = z.infer<typeof withdrawInput>;
