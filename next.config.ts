import type { NextConfig } from "next";

const nextConfig: NextConfig = {
  // The test run builds into its own folder so it never clobbers the demo build.
  distDir: process.env.NEXT_DIST_DIR || ".next",
  poweredByHeader: false,
  // Native/Node-only packages stay out of the server bundle.
  serverExternalPackages: ["sharp", "@node-rs/argon2", "pg-boss", "mailparser"],
  turbopack: { root: import.meta.dirname },
};

export default nextConfig;
