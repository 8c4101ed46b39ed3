import { z } from "zod";
import { resultsResponse } from "../../results/schema";
import { withdrawal } from "../schema";

export const reportParams = z
  .object({
    eventId: z.uuid(),
    version: z.coerce.number().int().min(1).max(1_000_000).meta({ description: "Report version, from 1." }),
  })
  .strict();

export const reportResponse = z
  .object({
    id: z.uuid(),
    version: z.number().int(),
    publishedAt: z.iso.datetime(),
    superseded: z.boolean(),
    withdrawal,
    engineVersion: z.string(),
    inputHash: z.string(),
    results: resultsResponse,
    methodNotes: z.unknown().meta({ description: "How each figure was computed, with sources." }),
    changes: z.unknown().meta({ description: "What changed since the previous version (empty for version 1)." }),
    downloads: z
      .object({ speciesCsv: z.string(), darwinCoreArchive: z.string(), geojson: z.string() })
      .meta({ description: "The public downloads of this version (no token needed)." }),
  })
  .meta({ id: "Report" });
export type ReportResponse = z.infer<typeof reportResponse>;
