import "server-only";
import {
  DeleteObjectCommand,
  GetObjectCommand,
  HeadBucketCommand,
  NoSuchKey,
  PutObjectCommand,
  S3Client,
  S3ServiceException,
} from "@aws-sdk/client-s3";
import { getSignedUrl } from "@aws-sdk/s3-request-presigner";
import { env } from "@/lib/env";

// The photo store through the S3 API. Endpoint, bucket and keys come from lib/env.ts, so a
// real S3-compatible store is a configuration change. Two clients: one the server uses,
// one whose endpoint browsers can reach, for presigned URLs.
const globalForS3 = globalThis as unknown as { ecotoneS3?: { server: S3Client; public: S3Client } };

function client(endpoint: string): S3Client {
  const e = env();
  return new S3Client({
    region: e.S3_REGION,
    endpoint,
    forcePathStyle: e.S3_FORCE_PATH_STYLE,
    credentials: { accessKeyId: e.S3_ACCESS_KEY_ID, secretAccessKey: e.S3_SECRET_ACCESS_KEY },
    // Without these the SDK signs a checksum of an empty body into presigned PUT URLs.
    requestChecksumCalculation: "WHEN_REQUIRED",
    responseChecksumValidation: "WHEN_REQUIRED",
  });
}

function clients() {
  if (!globalForS3.ecotoneS3) {
    const e = env();
    globalForS3.ecotoneS3 = { server: client(e.S3_ENDPOINT), public: client(e.S3_PUBLIC_ENDPOINT ?? e.S3_ENDPOINT) };
  }
  return globalForS3.ecotoneS3;
}

/**
 * A presigned PUT for one object. The headers (type and x-amz-meta-*) are signed, so the
 * uploader must send exactly these; they carry what the device declared, for the check on confirm.
 */
export async function presignPut(key: string, contentType: string, meta: Record<string, string>, expiresIn = 15 * 60) {
  const command = new PutObjectCommand({ Bucket: env().S3_BUCKET, Key: key, ContentType: contentType, Metadata: meta });
  const headers: Record<string, string> = { "Content-Type": contentType };
  for (const [k, v] of Object.entries(meta)) headers[`x-amz-meta-${k}`] = v;
  const uploadUrl = await getSignedUrl(clients().public, command, {
    expiresIn,
    unhoistableHeaders: new Set(Object.keys(headers).map((h) => h.toLowerCase())),
  });
  return { uploadUrl, headers, expiresAt: new Date(Date.now() + expiresIn * 1000).toISOString() };
}

export async function presignGet(key: string, expiresIn = 5 * 60): Promise<string> {
  return getSignedUrl(clients().public, new GetObjectCommand({ Bucket: env().S3_BUCKET, Key: key }), { expiresIn });
}

export type StoredObject = { bytes: Buffer; contentType: string | undefined; meta: Record<string, string> };

/** Reads an object back, refusing to read more than `maxBytes`; null when it does not exist. */
export async function readObject(key: string, maxBytes: number): Promise<StoredObject | "too_large" | null> {
  try {
    const out = await clients().server.send(new GetObjectCommand({ Bucket: env().S3_BUCKET, Key: key }));
    if ((out.ContentLength ?? 0) > maxBytes) {
      await out.Body?.transformToWebStream().cancel();
      return "too_large";
    }
    const bytes = Buffer.from(await out.Body!.transformToByteArray());
    if (bytes.length > maxBytes) return "too_large";
    return { bytes, contentType: out.ContentType, meta: out.Metadata ?? {} };
  } catch (err) {
    if (err instanceof NoSuchKey || (err instanceof S3ServiceException && err.$metadata.httpStatusCode === 404))
      return null;
    throw err;
  }
}

export async function writeObject(key: string, bytes: Buffer, contentType: string): Promise<void> {
  await clients().server.send(
    new PutObjectCommand({ Bucket: env().S3_BUCKET, Key: key, Body: bytes, ContentType: contentType }),
  );
}

export async function deleteObject(key: string): Promise<void> {
  await clients().server.send(new DeleteObjectCommand({ Bucket: env().S3_BUCKET, Key: key }));
}

/** Whether the photo store answers for its bucket (the admin console's health view). */
export async function bucketReachable(timeoutMs = 3000): Promise<boolean> {
  try {
    await clients().server.send(new HeadBucketCommand({ Bucket: env().S3_BUCKET }), {
      abortSignal: AbortSignal.timeout(timeoutMs),
    });
    return true;
  } catch {
    return false;
  }
}
