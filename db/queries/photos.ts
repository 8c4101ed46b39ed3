import "server-only";
import { and, eq } from "drizzle-orm";
import type { TaxonGroup } from "@/lib/domain";
import { getDb } from "../client";
import { photos, sightings, taxa } from "../schema";
import { refreshCheckMarks } from "./check-marks";

// Photos of sightings: the rows the photo handlers read and write. The pictures themselves
// live in the S3 photo store (server/storage/s3.ts), under photos.storage_key.

export type PhotoSighting = Pick<typeof sightings.$inferSelect, "id" | "userId" | "eventId"> & {
  taxonGroup: TaxonGroup | null;
};

/** The sighting a photo belongs to, if it is at this event. */
export async function sightingForPhotos(sightingId: string, eventId: string): Promise<PhotoSighting | null> {
  const [row] = await getDb()
    .select({ id: sightings.id, userId: sightings.userId, eventId: sightings.eventId, taxonGroup: taxa.taxonGroup })
    .from(sightings)
    .leftJoin(taxa, eq(taxa.id, sightings.taxonId))
    .where(and(eq(sightings.id, sightingId), eq(sightings.eventId, eventId)))
    .limit(1);
  return row ?? null;
}

export type PhotoRow = typeof photos.$inferSelect & { sighting: PhotoSighting };

export async function findPhoto(photoId: string): Promise<PhotoRow | null> {
  const [row] = await getDb()
    .select({
      photo: photos,
      sighting: { id: sightings.id, userId: sightings.userId, eventId: sightings.eventId, taxonGroup: taxa.taxonGroup },
    })
    .from(photos)
    .innerJoin(sightings, and(eq(sightings.eventId, photos.eventId), eq(sightings.id, photos.sightingId)))
    .leftJoin(taxa, eq(taxa.id, sightings.taxonId))
    .where(eq(photos.id, photoId))
    .limit(1);
  return row ? { ...row.photo, sighting: row.sighting } : null;
}

/** Inserts the photo row (and refreshes the sighting's check marks: "photo missing"); false when a row with this id already existed. */
export async function insertPhoto(row: typeof photos.$inferInsert): Promise<boolean> {
  return getDb().transaction(async (tx) => {
    const inserted = await tx
      .insert(photos)
      .values(row)
      .onConflictDoNothing({ target: photos.id })
      .returning({ id: photos.id });
    if (inserted.length) await refreshCheckMarks(tx, [row.sightingId], row.eventId);
    return inserted.length === 1;
  });
}
