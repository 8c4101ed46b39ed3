import { z } from "zod";

// The file's content goes as parsed JSON under `geojson`; its shape is checked by
// lib/geo/geojson.ts (RFC 7946), then by PostGIS. `save: false` only checks.
export const MAX_GEOJSON_BYTES = 5_000_000;
export const zonesUploadInput = z
  .object({
    geojson: z
      .unknown()
      .refine((v) => v !== undefined, { error: "required" })
      .refine((v) => !JSON.stringify(v ?? null).includes("\\u0000"), { error: "invalidChar" }),
    save: z.boolean(),
  })
  .strict();
export type ZonesUploadInput = z.infer<typeof zonesUploadInput>;
