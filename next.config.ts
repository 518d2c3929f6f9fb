import type { NextConfig } from "next";
import { serverEnv } from "./lib/env";
import { API_CONTENT_SECURITY_POLICY, fixedSecurityHeaders } from "./lib/security/headers";

// Importing the env schema here makes a bad configuration fail the build, not the first request.
void serverEnv;

const https = new URL(serverEnv.APP_URL).protocol === "https:";

const nextConfig: NextConfig = {
  serverExternalPackages: ["knex", "mysql2", "nodemailer"],
  poweredByHeader: false,
  typedRoutes: false,
  async headers() {
    return [
      // Every answer; pages get their Content-Security-Policy (with a per-request nonce) from proxy.ts.
      { source: "/:path*", headers: fixedSecurityHeaders({ https }) },
      { source: "/api/:path*", headers: [{ key: "Content-Security-Policy", value: API_CONTENT_SECURITY_POLICY }] },
      // The service worker must be re-checked on every visit so a new release replaces it at once.
      { source: "/sw.js", headers: [{ key: "Cache-Control", value: "no-cache, no-store, must-revalidate" }] },
    ];
  },
};

export default nextConfig;
