// Runs the local S3 fake (s3rver) in the foreground on 127.0.0.1, with the photo bucket and
// its CORS rule for the app's origin. Used by scripts/start.sh and the browser tests.
//   S3_FAKE_PORT (default 9000), S3_FAKE_DIR (default .data/s3), S3_BUCKET, APP_URL
import { mkdirSync } from "node:fs";
import { startS3Fake } from "../server/storage/s3-fake";

const port = Number(process.env.S3_FAKE_PORT ?? 9000);
const directory = process.env.S3_FAKE_DIR ?? ".data/s3";
const bucket = process.env.S3_BUCKET ?? "ecotone-photos";
const appUrls = (process.env.APP_URL ?? "http://localhost:3000").split(/[\s,]+/).filter(Boolean);
mkdirSync(directory, { recursive: true });
const server = await startS3Fake({ port, directory, bucket, appUrls });
console.log(`[s3-fake] S3 API on http://127.0.0.1:${port}, bucket "${bucket}", files in ${directory}`);
const stop = () => void server.close().then(() => process.exit(0));
process.on("SIGINT", stop);
process.on("SIGTERM", stop);
