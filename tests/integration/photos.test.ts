import { createHash } from "node:crypto";
import { eq } from "drizzle-orm";
import sharp from "sharp";
import { beforeAll, describe, expect, it } from "vitest";
import * as s from "@/db/schema";
import { confirmPhoto, photoLink, requestPhotoUpload } from "@/server/photos/upload";
import { db, makeFixture, sightingValues } from "./helpers";

// Photos through the real S3 protocol against the S3 fake that the test setup started:
// presigned PUT from "the device" (plain fetch), then the server's checks on confirm.
type Fixture = Awaited<ReturnType<typeof makeFixture>>;
let f: Fixture;
let sightingId: string;
let other: typeof s.users.$inferSelect;
const sha = (b: Uint8Array) => createHash("sha256").update(b).digest("hex");
const me = () => ({ userId: f.user.id, eventId: f.event.id, locale: "en" as const });

async function photoWithGps(width = 64, height = 48) {
  return sharp({ create: { width, height, channels: 3, background: { r: 60, g: 110, b: 70 } } })
    .withExif({
      IFD0: { Make: "FieldPhone" },
      IFD3: { GPSLatitudeRef: "N", GPSLatitude: "51/1 30/1 0/1", GPSLongitudeRef: "W", GPSLongitude: "0/1 7/1 0/1" },
    })
    .jpeg()
    .toBuffer();
}

async function upload(bytes: Uint8Array, over: Record<string, unknown> = {}) {
  const declared = {
    id: crypto.randomUUID(),
    sightingId,
    contentType: "image/jpeg" as const,
    sizeBytes: bytes.length,
    sha256: sha(bytes),
    width: 64,
    height: 48,
    ...over,
  };
  const answer = await requestPhotoUpload(me(), declared);
  if (answer.outcome !== "upload") throw new Error("expected an upload URL");
  const put = await fetch(answer.uploadUrl, { method: "PUT", headers: answer.headers, body: new Uint8Array(bytes) });
  expect(put.status).toBe(200);
  return { declared, answer };
}

beforeAll(async () => {
  f = await makeFixture("photos");
  [other] = (await db().insert(s.users).values({ email: "photos-other@example.org" }).returning()) as [
    typeof s.users.$inferSelect,
  ];
  await db()
    .insert(s.eventMembers)
    .values([
      { eventId: f.event.id, userId: f.user.id, role: "volunteer" },
      { eventId: f.event.id, userId: other.id, role: "volunteer" },
    ]);
  const [row] = await db().insert(s.sightings).values(sightingValues(f)).returning();
  sightingId = row!.id;
});

