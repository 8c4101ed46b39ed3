import { z } from "zod";

// A published report's public downloads (also described in /api/openapi.json).
export const REPORT_FILES = ["species.csv", "darwin-core-archive.zip", "sightings.geojson"] as const;

export const reportFileParams = z.object({
  reportId: z.uuid(),
  file: z.enum(REPORT_FILES),
});
