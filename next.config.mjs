import createNextIntlPlugin from "next-intl/plugin";
import { buildServiceWorker } from "./scripts/build-sw.mjs";

// Messages are compiled at build time (next-intl's precompile): the browser gets the compiled
// form and a 1 KiB formatter instead of the ICU parser, about 7 KiB compressed on every page (issue 18).
// t.raw() then returns the compiled form: lib/i18n/template.ts turns it back into "{name}" text.
const withNextIntl = createNextIntlPlugin({
  requestConfig: "./lib/i18n/request.ts",
  experimental: { messages: { path: "./messages", format: "json", locales: "infer", precompile: true } },
});

/** @type {import('next').NextConfig} */
const nextConfig = {
  reactStrictMode: true,
  poweredByHeader: false,
  serverExternalPackages: ["pg"],
  compiler: {
    // The field log's service worker is built with the app (scripts/build-sw.mjs).
    runAfterProductionCompile: async ({ projectDir, distDir }) => buildServiceWorker({ projectDir, distDir }),
  },
  async headers() {
    // HSTS only where the app is served over HTTPS (production behind TLS).
    const hsts = (process.env.APP_URL ?? "").startsWith("https://")
      ? [{ key: "Strict-Transport-Security", value: "max-age=63072000; includeSubDomains" }]
      : [];
    return [
      // Next's hashed static files (scripts, styles, fonts) need only nosniff: the other headers
      // act on documents, and repeated on every script they cost ~0.2 KiB each (issue 18).
      { source: "/_next/static/:path*", headers: [{ key: "X-Content-Type-Options", value: "nosniff" }] },
      {
        source: "/:path((?!_next/static/).*)",
        headers: [
          { key: "X-Content-Type-Options", value: "nosniff" },
          { key: "Referrer-Policy", value: "strict-origin-when-cross-origin" },
          { key: "X-Frame-Options", value: "DENY" },
          { key: "Permissions-Policy", value: "camera=(self), geolocation=(self), microphone=()" },
          { key: "Cross-Origin-Opener-Policy", value: "same-origin" },
          ...hsts,
        ],
      },
    ];
  },
};

export default withNextIntl(nextConfig);
