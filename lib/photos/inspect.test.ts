import sharp from "sharp";
import { describe, expect, it } from "vitest";
import { inspectPhoto, sniffType } from "./inspect";

const picture = (format: "jpeg" | "png" | "webp", width = 30, height = 20) =>
  sharp({ create: { width, height, channels: 3, background: { r: 40, g: 90, b: 50 } } })
    .toFormat(format)
    .toBuffer();

describe("inspectPhoto", () => {
  it("reads the type and size of JPEG, PNG and WebP pictures from their bytes", async () => {
    expect(inspectPhoto(await picture("jpeg"))).toEqual({ type: "image/jpeg", width: 30, height: 20 });
    expect(inspectPhoto(await picture("png", 7, 9))).toEqual({ type: "image/png", width: 7, height: 9 });
    expect(inspectPhoto(await picture("webp"))).toEqual({ type: "image/webp", width: 30, height: 20 });
  });

  it("refuses what is not a picture, whatever it claims to be", async () => {
    expect(inspectPhoto(new TextEncoder().encode("<html>not a photo</html>"))).toBeNull();
    expect(sniffType(new Uint8Array([0x47, 0x49, 0x46, 0x38, 0x39, 0x61]))).toBeNull(); // GIF
    // A JPEG signature followed by rubbish is not a readable picture either.
    expect(inspectPhoto(new Uint8Array([0xff, 0xd8, 0xff, 0x00, 0x01, 0x02]))).toBeNull();
  });

  it("reports the size as seen when EXIF turns the picture a quarter", async () => {
    const turned = await sharp(await picture("jpeg", 30, 20))
      .withMetadata({ orientation: 6 })
      .jpeg()
      .toBuffer();
    expect(inspectPhoto(turned)).toEqual({ type: "image/jpeg", width: 20, height: 30 });
  });
});
