import type { NextConfig } from "next";

const nextConfig: NextConfig = {
  poweredByHeader: false,
  // The builds live in the checkout; keep Turbopack from guessing a workspace root above it.
  turbopack: { root: import.meta.dirname },
};

export default nextConfig;
