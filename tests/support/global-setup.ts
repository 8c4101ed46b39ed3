import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { startS3Fake } from "@/server/storage/s3-fake";
import { recreateDatabase } from "./test-db";
import type { TestProject } from "vitest/node";

// Vitest "integration" project: one fresh database per run (ecotone_test by default), and
// the S3 fake (s3rver) on loopback with an empty photo bucket in a temporary folder.
// Reads the URLs vitest.config.mts set for this project, before lib/env caches anything.
export default async function setup(project: TestProject) {
  const env = project.config.env as Record<string, string>;
  await recreateDatabase(env.DATABASE_OWNER_URL!);
  const directory = mkdtempSync(join(tmpdir(), "ecotone-s3-"));
  const s3 = await startS3Fake({
    port: Number(new URL(env.S3_ENDPOINT!).port),
    directory,
    bucket: env.S3_BUCKET!,
    appUrls: [env.APP_URL!],
  });
  return async () => {
    await s3.close();
    rmSync(directory, { recursive: true, force: true });
  };
}
