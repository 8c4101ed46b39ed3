import { z } from "zod";
import { PHOTO_TYPES } from "./inspect";

// A photo the device is about to upload: what it declares is checked against the bytes
// that arrive (POST .../photos/{photoId}/confirm).
export const photoUploadInput = z
  .object({
    id: z.uuid(),
    sightingId: z.uuid(),
    contentType: z.enum(PHOTO_TYPES),
    sizeBytes: z.number().int().min(1),
    sha256: z.string().regex(/^[0-9a-f]{64}$/), // lowercase hex of the exact bytes
    width: z.number().int().min(1).max(50_000),
    height: z.number().int().min(1).max(50_000),
  })
  .strict();
export type PhotoUploadInput = z.infer<typeof photoUploadInput>;

export type PhotoUploadAnswer =
  | { outcome: "upload"; uploadUrl: string; headers: Record<string, string>; expiresAt: string }
  | { outcome: "already_had" };
export type PhotoConfirmAnswer = { outcome: "created" | "already_had"; width?: number; height?: number };
