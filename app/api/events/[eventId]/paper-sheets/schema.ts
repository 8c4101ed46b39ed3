import { z } from "zod";
import { plainText } from "@/lib/validation/text";

// A transcribed paper sheet: the CSV file's text; `save: false` only checks and reports.
export const MAX_SHEET_CHARS = 2_000_000;
export const paperSheetInput = z
  .object({
    csv: plainText(MAX_SHEET_CHARS),
    save: z.boolean(),
  })
  .strict();
export type PaperSheetInput = z.infer<typeof paperSheetInput>;

/** GET: the template to download. */
export const paperSheetQuery = z.object({ locale: z.enum(["en", "es", "fr"]).optional() }).strict();
