import { z } from "zod";
import { plainText } from "@/lib/validation/text";

// A new read-only API token: a name to recognise it by, what it reads (this event, or every
// event of the organisation: organisation organisers only), and how long it lasts.
export const API_TOKEN_SCOPES = ["event", "organisation"] as const;
export const API_TOKEN_DAYS = [7, 30, 90, 365] as const;

export const newApiTokenInput = z
  .object({
    name: plainText(80).refine((v) => v.trim().length > 0, { error: "required" }),
    scope: z.enum(API_TOKEN_SCOPES),
    expiresInDays: z.literal(API_TOKEN_DAYS),
  })
  .strict();
export type NewApiTokenInput = z.infer<typeof newApiTokenInput>;
