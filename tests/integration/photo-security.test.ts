import { createHash } from "node:crypto";
import { crc32, deflateSync } from "node:zlib";
import sharp from "sharp";
import { beforeAll, describe, expect, it } from "vitest";
import * as s from "@/db/schema";
import { MAX_PHOTO_PIXELS } from "@/lib/photos/inspect";
import {
  confirmPhoto,
  PixelLimitError,
  photoLink,
  requestPhotoUpload,
  stripAndThumbnail,
} from "@/server/photos/upload";
import { db, makeFixture, sightingValues } from "./helpers";

// Issue 13: decompression bombs at photo confirm, and a group-limited coordinator asking for
// the photo of an unidentified sighting. Real PostgreSQL and the S3 fake of the test setup.
type Fixture = Awaited<ReturnType<typeof makeFixture>>;
let f: Fixture;
let sightingId: string;
let unidentifiedId: string;
let coordinator: typeof s.users.$inferSelect;
const sha = (b: Uint8Array) => createHash("sha256").update(b).digest("hex");
const me = () => ({ userId: f.user.id, eventId: f.event.id, locale: "en" as const });

function pngChunk(type: string, data: Buffer) {
  const len = Buffer.alloc(4);
  len.writeUInt32BE(data.length);
  const body = Buffer.concat([Buffer.from(type, "ascii"), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(body) >>> 0);
  return Buffer.concat([len, body, crc]);
}

/** A few hundred bytes of PNG whose header claims width × height (PNG specification, section 11.2.2). */
function bombPng(width: number, height: number) {
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(width, 0);
  ihdr.writeUInt32BE(height, 4);
  ihdr[8] = 8; // bit depth
  ihdr[9] = 2; // truecolour
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    pngChunk("IHDR", ihdr),
    pngChunk("IDAT", deflateSync(Buffer.alloc(2000))),
    pngChunk("IEND", Buffer.alloc(0)),
  ]);
}

/** A JPEG of a few dozen bytes: SOI, JFIF APP0, a baseline SOF0 claiming height × width, EOI (ITU-T T.81, annex B). */
function bombJpeg(width: number, height: number) {
  const hi = (n: number) => (n >> 8) & 0xff;
  return Buffer.from([
    0xff,
    0xd8,
    0xff,
    0xe0,
    0x00,
    0x10,
    0x4a,
    0x46,
    0x49,
    0x46,
    0x00,
    0x01,
    0x01,
    0x00,
    0x00,
    0x01,
    0x00,
    0x01,
    0x00,
    0x00,
    0xff,
    0xc0,
    0x00,
    0x11,
    0x08,
    hi(height),
    height & 0xff,
    hi(width),
    width & 0xff,
    0x03,
    0x01,
    0x22,
    0x00,
    0x02,
    0x11,
    0x01,
    0x03,
    0x11,
    0x01,
    0xff,
    0xd9,
  ]);
}

async function uploadAs(bytes: Uint8Array, contentType: "image/png" | "image/jpeg", width: number, height: number) {
  const declared = {
    id: crypto.randomUUID(),
    sightingId,
    contentType,
    sizeBytes: bytes.length,
    sha256: sha(bytes),
    width,
    height,
  };
  const answer = await requestPhotoUpload(me(), declared);
  if (answer.outcome !== "upload") throw new Error("expected an upload URL");
  const put = await fetch(answer.uploadUrl, { method: "PUT", headers: answer.headers, body: new Uint8Array(bytes) });
  expect(put.status).toBe(200);
  return declared;
}

beforeAll(async () => {
  f = await makeFixture("photosec");
  [coordinator] = (await db().insert(s.users).values({ email: "photosec-birds@example.org" }).returning()) as [
    typeof s.users.$inferSelect,
  ];
  await db()
    .insert(s.eventMembers)
    .values([
      { eventId: f.event.id, userId: f.user.id, role: "volunteer" },
      { eventId: f.event.id, userId: coordinator.id, role: "coordinator", taxonGroups: ["birds"] },
    ]);
  const [row] = await db().insert(s.sightings).values(sightingValues(f)).returning();
  sightingId = row!.id;
  const [unidentified] = await db()
    .insert(s.sightings)
    .values(sightingValues(f, { taxonId: null, description: "small brown bird, no call" }))
    .returning();
  unidentifiedId = unidentified!.id;
});

