import http from "node:http";

/**
 * One HTTP request on its own connection (no keep-alive), as a phone on a poor network makes
 * it: JSON body in, status and text out. Rejects on a refused or cut connection, and when
 * `timeoutMs` passes without an answer (the device gives up waiting). For the chaos specs.
 */
export function rawRequest(
  url: string,
  options: { method: string; body?: unknown; headers: Record<string, string>; timeoutMs: number },
): Promise<{ status: number; text: string }> {
  return new Promise((resolve, reject) => {
    const payload = options.body === undefined ? undefined : Buffer.from(JSON.stringify(options.body));
    const req = http.request(
      url,
      {
        method: options.method,
        agent: false,
        timeout: options.timeoutMs,
        headers: {
          connection: "close",
          ...options.headers,
          ...(payload ? { "content-type": "application/json", "content-length": String(payload.length) } : {}),
        },
      },
      (res) => {
        const chunks: Buffer[] = [];
        res.on("data", (c: Buffer) => chunks.push(c));
        res.on("end", () => resolve({ status: res.statusCode ?? 0, text: Buffer.concat(chunks).toString("utf8") }));
        res.on("error", reject);
      },
    );
    req.on("timeout", () => req.destroy(new Error("gave up waiting")));
    req.on("error", reject);
    if (payload) req.write(payload);
    req.end();
  });
}
