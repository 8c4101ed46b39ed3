// The Content-Security-Policy every page is served under. Scripts run only with this
// request's nonce ('strict-dynamic' lets Next's own chunks load from them); styles allow
// inline attributes, which React and chart libraries set. Extra origins (an object store
// serving photos) are added to img-src and connect-src only.
export function contentSecurityPolicy(opts: {
  nonce: string;
  dev: boolean;
  https: boolean;
  extraOrigins?: string[];
}): string {
  const extra = (opts.extraOrigins ?? []).join(" ");
  const directives = [
    "default-src 'self'",
    `script-src 'self' 'nonce-${opts.nonce}' 'strict-dynamic'${opts.dev ? " 'unsafe-eval'" : ""}`,
    "style-src 'self' 'unsafe-inline'",
    `img-src 'self' blob: data: ${extra}`.trim(),
    `connect-src 'self' ${extra}`.trim(),
    "font-src 'self'",
    "worker-src 'self'",
    "manifest-src 'self'",
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "frame-ancestors 'none'",
    ...(opts.https ? ["upgrade-insecure-requests"] : []),
  ];
  return directives.join("; ");
}

export function makeNonce(): string {
  const bytes = new Uint8Array(16);
  crypto.getRandomValues(bytes);
  return btoa(String.fromCharCode(...bytes));
}

/** The origins a page needs besides its own: CSP_EXTRA_ORIGINS and the base map's tile server. */
export function extraOriginsOf(e: { CSP_EXTRA_ORIGINS: string[]; MAP_TILE_URL: string }): string[] {
  const tiles = new URL(e.MAP_TILE_URL.replace(/[{}]/g, "")).origin;
  return [...new Set([...e.CSP_EXTRA_ORIGINS, tiles])];
}
