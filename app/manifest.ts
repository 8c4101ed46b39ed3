import type { MetadataRoute } from "next";

// The installable field log (Web App Manifest). start_url has no locale: online, the
// locale routing picks the person's language; offline, the service worker sends them to
// the field log page they used last.
export default function manifest(): MetadataRoute.Manifest {
  return {
    id: "/field",
    name: "Ecotone field log",
    short_name: "Ecotone",
    description: "Record species sightings and count sessions in the field, with or without signal.",
    start_url: "/field",
    scope: "/",
    display: "standalone",
    orientation: "portrait",
    background_color: "#f8f5ec",
    theme_color: "#153a2a",
    categories: ["education", "productivity"],
    icons: [
      { src: "/icons/icon-192.png", sizes: "192x192", type: "image/png", purpose: "any" },
      { src: "/icons/icon-512.png", sizes: "512x512", type: "image/png", purpose: "any" },
      { src: "/icons/icon-maskable-512.png", sizes: "512x512", type: "image/png", purpose: "maskable" },
      { src: "/icons/icon.svg", sizes: "any", type: "image/svg+xml", purpose: "any" },
    ],
  };
}
