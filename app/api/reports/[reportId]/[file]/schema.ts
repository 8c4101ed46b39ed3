import { z } from "zod";

// A published report's public downloads (also described in /api/openapi.json).
export const REPORT_FILES = ["species.csv", "darwin-core-archive.zip", "sightings.geojson"] as const;

export const reportFileParams = z.object({
  reportId: z.uuid(),
  file: z.enum(REPORT_FILES),
});

// Public but short-lived in shared caches, and revalidated: a report going back to draft or a
// taxon's raised sensitivity reaches every reader within five minutes (issue 13).
export const FILE_CACHE = "public, max-age=300, must-revalidate";
