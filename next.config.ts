import type { NextConfig } from "next";

const nextConfig: NextConfig = {
  poweredByHeader: false,
  // `npm test` builds into its own folder so that a running `npm start` keeps its build.
  distDir: process.env.NEXT_DIST_DIR || ".next",
  // The builds live in the checkout; keep Turbopack from guessing a workspace root above it.
  turbopack: { root: import.meta.dirname },
};

export default nextConfig;
