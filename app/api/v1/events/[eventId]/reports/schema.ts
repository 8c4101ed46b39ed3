import { z } from "zod";

/** A withdrawn version (issue 16): its data stay, with when and why it was withdrawn. */
export const withdrawal = z
  .object({ withdrawnAt: z.iso.datetime(), reason: z.string() })
  .nullable()
  .meta({ id: "Withdrawal", description: "Set when the organiser withdrew this version: do not use it as current." });

export const reportSummary = z
  .object({
    id: z.uuid(),
    version: z.number().int(),
    publishedAt: z.iso.datetime(),
    inputHash: z.string().meta({ description: "SHA-256 of the report's exact input records." }),
    superseded: z.boolean(),
    withdrawal,
    url: z.string().meta({ description: "This version through the API." }),
  })
  .meta({ id: "ReportSummary" });

export const reportsResponse = z.object({ reports: z.array(reportSummary) });
export type ReportsResponse = z.infer<typeof reportsResponse>;
