import { z } from "zod";
import { EVENT_ROLES, onlyCoordinatorsHaveGroups, TAXON_GROUP_CODES } from "../schema";

export const roleChangeInput = z.object({
  role: z.enum(EVENT_ROLES),
  taxonGroups: z.array(z.enum(TAXON_GROUP_CODES)).max(TAXON_GROUP_CODES.length),
}).strict().refine(onlyCoordinatorsHaveGroups, { error: "groupsForCoordinators", path: ["taxonGroups"] });
export type RoleChangeInput = z.infer<typeof roleChangeInput>;
