import { describe, expect, it } from "vitest";
import {
  isValidTile,
  pixelInTile,
  tileAt,
  tileBbox,
  tilesForBbox,
  tileUrl,
  worldPixel,
  worldPixelToLonLat,
} from "./tiles";

describe("tile math (Web Mercator, 256 px tiles)", () => {
  it("puts the origin of longitude and the equator at the middle of the world", () => {
    expect(worldPixel(0, 0, 0)).toEqual([128, 128]);
    expect(tileAt(0, 0, 1)).toEqual({ z: 1, x: 1, y: 1 });
    expect(tileAt(-0.0001, 0.0001, 1)).toEqual({ z: 1, x: 0, y: 0 });
  });

  it("finds the tile of a known place (Greenwich at zoom 10 is 511/340, from memory of the common scheme)", () => {
    expect(tileAt(-0.0015, 51.4779, 10)).toEqual({ z: 10, x: 511, y: 340 });
    expect(tileAt(0.0015, 51.4779, 10)).toEqual({ z: 10, x: 512, y: 340 });
  });

  it("gives tile edges that contain the position it came from and round-trips pixels", () => {
    const t = tileAt(-1.81, 52.105, 15);
    const [w, s, e, n] = tileBbox(t);
    expect(w).toBeLessThanOrEqual(-1.81);
    expect(e).toBeGreaterThan(-1.81);
    expect(s).toBeLessThanOrEqual(52.105);
    expect(n).toBeGreaterThan(52.105);
    const [x, y] = pixelInTile(-1.81, 52.105, t);
    expect(x).toBeGreaterThanOrEqual(0);
    expect(x).toBeLessThan(256);
    expect(y).toBeGreaterThanOrEqual(0);
    expect(y).toBeLessThan(256);
    const [px, py] = worldPixel(-1.81, 52.105, 15);
    const [lon, lat] = worldPixelToLonLat(px, py, 15);
    expect(lon).toBeCloseTo(-1.81, 9);
    expect(lat).toBeCloseTo(52.105, 9);
    // the north-west corner of a tile is pixel (0, 0) of that tile
    expect(pixelInTile(w, n, t).map((v) => Math.round(v * 1e6) / 1e6)).toEqual([0, 0]);
  });

  it("covers a box with every tile between its corners, zoom by zoom", () => {
    const box: [number, number, number, number] = [-1.82, 52.1, -1.8, 52.1102];
    const tiles = tilesForBbox(box, 13, 15);
    expect(tiles.every((t) => t.z >= 13 && t.z <= 15)).toBe(true);
    for (const z of [13, 14, 15]) {
      const nw = tileAt(-1.82, 52.1102, z);
      const se = tileAt(-1.8, 52.1, z);
      const atZ = tiles.filter((t) => t.z === z);
      expect(atZ).toHaveLength((se.x - nw.x + 1) * (se.y - nw.y + 1));
      expect(atZ).toContainEqual(nw);
      expect(atZ).toContainEqual(se);
    }
    // no duplicates
    expect(new Set(tiles.map((t) => `${t.z}/${t.x}/${t.y}`)).size).toBe(tiles.length);
    // each zoom level has at least as many tiles as the one before
    const count = (z: number) => tiles.filter((t) => t.z === z).length;
    expect(count(15)).toBeGreaterThanOrEqual(count(14));
  });

  it("refuses tiles outside the world and fills an address template", () => {
    expect(isValidTile({ z: 2, x: 3, y: 3 })).toBe(true);
    expect(isValidTile({ z: 2, x: 4, y: 0 })).toBe(false);
    expect(isValidTile({ z: -1, x: 0, y: 0 })).toBe(false);
    expect(isValidTile({ z: 1.5, x: 0, y: 0 })).toBe(false);
    expect(tileUrl("http://127.0.0.1:9200/tiles/{z}/{x}/{y}.png", { z: 14, x: 8110, y: 5420 })).toBe(
      "http://127.0.0.1:9200/tiles/14/8110/5420.png",
    );
  });
});
