import { z } from "zod";
import { plainText } from "@/lib/validation/text";

// A request for a new organisation: one schema for the form and the handler. Messages are
// keys under "Organisations.errors" (the form shows the same words).

const NOT_COUNTRIES = new Set(["EU", "EZ", "QO", "UN", "XA", "XB", "ZZ"]);
/** ISO 3166-1 alpha-2 codes the platform's region names know (Intl.DisplayNames), less groupings and test codes. */
export const COUNTRY_CODES: string[] = (() => {
  const names = new Intl.DisplayNames(["en"], { type: "region" });
  const out: string[] = [];
  for (let a = 65; a < 91; a++)
    for (let b = 65; b < 91; b++) {
      const code = String.fromCharCode(a, b);
      if (NOT_COUNTRIES.has(code)) continue;
      try {
        const name = names.of(code);
        if (name && name !== code) out.push(code);
      } catch {
        // not a region code
      }
    }
  return out;
})();

export const organisationRequestInput = z
  .object({
    name: plainText(120).trim().min(3, { error: "nameShort" }),
    contactEmail: z
      .string()
      .trim()
      .max(254, { error: "tooLong" })
      .pipe(z.email({ error: "email" })),
    country: z.string().refine((c) => COUNTRY_CODES.includes(c), { error: "country" }),
    description: plainText(500).trim().min(10, { error: "descriptionShort" }),
  })
  .strict();
export type OrganisationRequestFormInput = z.infer<typeof organisationRequestInput>;

/** The site admin's answer: approve, or decline with a reason (a reason is required to decline). */
export const organisationDecisionInput = z
  .object({
    decision: z.enum(["approve", "decline"]),
    reason: plainText(1000).trim(),
  })
  .strict()
  .refine((d) => d.decision === "approve" || d.reason.length > 0, { error: "reasonRequired", path: ["reason"] });

export const addOrganiserInput = z
  .object({
    email: z
      .string()
      .trim()
      .max(254, { error: "tooLong" })
      .pipe(z.email({ error: "email" })),
  })
  .strict();
