import { HeadObjectCommand, S3Client } from "@aws-sdk/client-s3";
import { expect } from "@playwright/test";

/**
 * Every stored photo row has its bytes in the photo store (the S3 fake on loopback, reached
 * through the usual SDK): one HEAD per object, its size as recorded.
 */
export async function expectPhotosInStore(
  rows: readonly { storage_key: string; size_bytes: number }[],
  store: { port: number; bucket: string },
): Promise<void> {
  const s3 = new S3Client({
    endpoint: `http://127.0.0.1:${store.port}`,
    region: "us-east-1",
    forcePathStyle: true,
    credentials: { accessKeyId: "S3RVER", secretAccessKey: "S3RVER" },
  });
  for (const p of rows) {
    const head = await s3.send(new HeadObjectCommand({ Bucket: store.bucket, Key: p.storage_key }));
    expect(head.ContentLength, p.storage_key).toBe(p.size_bytes);
  }
}
