// Where a person goes after signing in: only a path on this site, normalised. An open
// redirect (OWASP ASVS V5.1.5) hides in shapes that a URL parser turns into another host:
// "//evil", "/\evil", "/.//evil" and "/%2e//evil" (the dot segment is removed, leaving
// "//evil"), tabs or line breaks inside ("/\t/evil"), and absolute URLs of other origins.

/**
 * The normalised same-origin path (with its query) for a callback URL, or null when it would
 * leave the site. `appUrl` is this site's own address (lib/env.ts APP_URL).
 */
export function safeCallbackPath(raw: string | null | undefined, appUrl: string): string | null {
  if (!raw || raw.length > 2000) return null;
  // Backslashes and control characters have no business in a path we send people to.
  if (/[\\\u0000-\u001f\u007f]/.test(raw)) return null;
  let url: URL;
  let base: URL;
  try {
    base = new URL(appUrl);
    url = new URL(raw, base);
  } catch {
    return null;
  }
  if (url.origin !== base.origin || url.username || url.password) return null;
  const path = url.pathname;
  // After normalisation the path must start with exactly one slash (never "//" or "/\").
  if (!path.startsWith("/") || path.startsWith("//") || /^\/[\\]/.test(path)) return null;
  // The encoded forms a browser or a proxy could decode into the same trick.
  if (/^\/(%2f|%5c)/i.test(path)) return null;
  return path + url.search;
}

/** The callback for a locale's pages: the safe path, or the person's account page. */
export function callbackOrAccount(raw: string | null | undefined, appUrl: string, locale: string): string {
  return safeCallbackPath(raw, appUrl) ?? `/${locale}/account`;
}
