import { z } from "zod";
import { locales } from "@/lib/i18n/routing";
import { plainText } from "@/lib/validation/text";

// Joining an event with its code. Signed in: the person joins at once. Not signed in:
// `email` is required, and a sign-in link goes there (the role waits for that sign-in).
export const joinInput = z
  .object({
    code: plainText(32).refine((v) => v.trim().length > 0, { error: "required" }),
    email: z
      .string()
      .trim()
      .max(254, { error: "tooLong" })
      .pipe(z.email({ error: "email" }))
      .optional(),
    name: plainText(120).optional(),
    locale: z.enum(locales),
  })
  .strict();
export type JoinInput = z.infer<typeof joinInput>;
