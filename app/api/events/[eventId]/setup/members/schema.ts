import { z } from "zod";
import { EVENT_ROLES, TAXON_GROUPS } from "@/lib/domain";
import { locales } from "@/lib/i18n/routing";
import { plainText } from "@/lib/validation/text";

// Taxon-group limits mean something for coordinators only; for others they must be empty.
export const onlyCoordinatorsHaveGroups = (v: { role: string; taxonGroups: string[] }) =>
  v.role === "coordinator" || v.taxonGroups.length === 0;

// An invitation by e-mail: the person gets a sign-in link; their role is ready when they arrive.
export const inviteInput = z
  .object({
    email: z
      .string()
      .trim()
      .max(254, { error: "tooLong" })
      .pipe(z.email({ error: "email" })),
    name: plainText(120),
    role: z.enum(EVENT_ROLES),
    taxonGroups: z.array(z.enum(TAXON_GROUPS)).max(TAXON_GROUPS.length),
    locale: z.enum(locales),
  })
  .strict()
  .refine(onlyCoordinatorsHaveGroups, { error: "groupsForCoordinators", path: ["taxonGroups"] });
export type InviteInput = z.infer<typeof inviteInput>;
