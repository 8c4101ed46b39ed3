import { z } from "zod";

export const taxaQuery = z.object({ q: z.string().trim().min(2).max(80) }).strict();
