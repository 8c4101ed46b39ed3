import { imageSize } from "image-size";

// What a photo really is, judged by its bytes and never by its name or declared type.
export const PHOTO_TYPES = ["image/jpeg", "image/png", "image/webp"] as const;
export type PhotoType = (typeof PHOTO_TYPES)[number];

/**
 * The type from the file signature: JPEG starts with the SOI marker FF D8 then a marker
 * FF (ITU-T T.81, annex B); PNG with its 8-byte signature (PNG specification, section 5.2);
 * WebP with a RIFF header whose form type is "WEBP" (WebP container specification).
 */
export function sniffType(bytes: Uint8Array): PhotoType | null {
  const starts = (sig: number[], at = 0) => sig.every((b, i) => bytes[at + i] === b);
  if (starts([0xff, 0xd8, 0xff])) return "image/jpeg";
  if (starts([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])) return "image/png";
  if (starts([0x52, 0x49, 0x46, 0x46]) && starts([0x57, 0x45, 0x42, 0x50], 8)) return "image/webp";
  return null;
}

/**
 * The most pixels a photo may have, by its header and when decoded: 40 megapixels is above
 * every phone camera's still size in common use (common practice) and far under sharp's own
 * default limit (about 268 megapixels), so a file whose header claims 50,000 × 50,000 pixels
 * (a decompression bomb) is refused before anything decodes it.
 */
export const MAX_PHOTO_PIXELS = 40_000_000;

/** Whether a picture of this size may be decoded at all. */
export const withinPixelLimit = (width: number, height: number, limit = MAX_PHOTO_PIXELS) => width * height <= limit;

export type PhotoFacts = { type: PhotoType; width: number; height: number };

/** Type and pixel size of a picture, or null when the bytes are not a readable JPEG, PNG or WebP. */
export function inspectPhoto(bytes: Uint8Array): PhotoFacts | null {
  const type = sniffType(bytes);
  if (!type) return null;
  try {
    const size = imageSize(bytes);
    const expected = { "image/jpeg": "jpg", "image/png": "png", "image/webp": "webp" }[type];
    if (size.type !== expected || !size.width || !size.height) return null;
    // EXIF orientations 5-8 turn the picture a quarter: report the size as it is seen.
    const turned = (size.orientation ?? 1) >= 5;
    return { type, width: turned ? size.height : size.width, height: turned ? size.width : size.height };
  } catch {
    return null;
  }
}
