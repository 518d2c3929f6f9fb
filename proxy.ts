import { NextResponse, type NextRequest } from "next/server";
import { serverEnv } from "@/lib/env";
import { pageContentSecurityPolicy, storeOrigins } from "@/lib/security/headers";

const https = new URL(serverEnv.APP_URL).protocol === "https:";
const store = storeOrigins(serverEnv.S3_ENDPOINT, serverEnv.S3_BUCKET, serverEnv.S3_FORCE_PATH_STYLE);

/**
 * Gives every page its own script nonce and the Content-Security-Policy that names it.
 * Next.js reads the policy from the request headers and puts the nonce on its own scripts
 * and styles, which is why every page renders per request (they all read the session
 * anyway). The fixed headers (nosniff, referrer, permissions, HSTS) come from next.config.ts.
 */
export function proxy(request: NextRequest) {
  const nonce = Buffer.from(crypto.getRandomValues(new Uint8Array(18))).toString("base64");
  const policy = pageContentSecurityPolicy({ nonce, dev: process.env.NODE_ENV === "development", storeOrigins: store, https });
  const requestHeaders = new Headers(request.headers);
  requestHeaders.set("x-nonce", nonce);
  requestHeaders.set("Content-Security-Policy", policy);
  const response = NextResponse.next({ request: { headers: requestHeaders } });
  response.headers.set("Content-Security-Policy", policy);
  return response;
}

export const config = {
  // Pages only: API answers get their fixed policy from next.config.ts, and built or public
  // files (scripts, styles, fonts, the service worker) carry no document policy.
  matcher: [
    {
      source: "/((?!api/|_next/static/|_next/image|fonts/|sw\\.js$|icon\\.svg$|favicon\\.ico$).*)",
      missing: [
        { type: "header", key: "next-router-prefetch" },
        { type: "header", key: "purpose", value: "prefetch" },
      ],
    },
  ],
};
