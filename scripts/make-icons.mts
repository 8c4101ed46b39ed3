// Draws the app's PNG icons from our own SVGs (public/icons/*.svg) with sharp. The PNGs
// are committed; run this again after changing an SVG: `npx tsx scripts/make-icons.mts`.
import path from "node:path";
import sharp from "sharp";

const dir = path.join(process.cwd(), "public/icons");
const jobs: [string, string, number][] = [
  ["icon.svg", "icon-192.png", 192],
  ["icon.svg", "icon-512.png", 512],
  ["icon-maskable.svg", "icon-maskable-512.png", 512],
  ["icon.svg", "apple-touch-icon.png", 180],
];
for (const [src, out, size] of jobs) {
  await sharp(path.join(dir, src), { density: 300 })
    .resize(size, size)
    .png({ compressionLevel: 9 })
    .toFile(path.join(dir, out));
  console.log(`public/icons/${out} (${size}×${size})`);
}
