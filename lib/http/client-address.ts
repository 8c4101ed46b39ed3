// The address a rate limit is keyed on (issue 13): the TCP peer of this server, unless that
// peer is one of our own proxies (TRUSTED_PROXIES), in which case X-Forwarded-For is read
// from the right, skipping our proxies, and the first address they did not add is the client.
// A client's own X-Forwarded-For entries are never believed otherwise, so it cannot pick its bucket.

/** Header in which instrumentation.ts records the socket's remote address for every request. */
export const PEER_HEADER = "x-ecotone-peer-address";

/** "::ffff:127.0.0.1" → "127.0.0.1"; brackets and ports dropped; lower case. */
export function normaliseAddress(raw: string): string {
  let a = raw.trim().toLowerCase();
  if (a.startsWith("[")) a = a.slice(1, a.indexOf("]") > 0 ? a.indexOf("]") : undefined);
  else if (/^\d+\.\d+\.\d+\.\d+:\d+$/.test(a)) a = a.slice(0, a.lastIndexOf(":"));
  if (a.startsWith("::ffff:") && a.includes(".")) a = a.slice(7);
  return a;
}

/**
 * The client's address. `peer` is the socket address (from PEER_HEADER); when it is missing
 * (a request that arrived before instrumentation ran), the right-most X-Forwarded-For entry
 * stands in for it: Next writes the socket address there when the request brought none.
 */
export function clientAddress(headers: Headers, trustedProxies: readonly string[]): string {
  const trusted = new Set(trustedProxies.map(normaliseAddress));
  const forwarded = (headers.get("x-forwarded-for") ?? "").split(",").map(normaliseAddress).filter(Boolean);
  const peerHeader = headers.get(PEER_HEADER);
  let peer = peerHeader ? normaliseAddress(peerHeader) : (forwarded.pop() ?? "unknown");
  // Walk back through our own proxies only.
  while (trusted.has(peer) && forwarded.length) peer = forwarded.pop()!;
  return peer || "unknown";
}
