import { z } from "zod";
import { freeText } from "@/lib/validation/text";

export const taxaQuery = z.object({ q: freeText().trim().min(2).max(80) }).strict();
