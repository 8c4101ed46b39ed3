import path from "node:path";
import { build } from "esbuild";
import { describe, expect, it } from "vitest";

// The service worker is bundled as scripts/build-sw.mjs bundles it. It sends the outbox and
// keeps pages and tiles; validation happens where a person saves (lib/field/save.ts), so the
// worker must not pull in the validation library or anything else large (issue 18: ≤ 100 KB;
// the bench prints the built file's size).
describe("the service worker bundle", () => {
  it("holds no validation library and no server code", async () => {
    const root = path.resolve(__dirname, "../..");
    const out = await build({
      entryPoints: [path.join(root, "lib/field/sw.ts")],
      bundle: true,
      format: "iife",
      target: "es2020",
      minify: true,
      write: false,
      metafile: true,
      tsconfig: path.join(root, "tsconfig.json"),
      define: { "process.env.NODE_ENV": '"production"' },
      logLevel: "silent",
    });
    const inputs = Object.keys(out.metafile.inputs);
    expect(inputs.filter((f) => /node_modules\/zod\//.test(f))).toEqual([]);
    expect(inputs.filter((f) => /^(server|db|app)\//.test(f))).toEqual([]);
    expect(inputs.filter((f) => f.startsWith("lib/sync/records"))).toEqual([]);
  });
});