describe("decompression bombs", () => {
  it("a device that announces 50,000 × 50,000 pixels is refused with a 422 before any upload", async () => {
    const bytes = bombPng(50_000, 50_000);
    await expect(
      requestPhotoUpload(me(), {
        id: crypto.randomUUID(),
        sightingId,
        contentType: "image/png",
        sizeBytes: bytes.length,
        sha256: sha(bytes),
        width: 50_000,
        height: 50_000,
      }),
    ).rejects.toMatchObject({
      code: "unprocessable",
      fields: [{ field: "width", message: expect.stringMatching(/50000×50000 pixels; at most 40 megapixels/) }],
    });
  });

  for (const [kind, make] of [
    ["PNG", bombPng],
    ["JPEG", bombJpeg],
  ] as const) {
    it(`a ${kind} whose header claims 50,000 × 50,000 pixels (announced as small) is refused at confirm with a 422, not a 500`, async () => {
      const bytes = make(50_000, 50_000);
      const declared = await uploadAs(bytes, kind === "PNG" ? "image/png" : "image/jpeg", 64, 48);
      await expect(confirmPhoto({ ...me(), locale: "es" }, declared.id)).rejects.toMatchObject({
        code: "unprocessable",
        fields: [{ field: "width", message: expect.stringMatching(/^La imagen mide 50000×50000 píxeles/) }],
      });
      const rows = await db().select().from(s.photos);
      expect(rows.some((r) => r.id === declared.id)).toBe(false);
    });
  }

  it("the decoder itself refuses more pixels than the limit (a header that lied), as its own error", async () => {
    const small = await sharp({ create: { width: 64, height: 48, channels: 3, background: { r: 1, g: 2, b: 3 } } })
      .jpeg()
      .toBuffer();
    await expect(stripAndThumbnail(small, "image/jpeg", 64 * 48 - 1)).rejects.toBeInstanceOf(PixelLimitError);
    expect((await stripAndThumbnail(small, "image/jpeg")).width).toBe(64);
    expect(MAX_PHOTO_PIXELS).toBe(40_000_000);
  });
});

describe("photos of unidentified sightings", () => {
  it("are not shown to a coordinator limited to taxon groups; the author still sees them", async () => {
    const bytes = await sharp({ create: { width: 64, height: 48, channels: 3, background: { r: 60, g: 110, b: 70 } } })
      .jpeg()
      .toBuffer();
    const declared = {
      id: crypto.randomUUID(),
      sightingId: unidentifiedId,
      contentType: "image/jpeg" as const,
      sizeBytes: bytes.length,
      sha256: sha(bytes),
      width: 64,
      height: 48,
    };
    const answer = await requestPhotoUpload(me(), declared);
    if (answer.outcome !== "upload") throw new Error("expected an upload URL");
    await fetch(answer.uploadUrl, { method: "PUT", headers: answer.headers, body: new Uint8Array(bytes) });
    expect(await confirmPhoto(me(), declared.id)).toMatchObject({ outcome: "created" });

    const birds = {
      userId: coordinator.id,
      eventId: f.event.id,
      locale: "en" as const,
      role: "coordinator",
      taxonGroups: ["birds"],
    };
    await expect(photoLink(birds, declared.id, "thumb")).rejects.toMatchObject({ code: "forbidden" });
    await expect(photoLink(birds, declared.id, "full")).rejects.toMatchObject({ code: "forbidden" });
    // A coordinator of every group, and the author, still get the link.
    expect(await photoLink({ ...birds, taxonGroups: [] }, declared.id, "thumb")).toMatch(/-thumb\.jpg\?/);
    expect(await photoLink({ ...me(), role: "volunteer", taxonGroups: [] }, declared.id, "full")).toMatch(/\?/);
  });
});
