import { createHash } from "node:crypto";

/**
 * Whether an If-None-Match header matches the current ETag. For GET and HEAD the
 * comparison is the weak one, and "*" matches any current representation
 * (RFC 9110, sections 8.8.3.2 and 13.1.2).
 */
export function ifNoneMatchHits(header: string | null, etag: string): boolean {
  if (!header) return false;
  if (header.trim() === "*") return true;
  const opaque = (tag: string) => tag.trim().replace(/^W\//, "");
  return header.split(",").some((tag) => opaque(tag) === opaque(etag));
}

/**
 * A JSON answer with a strong ETag over its exact bytes: 304 without a body when the
 * caller already holds them. Private and always revalidated: for signed-in callers.
 */
export function jsonWithEtag(request: Request, value: unknown): Response {
  const body = JSON.stringify(value);
  const etag = `"${createHash("sha256").update(body).digest("base64url")}"`;
  const headers = { ETag: etag, "Cache-Control": "private, no-cache", Vary: "Cookie" };
  if (ifNoneMatchHits(request.headers.get("if-none-match"), etag)) return new Response(null, { status: 304, headers });
  return new Response(body, {
    status: 200,
    headers: { ...headers, "Content-Type": "application/json; charset=utf-8" },
  });
}
