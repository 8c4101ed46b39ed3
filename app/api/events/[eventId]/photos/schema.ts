import { z } from "zod";

// The upload's body (POST .../photos) is the phone↔server contract in lib/photos/contract.ts.
export { photoUploadInput } from "@/lib/photos/contract";

// GET .../photos/{photoId}?size=thumb|full
export const photoGetQuery = z.object({ size: z.enum(["thumb", "full"]).default("full") }).strict();
