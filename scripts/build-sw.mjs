// Builds the service worker at `next build` time (called from next.config.mjs through
// compiler.runAfterProductionCompile): esbuild bundles lib/field/sw.ts, then workbox-build
// injects the precache manifest (Next's hashed static files, our icons) and writes public/sw.js.
import { createHash } from "node:crypto";
import { readFileSync, rmSync } from "node:fs";
import path from "node:path";
import { build } from "esbuild";
import { injectManifest } from "workbox-build";

export async function buildServiceWorker({
  projectDir = process.cwd(),
  distDir = path.join(process.cwd(), ".next"),
} = {}) {
  const temp = path.join(distDir, "sw-bundle.js");
  await build({
    entryPoints: [path.join(projectDir, "lib/field/sw.ts")],
    bundle: true,
    format: "iife",
    target: "es2020",
    minify: true,
    outfile: temp,
    tsconfig: path.join(projectDir, "tsconfig.json"),
    define: { "process.env.NODE_ENV": '"production"' },
    logLevel: "warning",
  });
  const { count, size, warnings } = await injectManifest({
    swSrc: temp,
    swDest: path.join(projectDir, "public/sw.js"),
    globDirectory: distDir,
    globPatterns: ["static/**/*.{js,css,woff2}"],
    modifyURLPrefix: { "static/": "/_next/static/" },
    // Hashed file names carry their own version; icons are versioned by their content.
    dontCacheBustURLsMatching: /^\/_next\/static\//,
    additionalManifestEntries: ["icon.svg", "icon-192.png", "icon-512.png", "icon-maskable-512.png"].map((name) => ({
      url: `/icons/${name}`,
      revision: createHash("sha256")
        .update(readFileSync(path.join(projectDir, "public/icons", name)))
        .digest("hex")
        .slice(0, 16),
    })),
    maximumFileSizeToCacheInBytes: 5 * 1024 * 1024,
  });
  rmSync(temp, { force: true });
  for (const w of warnings) console.warn("[sw]", w);
  console.log(`[sw] public/sw.js precaches ${count} files (${Math.round(size / 1024)} KiB)`);
}
