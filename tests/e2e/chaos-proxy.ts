import net from "node:net";

// A TCP proxy in front of the app server that misbehaves on purpose, the way a phone's
// connection does in a wet field: it cuts a request half-way (the server never sees it
// whole), cuts the answer after the server has acted (the device never hears the ack), or
// holds the answer back past the device's patience. One request per connection (the
// devices send Connection: close), so each request meets its own fate.
export type Fate = "pass" | "cut-request" | "cut-response" | "delay";

export type ChaosProxy = {
  port: number;
  counts: Record<Fate, number>;
  close(): Promise<void>;
};

export async function startChaosProxy(opts: {
  listenPort: number;
  targetPort: number;
  fate: () => Fate;
  delayMs: number;
}): Promise<ChaosProxy> {
  const counts: Record<Fate, number> = { pass: 0, "cut-request": 0, "cut-response": 0, delay: 0 };
  const sockets = new Set<net.Socket>();
  const server = net.createServer((client) => {
    sockets.add(client);
    const fate = opts.fate();
    counts[fate] += 1;
    const upstream = net.connect(opts.targetPort, "127.0.0.1");
    sockets.add(upstream);
    const end = () => {
      client.destroy();
      upstream.destroy();
    };
    client.on("error", end);
    upstream.on("error", end);
    client.on("close", () => {
      sockets.delete(client);
      upstream.destroy();
    });
    upstream.on("close", () => {
      sockets.delete(upstream);
      client.end();
    });

    let sentUp = 0;
    client.on("data", (chunk: Buffer) => {
      if (fate === "cut-request") {
        // Forward a part of the request, then drop the line.
        const part = chunk.subarray(0, Math.max(1, Math.floor(chunk.length / 2)));
        if (sentUp === 0) upstream.write(part);
        sentUp += part.length;
        setTimeout(end, 20);
        return;
      }
      upstream.write(chunk);
    });
    upstream.on("data", (chunk: Buffer) => {
      if (fate === "cut-response") return end(); // the server acted; the device never hears it
      if (fate === "delay") {
        upstream.pause();
        setTimeout(() => {
          if (!client.destroyed) client.write(chunk);
          upstream.resume();
        }, opts.delayMs);
        return;
      }
      client.write(chunk);
    });
  });
  await new Promise<void>((resolve) => server.listen(opts.listenPort, "127.0.0.1", resolve));
  return {
    port: opts.listenPort,
    counts,
    close: () =>
      new Promise<void>((resolve) => {
        for (const s of sockets) s.destroy();
        server.close(() => resolve());
      }),
  };
}
