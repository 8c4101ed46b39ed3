import { z } from "zod";
import { EVENT_ROLES, TAXON_GROUPS } from "@/lib/domain";
import { onlyCoordinatorsHaveGroups } from "../schema";

export const roleChangeInput = z
  .object({
    role: z.enum(EVENT_ROLES),
    taxonGroups: z.array(z.enum(TAXON_GROUPS)).max(TAXON_GROUPS.length),
  })
  .strict()
  .refine(onlyCoordinatorsHaveGroups, { error: "groupsForCoordinators", path: ["taxonGroups"] });
export type RoleChangeInput = z.infer<typeof roleChangeInput>;
