import { z } from "zod";

// The results page's own JSON (lib/results/compute.ts Results): its top-level members here,
// the statistics inside them as the results page shows them.
export const resultsResponse = z
  .looseObject({
    engineVersion: z.string(),
    species: z.array(z.looseObject({ id: z.uuid(), scientificName: z.string(), individuals: z.number() })),
    zones: z.array(z.looseObject({ id: z.string(), name: z.string() })),
  })
  .meta({
    id: "Results",
    description:
      "The event's current results: species and counts per zone, completeness, richness estimates with confidence intervals, edge and interior comparison.",
  });
