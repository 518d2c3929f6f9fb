import type { NextConfig } from "next";
import { serverEnv } from "./lib/env";

// Importing the env schema here makes a bad configuration fail the build, not the first request.
void serverEnv;

const nextConfig: NextConfig = {
  serverExternalPackages: ["knex", "mysql2", "nodemailer"],
  poweredByHeader: false,
  typedRoutes: false,
  // The service worker must be re-checked on every visit so a new release replaces it at once.
  async headers() {
    return [{ source: "/sw.js", headers: [{ key: "Cache-Control", value: "no-cache, no-store, must-revalidate" }] }];
  },
};

export default nextConfig;
