import { z } from "zod";
import { TAXON_GROUPS } from "@/lib/domain";
import { COUNT_UNITS } from "@/lib/results/settings";

/** What a count of one taxon group means at an event (organisers set it on the results page). */
export const countUnitInput = z.object({ group: z.enum(TAXON_GROUPS), unit: z.enum(COUNT_UNITS) }).strict();
export type CountUnitInput = z.infer<typeof countUnitInput>;
