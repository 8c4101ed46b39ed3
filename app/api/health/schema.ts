import { z } from "zod";

// No parameters are needed; unknown ones are refused so typos are noticed.
export const healthQuery = z.object({}).strict();
export type HealthQuery = z.infer<typeof healthQuery>;

export const healthResponse = z.object({
  status: z.enum(["ok", "degraded"]),
  database: z.object({ reachable: z.boolean(), latencyMs: z.number().optional(), postgis: z.string().optional() }),
});
