import type { NextConfig } from "next";
import { serverEnv } from "./lib/env";

// Importing the env schema here makes a bad configuration fail the build, not the first request.
void serverEnv;

const nextConfig: NextConfig = {
  serverExternalPackages: ["knex", "mysql2", "nodemailer"],
  poweredByHeader: false,
  typedRoutes: false,
};

export default nextConfig;
