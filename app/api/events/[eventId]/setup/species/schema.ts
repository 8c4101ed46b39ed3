import { z } from "zod";
import { plainText } from "@/lib/validation/text";

// The CSV file's text; `save: false` only checks and reports.
export const MAX_CSV_CHARS = 2_000_000;
export const speciesUploadInput = z
  .object({
    csv: plainText(MAX_CSV_CHARS),
    save: z.boolean(),
  })
  .strict();
export type SpeciesUploadInput = z.infer<typeof speciesUploadInput>;
