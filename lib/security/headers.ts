/*
 * The security headers of every answer, in one place: a Content-Security-Policy with a fresh
 * nonce for each page (set by proxy.ts, which Next.js reads to put the nonce on its own
 * scripts), and fixed headers for everything (next.config.ts). No server imports, so the
 * unit tests read the same policy the server sends.
 */

export type PolicyOptions = {
  nonce: string;
  /** Development builds need eval for React's error overlay; production never does. */
  dev?: boolean;
  /** Origins photos are uploaded to and shown from (the object store's presigned URLs). */
  storeOrigins?: string[];
  /** Served over https: ask the browser to upgrade any stray http sub-request. */
  https?: boolean;
};

/**
 * The policy for HTML pages. Scripts run only with this response's nonce (and what those
 * scripts load, 'strict-dynamic'); styles come from the app's own files or carry the nonce;
 * style attributes are allowed because React renders chart geometry and widths into them
 * and an attribute cannot run script. Nothing may frame the app, post a form elsewhere, or
 * change the base URL. Photos come from the app and the object store only.
 */
export function pageContentSecurityPolicy(o: PolicyOptions): string {
  const store = (o.storeOrigins ?? []).join(" ");
  const directives = [
    "default-src 'self'",
    `script-src 'self' 'nonce-${o.nonce}' 'strict-dynamic'${o.dev ? " 'unsafe-eval'" : ""}`,
    `style-src 'self' 'nonce-${o.nonce}'${o.dev ? " 'unsafe-inline'" : ""}`,
    "style-src-attr 'unsafe-inline'",
    `img-src 'self' blob: data:${store ? ` ${store}` : ""}`,
    "font-src 'self'",
    `connect-src 'self'${store ? ` ${store}` : ""}`,
    "worker-src 'self'",
    "manifest-src 'self'",
    "media-src 'none'",
    "object-src 'none'",
    "frame-src 'none'",
    "base-uri 'none'",
    "form-action 'self'",
    "frame-ancestors 'none'",
    ...(o.https ? ["upgrade-insecure-requests"] : []),
  ];
  return directives.join("; ");
}

/** JSON answers are never rendered as documents: nothing may load, run or frame them. */
export const API_CONTENT_SECURITY_POLICY = "default-src 'none'; frame-ancestors 'none'; sandbox";

/**
 * Headers for every answer. The camera is not requested by any page (photos are taken
 * through the file input's capture, which is the device's own camera app), so it is off
 * like every other powerful feature. HSTS only when the public address is https: a browser
 * ignores it over http, and on http it would say nothing true.
 */
export function fixedSecurityHeaders(o: { https: boolean }): { key: string; value: string }[] {
  return [
    { key: "X-Content-Type-Options", value: "nosniff" },
    { key: "Referrer-Policy", value: "same-origin" },
    { key: "X-Frame-Options", value: "DENY" },
    { key: "Cross-Origin-Opener-Policy", value: "same-origin" },
    {
      key: "Permissions-Policy",
      value: "camera=(), microphone=(), geolocation=(), payment=(), usb=(), serial=(), bluetooth=(), interest-cohort=()",
    },
    ...(o.https ? [{ key: "Strict-Transport-Security", value: "max-age=63072000; includeSubDomains" }] : []),
  ];
}

/**
 * The origins a browser reaches the object store at: the endpoint itself (path-style, as
 * the local fake and MinIO are used) or the bucket's own host (virtual-hosted S3).
 */
export function storeOrigins(endpoint: string, bucket: string, pathStyle: boolean): string[] {
  const url = new URL(endpoint);
  return pathStyle ? [url.origin] : [`${url.protocol}//${bucket}.${url.host}`];
}
