import { fileURLToPath } from "node:url";
import { defineConfig } from "vitest/config";

// Unit tests sit beside the code (*.test.ts); integration tests (real PostgreSQL) in tests/integration.
export default defineConfig({
  resolve: { alias: { "@": fileURLToPath(new URL("./", import.meta.url)), "server-only": fileURLToPath(new URL("./tests/support/server-only.ts", import.meta.url)) } },
  test: {
    include: ["lib/**/*.test.ts", "db/**/*.test.ts", "tests/unit/**/*.test.ts", "tests/integration/**/*.test.ts"],
    globalSetup: ["./tests/support/global-setup.ts"],
    testTimeout: 30_000,
    hookTimeout: 60_000,
    fileParallelism: false,
  },
});
