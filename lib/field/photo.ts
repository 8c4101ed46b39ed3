// Photos are made smaller on the device before they are kept and sent: a long side of at
// most 1600 px as JPEG (re-encoding through a canvas also drops the camera's location
// metadata). The server checks type and size again and strips metadata itself.
export const MAX_SIDE_PX = 1600;

export type PreparedPhoto = {
  id: string;
  blob: Blob;
  contentType: "image/jpeg" | "image/png" | "image/webp";
  sizeBytes: number;
  sha256: string;
  width: number;
  height: number;
};

export async function sha256Hex(blob: Blob): Promise<string> {
  const digest = await crypto.subtle.digest("SHA-256", await blob.arrayBuffer());
  return [...new Uint8Array(digest)].map((b) => b.toString(16).padStart(2, "0")).join("");
}

export async function preparePhoto(file: File | Blob): Promise<PreparedPhoto> {
  const bitmap = await createImageBitmap(file, { imageOrientation: "from-image" });
  const scale = Math.min(1, MAX_SIDE_PX / Math.max(bitmap.width, bitmap.height));
  const width = Math.max(1, Math.round(bitmap.width * scale));
  const height = Math.max(1, Math.round(bitmap.height * scale));
  const canvas = document.createElement("canvas");
  canvas.width = width;
  canvas.height = height;
  const ctx = canvas.getContext("2d");
  if (!ctx) throw new Error("no_canvas");
  ctx.drawImage(bitmap, 0, 0, width, height);
  bitmap.close();
  const blob = await new Promise<Blob>((resolve, reject) =>
    canvas.toBlob((b) => (b ? resolve(b) : reject(new Error("encode_failed"))), "image/jpeg", 0.82),
  );
  return {
    id: crypto.randomUUID(),
    blob,
    contentType: "image/jpeg",
    sizeBytes: blob.size,
    sha256: await sha256Hex(blob),
    width,
    height,
  };
}
