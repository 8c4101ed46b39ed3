import "server-only";
import { createHash } from "node:crypto";
import sharp from "sharp";
import { findPhoto, insertPhoto, sightingForPhotos, type PhotoSighting } from "@/db/queries/photos";
import type { PhotoConfirmAnswer, PhotoUploadAnswer, PhotoUploadInput } from "@/lib/photos/contract";
import { env } from "@/lib/env";
import { ApiError } from "@/lib/http/errors";
import { isUuid } from "@/lib/http/params";
import type { Locale } from "@/lib/i18n/routing";
import { translator } from "@/lib/i18n/translator";
import { deleteObject, presignGet, presignPut, readObject, writeObject } from "@/server/storage/s3";
import { inspectPhoto, MAX_PHOTO_PIXELS, withinPixelLimit, type PhotoType } from "@/lib/photos/inspect";

// Photos of sightings through the S3 API (issue 5): the device asks for a presigned PUT,
// uploads the bytes straight to the photo store, then asks the server to confirm. The
// server reads the bytes back, checks them against what was declared, strips the metadata
// (EXIF location above all) and makes a thumbnail with sharp before the photos row exists.

export const incomingKey = (eventId: string, photoId: string) => `incoming/${eventId}/${photoId}`;
export const photoKey = (eventId: string, photoId: string) => `photos/${eventId}/${photoId}`;
export const thumbKey = (storageKey: string) => `${storageKey}-thumb.jpg`;
const THUMB_PX = 480;

type Caller = { userId: string; eventId: string; locale: Locale };

type PhotoProblem = keyof (typeof import("@/messages/en.json"))["FieldSync"]["photo"];

function problem(
  locale: Locale,
  code: "unprocessable" | "conflict",
  field: string,
  key: PhotoProblem,
  values: Record<string, string | number> = {},
): ApiError {
  return new ApiError(code, [{ field, message: translator(locale, "FieldSync")(`photo.${key}`, values) }]);
}

const tooManyPixels = (locale: Locale, width: number, height: number) =>
  problem(locale, "unprocessable", "width", "too_many_pixels", {
    actual: `${width}×${height}`,
    maximum: MAX_PHOTO_PIXELS / 1_000_000,
  });

async function ownSighting(c: Caller, sightingId: string): Promise<PhotoSighting> {
  const sighting = await sightingForPhotos(sightingId, c.eventId);
  if (!sighting || sighting.userId !== c.userId)
    throw problem(c.locale, "unprocessable", "sightingId", "sighting_not_yours");
  return sighting;
}

/** Whether the photo with this id is already stored for the caller; refuses someone else's id. */
async function alreadyHad(c: Caller, photoId: string): Promise<boolean> {
  const existing = await findPhoto(photoId);
  if (!existing) return false;
  if (existing.sighting.userId !== c.userId || existing.sighting.eventId !== c.eventId)
    throw problem(c.locale, "conflict", "id", "id_taken");
  return true;
}

export async function requestPhotoUpload(c: Caller, input: PhotoUploadInput): Promise<PhotoUploadAnswer> {
  const id = input.id.toLowerCase();
  if (await alreadyHad(c, id)) return { outcome: "already_had" };
  await ownSighting(c, input.sightingId.toLowerCase());
  const max = env().PHOTO_MAX_BYTES;
  if (input.sizeBytes > max)
    throw problem(c.locale, "unprocessable", "sizeBytes", "too_large", { maximum: Math.floor(max / 1_000_000) });
  if (!withinPixelLimit(input.width, input.height)) throw tooManyPixels(c.locale, input.width, input.height);
  // What the device declared travels with the object (signed x-amz-meta-* headers) to the confirm step.
  const signed = await presignPut(incomingKey(c.eventId, id), input.contentType, {
    "user-id": c.userId,
    "sighting-id": input.sightingId.toLowerCase(),
    "content-type": input.contentType,
    "size-bytes": String(input.sizeBytes),
    sha256: input.sha256,
    width: String(input.width),
    height: String(input.height),
  });
  return { outcome: "upload", ...signed };
}

