import type { NextConfig } from "next";

import { API_CSP, COMMON_HEADERS } from "./lib/http/security";

const nextConfig: NextConfig = {
  poweredByHeader: false,
  // `npm test` builds into its own folder so that a running `npm start` keeps its build.
  distDir: process.env.NEXT_DIST_DIR || ".next",
  // The builds live in the checkout; keep Turbopack from guessing a workspace root above it.
  turbopack: { root: import.meta.dirname },
  // `BUNDLE_SOURCE_MAPS=on next build`: source maps of the browser's chunks, to see which modules
  // a page ships (docs/performance.md); off by default.
  productionBrowserSourceMaps: process.env.BUNDLE_SOURCE_MAPS === "on",
  // Pages get their nonce CSP from proxy.ts; these go on every response.
  async headers() {
    return [
      { source: "/:path*", headers: COMMON_HEADERS },
      { source: "/api/:path*", headers: [{ key: "Content-Security-Policy", value: API_CSP }] },
    ];
  },
};

export default nextConfig;