describe("a sighting's photo", () => {
  it("goes presign → PUT → confirm, arrives without its location metadata, with a thumbnail, once", async () => {
    const bytes = await photoWithGps();
    expect((await sharp(bytes).metadata()).exif).toBeDefined();
    const { declared, answer } = await upload(bytes);
    expect(answer.uploadUrl).toMatch(/^http:\/\/127\.0\.0\.1:\d+\/ecotone-photos-test\/incoming\//);

    expect(await confirmPhoto(me(), declared.id)).toMatchObject({ outcome: "created", width: 64, height: 48 });
    const [row] = await db().select().from(s.photos).where(eq(s.photos.id, declared.id));
    expect(row).toMatchObject({ sightingId, contentType: "image/jpeg", width: 64, height: 48 });
    // The sighting's check marks follow: an off-list record with a photo is no longer "photo missing".
    const [sighting] = await db()
      .select({ marks: s.sightings.checkMarks })
      .from(s.sightings)
      .where(eq(s.sightings.id, sightingId));
    expect(sighting!.marks).toEqual(["not_on_list"]);

    // What is stored is read back through a presigned GET, as the review desk will.
    const full = Buffer.from(
      await (
        await fetch(await photoLink({ ...me(), role: "volunteer", taxonGroups: [] }, declared.id, "full"))
      ).arrayBuffer(),
    );
    expect(sha(full)).toBe(row!.sha256);
    const meta = await sharp(full).metadata();
    expect(meta.exif).toBeUndefined();
    expect([meta.width, meta.height]).toEqual([64, 48]);
    const thumb = await fetch(await photoLink({ ...me(), role: "volunteer", taxonGroups: [] }, declared.id, "thumb"));
    expect(thumb.status).toBe(200);
    expect((await sharp(Buffer.from(await thumb.arrayBuffer())).metadata()).format).toBe("jpeg");

    // Sent again after a lost answer: nothing new.
    expect(await confirmPhoto(me(), declared.id)).toEqual({ outcome: "already_had" });
    expect(await requestPhotoUpload(me(), declared)).toEqual({ outcome: "already_had" });
    expect(await db().select().from(s.photos).where(eq(s.photos.sightingId, sightingId))).toHaveLength(1);
  });

  it("is refused when its bytes are not a picture, whatever type was declared", async () => {
    const notImage = new TextEncoder().encode("<html><body>definitely not a photo</body></html>");
    const { declared } = await upload(notImage);
    await expect(confirmPhoto(me(), declared.id)).rejects.toMatchObject({
      code: "unprocessable",
      fields: [{ field: "contentType", message: "This file is not a JPEG, PNG or WebP picture." }],
    });
    expect(await db().select().from(s.photos).where(eq(s.photos.id, declared.id))).toHaveLength(0);
  });

  it("is refused when the bytes that arrived are not the ones declared (checksum, type, pixel size)", async () => {
    const bytes = await photoWithGps();
    const wrongSum = await upload(bytes, { sha256: "0".repeat(64) });
    await expect(confirmPhoto({ ...me(), locale: "fr" }, wrongSum.declared.id)).rejects.toMatchObject({
      fields: [{ field: "sha256", message: expect.stringMatching(/somme de contrôle/) }],
    });
    const wrongType = await upload(bytes, { contentType: "image/png" });
    await expect(confirmPhoto(me(), wrongType.declared.id)).rejects.toMatchObject({
      fields: [{ field: "contentType" }],
    });
    const wrongSize = await upload(bytes, { width: 640, height: 480 });
    await expect(confirmPhoto(me(), wrongSize.declared.id)).rejects.toMatchObject({ fields: [{ field: "width" }] });
  });

  it("can be confirmed only once uploaded, only for one's own sighting, and is seen only by its author and reviewers", async () => {
    await expect(confirmPhoto(me(), crypto.randomUUID())).rejects.toMatchObject({ fields: [{ field: "id" }] });
    const bytes = await photoWithGps();
    await expect(
      requestPhotoUpload(
        { ...me(), userId: other.id },
        {
          id: crypto.randomUUID(),
          sightingId,
          contentType: "image/jpeg",
          sizeBytes: bytes.length,
          sha256: sha(bytes),
          width: 64,
          height: 48,
        },
      ),
    ).rejects.toMatchObject({ code: "unprocessable", fields: [{ field: "sightingId" }] });
    await expect(
      requestPhotoUpload(me(), {
        id: crypto.randomUUID(),
        sightingId,
        contentType: "image/jpeg",
        sizeBytes: 30_000_000,
        sha256: sha(bytes),
        width: 64,
        height: 48,
      }),
    ).rejects.toMatchObject({ fields: [{ field: "sizeBytes" }] });

    const { declared } = await upload(bytes);
    // Another volunteer cannot confirm (nor see) someone else's upload.
    await expect(confirmPhoto({ ...me(), userId: other.id }, declared.id)).rejects.toMatchObject({
      fields: [{ field: "id" }],
    });
    await confirmPhoto(me(), declared.id);
    await expect(confirmPhoto({ ...me(), userId: other.id }, declared.id)).rejects.toMatchObject({ code: "conflict" });
    await expect(
      photoLink({ ...me(), userId: other.id, role: "volunteer", taxonGroups: [] }, declared.id, "thumb"),
    ).rejects.toMatchObject({ code: "forbidden" });
    await expect(
      photoLink({ ...me(), userId: other.id, role: "coordinator", taxonGroups: ["fungi"] }, declared.id, "thumb"),
    ).rejects.toMatchObject({ code: "forbidden" });
    expect(
      await photoLink({ ...me(), userId: other.id, role: "coordinator", taxonGroups: ["birds"] }, declared.id, "thumb"),
    ).toMatch(/-thumb\.jpg\?/);
  });
});
