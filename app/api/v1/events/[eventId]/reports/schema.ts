import { z } from "zod";

export const reportSummary = z
  .object({
    id: z.uuid(),
    version: z.number().int(),
    publishedAt: z.iso.datetime(),
    inputHash: z.string().meta({ description: "SHA-256 of the report's exact input records." }),
    superseded: z.boolean(),
    url: z.string().meta({ description: "This version through the API." }),
  })
  .meta({ id: "ReportSummary" });

export const reportsResponse = z.object({ reports: z.array(reportSummary) });
export type ReportsResponse = z.infer<typeof reportsResponse>;
