import { z } from "zod";
import { locales } from "@/lib/i18n/routing";
import { plainText } from "@/lib/validation/text";
import { consentField, publishedNameField } from "@/lib/account/published-name";

// Joining an event with its code. Signed in: the person joins at once. Not signed in:
// `email` is required, and a sign-in link goes there (the role waits for that sign-in).
// Either way the person chooses the name published about them and consents to it.
export const joinInput = z
  .object({
    code: plainText(32).refine((v) => v.trim().length > 0, { error: "required" }),
    email: z
      .string()
      .trim()
      .max(254, { error: "tooLong" })
      .pipe(z.email({ error: "email" }))
      .optional(),
    publishedName: publishedNameField,
    consent: consentField,
    locale: z.enum(locales),
  })
  .strict();
export type JoinInput = z.infer<typeof joinInput>;
