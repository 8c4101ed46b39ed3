// Runs once when the server starts (Next's instrumentation hook). Next 16 gives route
// handlers no socket address, and fills X-Forwarded-For from the socket only when the request
// has none, so a client could choose its own rate-limit bucket. Here every incoming request
// gets the socket's remote address in a header of ours (overwriting any the client sent);
// lib/http/client-address.ts reads it.
export async function register() {
  if (process.env.NEXT_RUNTIME === "nodejs") {
    const { recordPeerAddresses } = await import("./server/http/peer-address");
    recordPeerAddresses();
  }
}
