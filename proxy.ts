import createMiddleware from "next-intl/middleware";
import { NextRequest } from "next/server";
import { env } from "./lib/env";
import { routing } from "./lib/i18n/routing";
import { contentSecurityPolicy, extraOriginsOf, makeNonce } from "./lib/security/csp";

const handleI18nRouting = createMiddleware(routing);

// Every page: the locale routing of next-intl, and a fresh CSP nonce. Next reads the
// nonce from the request's Content-Security-Policy header and puts it on its scripts.
export default function proxy(request: NextRequest) {
  const e = env();
  const nonce = makeNonce();
  const csp = contentSecurityPolicy({
    nonce,
    dev: e.NODE_ENV === "development",
    https: e.APP_URL.startsWith("https://"),
    extraOrigins: extraOriginsOf(e),
  });
  const headers = new Headers(request.headers);
  headers.set("content-security-policy", csp);
  headers.set("x-nonce", nonce);
  const response = handleI18nRouting(new NextRequest(request, { headers }));
  response.headers.set("Content-Security-Policy", csp);
  return response;
}

export const config = {
  // Everything but the API, Next's assets, the service worker and files with an extension.
  matcher: ["/((?!api|_next|_vercel|sw\\.js|workbox-.*|.*\\..*).*)"],
};