export async function confirmPhoto(c: Caller, photoId: string): Promise<PhotoConfirmAnswer> {
  const id = photoId.toLowerCase();
  if (await alreadyHad(c, id)) return { outcome: "already_had" };
  const max = env().PHOTO_MAX_BYTES;
  const object = await readObject(incomingKey(c.eventId, id), max);
  if (object === "too_large")
    throw problem(c.locale, "unprocessable", "sizeBytes", "too_large", { maximum: Math.floor(max / 1_000_000) });
  if (!object || object.meta["user-id"] !== c.userId) throw problem(c.locale, "unprocessable", "id", "not_uploaded");
  const declared = object.meta;
  const sighting = await ownSighting(c, declared["sighting-id"] ?? "");

  const facts = inspectPhoto(object.bytes);
  if (!facts) throw problem(c.locale, "unprocessable", "contentType", "not_image");
  // By the header's own claim, before anything decodes the picture (decompression bombs).
  if (!withinPixelLimit(facts.width, facts.height)) throw tooManyPixels(c.locale, facts.width, facts.height);
  if (facts.type !== declared["content-type"])
    throw problem(c.locale, "unprocessable", "contentType", "type_mismatch", {
      actual: facts.type,
      declared: declared["content-type"] ?? "?",
    });
  if (String(object.bytes.length) !== declared["size-bytes"])
    throw problem(c.locale, "unprocessable", "sizeBytes", "size_mismatch", {
      actual: object.bytes.length,
      declared: declared["size-bytes"] ?? "?",
    });
  if (createHash("sha256").update(object.bytes).digest("hex") !== declared.sha256)
    throw problem(c.locale, "unprocessable", "sha256", "checksum_mismatch");
  const [w, h] = [Number(declared.width), Number(declared.height)];
  // A device may report the size before or after applying the EXIF orientation: either is fine.
  if (!((w === facts.width && h === facts.height) || (w === facts.height && h === facts.width))) {
    throw problem(c.locale, "unprocessable", "width", "dimensions_mismatch", {
      actual: `${facts.width}×${facts.height}`,
      declared: `${w}×${h}`,
    });
  }

  const stored = await stripAndThumbnail(object.bytes, facts.type).catch((err: unknown) => {
    // The decoder's own limit (a header that lied) or a picture it cannot decode: the upload's fault, not ours.
    if (err instanceof PixelLimitError) throw tooManyPixels(c.locale, facts.width, facts.height);
    console.error("[photos] not decodable", id, err instanceof Error ? err.message : err);
    throw problem(c.locale, "unprocessable", "contentType", "not_image");
  });
  const key = photoKey(c.eventId, id);
  await writeObject(key, stored.full, facts.type);
  await writeObject(thumbKey(key), stored.thumb, "image/jpeg");
  const created = await insertPhoto({
    id,
    sightingId: sighting.id,
    eventId: c.eventId,
    storageKey: key,
    contentType: facts.type,
    sizeBytes: stored.full.length,
    sha256: createHash("sha256").update(stored.full).digest("hex"),
    width: stored.width,
    height: stored.height,
  });
  await deleteObject(incomingKey(c.eventId, id)).catch((err: Error) =>
    console.error("[photos] incoming object not removed", id, err.message),
  );
  return { outcome: created ? "created" : "already_had", width: stored.width, height: stored.height };
}

/** sharp refused a picture larger than the pixel limit. */
export class PixelLimitError extends Error {}

/**
 * The picture as stored: turned upright, re-encoded in its own format without any metadata
 * (sharp drops EXIF, including GPS position, ICC and XMP unless asked to keep them), and a
 * JPEG thumbnail for the review desk.
 */
export async function stripAndThumbnail(bytes: Buffer, type: PhotoType, maxPixels = MAX_PHOTO_PIXELS) {
  // limitInputPixels: sharp refuses, by the dimensions it decodes, anything larger than our limit.
  const upright = sharp(bytes, { failOn: "error", limitInputPixels: maxPixels }).rotate();
  const encoded =
    type === "image/png"
      ? upright.png()
      : type === "image/webp"
        ? upright.webp({ quality: 90 })
        : upright.jpeg({ quality: 90 });
  const { data: full, info } = await encoded.toBuffer({ resolveWithObject: true }).catch((err: unknown) => {
    throw err instanceof Error && /pixel limit/i.test(err.message) ? new PixelLimitError(err.message) : err;
  });
  const thumb = await sharp(full)
    .resize({ width: THUMB_PX, height: THUMB_PX, fit: "inside", withoutEnlargement: true })
    .jpeg({ quality: 75 })
    .toBuffer();
  return { full, thumb, width: info.width, height: info.height };
}

/**
 * A short-lived link to a photo for someone allowed to see it: the sighting's author, or a
 * coordinator or organiser of the event (a coordinator limited to taxon groups sees those
 * groups only: never unidentified sightings, whose group is unknown, as on the review desk).
 */
export async function photoLink(
  c: Caller & { role: string; taxonGroups: string[] },
  photoId: string,
  size: "thumb" | "full",
): Promise<string> {
  const photo = isUuid(photoId) ? await findPhoto(photoId.toLowerCase()) : null;
  if (!photo || photo.sighting.eventId !== c.eventId) throw new ApiError("not_found");
  const own = photo.sighting.userId === c.userId;
  const reviewer =
    c.role !== "volunteer" &&
    (c.taxonGroups.length === 0 ||
      (photo.sighting.taxonGroup !== null && c.taxonGroups.includes(photo.sighting.taxonGroup)));
  if (!own && !reviewer) throw new ApiError("forbidden");
  return presignGet(size === "thumb" ? thumbKey(photo.storageKey) : photo.storageKey);
}
