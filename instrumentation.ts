// Next calls register() once when a server starts (not during `next build`).
// 1. Reading the settings here makes a server with invalid or, in production, unsafe settings
//    (lib/env.ts, productionProblems) stop with the reason before it serves a page; Next itself
//    would only log the error and answer every request with an error page.
// 2. Next 16 gives route handlers no socket address, and fills X-Forwarded-For from the socket
//    only when the request has none, so a client could choose its own rate-limit bucket. Every
//    incoming request gets the socket's remote address in a header of ours (overwriting any the
//    client sent); lib/http/client-address.ts reads it.
export async function register(): Promise<void> {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  const { env } = await import("./lib/env");
  try {
    env();
  } catch (err) {
    console.error(`[ecotone] ${err instanceof Error ? err.message : String(err)}`);
    process.exit(1);
  }
  const { recordPeerAddresses } = await import("./server/http/peer-address");
  recordPeerAddresses();
}
