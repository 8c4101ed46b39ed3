import type { AddressInfo } from "node:net";
import type { Server } from "node:http";
import sharp from "sharp";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startTileFake } from "@/server/tiles/fake";
import { tileSvg } from "@/server/tiles/render";
import { pixelInTile, tileAt } from "@/lib/geo/tiles";

// The local tile fake as a browser meets it: real HTTP on loopback, real PNGs (sharp).
let server: Server;
let base = "";
beforeAll(async () => {
  server = await startTileFake({ port: 0 });
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
});
afterAll(() => new Promise<void>((done) => server.close(() => done())));

describe("tile fake", () => {
  it("serves a 256 px PNG any page may read, and the same bytes again from memory", async () => {
    const t = tileAt(-1.8095, 52.102, 16); // the demo's millpond
    const res = await fetch(`${base}/tiles/${t.z}/${t.x}/${t.y}.png`);
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("image/png");
    expect(res.headers.get("access-control-allow-origin")).toBe("*");
    const body = Buffer.from(await res.arrayBuffer());
    const meta = await sharp(body).metadata();
    expect([meta.format, meta.width, meta.height]).toEqual(["png", 256, 256]);
    // The millpond's water colour is under the millpond's pixel.
    const [x, y] = pixelInTile(-1.8095, 52.102, t).map(Math.floor) as [number, number];
    const { data, info } = await sharp(body).removeAlpha().raw().toBuffer({ resolveWithObject: true });
    const i = (y * info.width + x) * info.channels;
    expect([data[i], data[i + 1], data[i + 2]]).toEqual([0xa9, 0xcb, 0xe0]);
    const again = Buffer.from(await (await fetch(`${base}/tiles/${t.z}/${t.x}/${t.y}.png`)).arrayBuffer());
    expect(again.equals(body)).toBe(true);
  });

  it("draws the landscape's features where the tile math puts them, and plain land far away", () => {
    const here = tileSvg(tileAt(-1.81, 52.105, 14));
    expect(here).toContain('fill="#a9cbe0"'); // water
    expect(here).toContain('fill="#b9d3a8"'); // wood
    expect(here).toContain('stroke="#9a6b3f"'); // a path
    const far = tileSvg(tileAt(10, 45, 14));
    expect(far).not.toContain("<path");
  });

  it("answers 404 for tiles outside the world or other paths, 405 for writes", async () => {
    expect((await fetch(`${base}/tiles/2/4/0.png`)).status).toBe(404);
    expect((await fetch(`${base}/tiles/2/1/1.jpg`)).status).toBe(404);
    expect((await fetch(`${base}/tiles/2/1/1.png`, { method: "POST" })).status).toBe(405);
    expect((await fetch(`${base}/`)).status).toBe(200);
  });
});
