import type { NextConfig } from "next";
import { API_CONTENT_SECURITY_POLICY, staticSecurityHeaders } from "./lib/http/security-headers";

const nextConfig: NextConfig = {
  // The test run builds into its own folder so it never clobbers the demo build.
  distDir: process.env.NEXT_DIST_DIR || ".next",
  poweredByHeader: false,
  // The app listens on loopback behind a reverse proxy, which compresses (README, "Using a real S3
  // store, mail server and reverse proxy"); gzip in Next's one server thread cost about a third of
  // the queue list's throughput.
  compress: false,
  // Native/Node-only packages stay out of the server bundle.
  serverExternalPackages: ["sharp", "@node-rs/argon2", "pg-boss", "mailparser", "piscina"],
  // `npm run typecheck` (part of `npm test`) checks the whole project, tests included; the build
  // would repeat it on every start.
  typescript: { ignoreBuildErrors: true },
  // forbidden() gives protected pages a real 403 with app/forbidden.tsx.
  experimental: { authInterrupts: true },
  turbopack: { root: import.meta.dirname },
  // What the proxy does not see (proxy.ts, matcher) gets the request-independent security headers:
  // the build's files, and every /api answer (with a CSP that allows nothing), also of paths no
  // route answers. HSTS depends on the deployment's scheme: proxy.ts adds it to pages,
  // lib/http/api-guard.ts to API answers, which is where a browser learns it.
  async headers() {
    const headers = Object.entries(staticSecurityHeaders({ https: false })).map(([key, value]) => ({ key, value }));
    const api = [...headers, { key: "Content-Security-Policy", value: API_CONTENT_SECURITY_POLICY }];
    return [
      { source: "/_next/static/:path*", headers },
      { source: "/favicon.ico", headers },
      { source: "/icon.svg", headers },
      { source: "/api/:path*", headers: api },
    ];
  },
};

export default nextConfig;
