import type { MetadataRoute } from "next";

// Colours from tailwind.config.ts: ink-900 for the bar and the icon's ground, ink-50 the page.
export default function manifest(): MetadataRoute.Manifest {
  return {
    name: "Fuelwright",
    short_name: "Fuelwright",
    description: "Fuel-system sizing, quotes and spec sheets for performance shops.",
    start_url: "/",
    scope: "/",
    display: "standalone",
    background_color: "#f4f6f8",
    theme_color: "#141a20",
    icons: [
      { src: "/icon-192.png", sizes: "192x192", type: "image/png", purpose: "any" },
      { src: "/icon-512.png", sizes: "512x512", type: "image/png", purpose: "any" },
      { src: "/icon.svg", sizes: "any", type: "image/svg+xml", purpose: "any" },
    ],
  };
}
