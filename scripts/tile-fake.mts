// Runs the local tile fake in the foreground on 127.0.0.1: PNG tiles of the demo's invented
// landscape at /tiles/{z}/{x}/{y}.png. Used by scripts/start.sh and the browser tests.
//   TILE_FAKE_PORT (default 9200)
import { startTileFake } from "../server/tiles/fake";

const port = Number(process.env.TILE_FAKE_PORT ?? 9200);
const server = await startTileFake({ port });
console.log(`[tile-fake] map tiles on http://127.0.0.1:${port}/tiles/{z}/{x}/{y}.png`);
const stop = () => server.close(() => process.exit(0));
process.on("SIGINT", stop);
process.on("SIGTERM", stop);
