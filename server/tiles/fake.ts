import { createServer, type Server } from "node:http";
import { renderTile } from "./render";

// The local tile fake: raster tiles of the demo's invented landscape on loopback, at
// /tiles/{z}/{x}/{y}.png, so the demo and the tests fetch nothing from outside. Any page may
// read them (CORS *), which lets the field log store them for offline use and count their size.

export const TILE_PATH = /^\/tiles\/(\d{1,2})\/(\d{1,7})\/(\d{1,7})\.png$/;

export function startTileFake({ port, host = "127.0.0.1" }: { port: number; host?: string }): Promise<Server> {
  const server = createServer((req, res) => {
    const url = new URL(req.url ?? "/", "http://tile-fake");
    const common = { "Access-Control-Allow-Origin": "*", "Cross-Origin-Resource-Policy": "cross-origin" };
    if (req.method !== "GET" && req.method !== "HEAD") {
      res.writeHead(405, common).end();
      return;
    }
    if (url.pathname === "/") {
      res.writeHead(200, { ...common, "Content-Type": "text/plain; charset=utf-8" }).end("tile fake\n");
      return;
    }
    const m = TILE_PATH.exec(url.pathname);
    const png = m ? renderTile({ z: Number(m[1]), x: Number(m[2]), y: Number(m[3]) }) : null;
    if (!png) {
      res.writeHead(404, { ...common, "Content-Type": "text/plain; charset=utf-8" }).end("no such tile\n");
      return;
    }
    png.then(
      (body) => {
        res.writeHead(200, {
          ...common,
          "Content-Type": "image/png",
          "Content-Length": String(body.length),
          "Cache-Control": "public, max-age=86400",
        });
        res.end(req.method === "HEAD" ? undefined : body);
      },
      () => res.writeHead(500, common).end(),
    );
  });
  return new Promise((resolve, reject) => {
    server.once("error", reject);
    server.listen(port, host, () => resolve(server));
  });
}
