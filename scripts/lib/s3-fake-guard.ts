/**
 * What the local S3 fake (s3rver) does not do by itself, so that it behaves like a private
 * bucket: every request but a CORS preflight must be signed with the configured key
 * (s3rver lets unsigned requests list and read, and does not check version-4 signatures at
 * all), a presigned URL stops working when it expires, a signed Content-Length or
 * Content-Type must match what is sent, only the app's own origins get CORS answers, and
 * only loopback clients are served.
 */
import { createHash, createHmac, timingSafeEqual } from "node:crypto";
import type { IncomingHttpHeaders } from "node:http";

export type SignedRequest = { method: string; url: string; headers: IncomingHttpHeaders };

const rfc3986 = (s: string) => encodeURIComponent(s).replace(/[!'()*]/g, (c) => `%${c.charCodeAt(0).toString(16).toUpperCase()}`);
const sha256hex = (s: string) => createHash("sha256").update(s, "utf8").digest("hex");
const hmac = (key: Buffer | string, s: string) => createHmac("sha256", key).update(s, "utf8").digest();

/** 20261202T101500Z → milliseconds since the epoch (NaN when malformed). */
function amzTime(v: string | undefined): number {
  const m = /^(\d{4})(\d{2})(\d{2})T(\d{2})(\d{2})(\d{2})Z$/.exec(v ?? "");
  return m ? Date.UTC(+m[1], +m[2] - 1, +m[3], +m[4], +m[5], +m[6]) : NaN;
}

const header = (h: IncomingHttpHeaders, name: string) => {
  const v = h[name];
  return Array.isArray(v) ? v.join(",") : v;
};

/**
 * Checks an AWS Signature Version 4 (in the Authorization header or a presigned URL's
 * query) against `secret`, and a presigned URL's expiry. Returns null when the request
 * is properly signed, else the reason it is not.
 */
export function checkSignatureV4(req: SignedRequest, accessKeyId: string, secret: string, now = Date.now()): string | null {
  const [rawPath, rawQuery = ""] = req.url.split("?", 2);
  const query = [...new URLSearchParams(rawQuery)];
  const q = new Map(query);
  const auth = header(req.headers, "authorization");
  let credential: string, signedHeaders: string, signature: string, amzDate: string | undefined;
  if (q.has("X-Amz-Signature")) {
    if (q.get("X-Amz-Algorithm") !== "AWS4-HMAC-SHA256") return "unsupported signing algorithm";
    credential = q.get("X-Amz-Credential") ?? "";
    signedHeaders = q.get("X-Amz-SignedHeaders") ?? "";
    signature = q.get("X-Amz-Signature") ?? "";
    amzDate = q.get("X-Amz-Date");
    const expires = Number(q.get("X-Amz-Expires"));
    const signedAt = amzTime(amzDate);
    if (!Number.isFinite(signedAt) || !Number.isInteger(expires) || expires < 1 || expires > 604800) return "malformed presigned URL";
    if (now > signedAt + expires * 1000) return "the presigned URL has expired";
    if (signedAt > now + 15 * 60_000) return "the presigned URL is dated in the future";
  } else if (auth?.startsWith("AWS4-HMAC-SHA256 ")) {
    const parts = new Map(
      auth
        .slice("AWS4-HMAC-SHA256 ".length)
        .split(",")
        .map((p) => p.trim().split("=", 2) as [string, string]),
    );
    credential = parts.get("Credential") ?? "";
    signedHeaders = parts.get("SignedHeaders") ?? "";
    signature = parts.get("Signature") ?? "";
    amzDate = header(req.headers, "x-amz-date");
    const signedAt = amzTime(amzDate);
    if (!Number.isFinite(signedAt) || Math.abs(now - signedAt) > 15 * 60_000) return "the request time is too far from now";
  } else {
    return "the request is not signed";
  }
  const [keyId, day, region, service, terminator] = credential.split("/");
  if (keyId !== accessKeyId || !day || !region || !service || terminator !== "aws4_request" || !amzDate?.startsWith(day)) return "unknown or malformed credential";
  const names = signedHeaders.split(";").filter(Boolean);
  if (!names.includes("host")) return "the host is not signed";
  const canonicalHeaders = names.map((n) => `${n}:${(header(req.headers, n) ?? "").trim().replace(/\s+/g, " ")}\n`).join("");
  const canonicalQuery = query
    .filter(([k]) => k !== "X-Amz-Signature")
    .map(([k, v]) => [rfc3986(k), rfc3986(v)] as const)
    .sort(([a, av], [b, bv]) => (a < b ? -1 : a > b ? 1 : av < bv ? -1 : av > bv ? 1 : 0))
    .map(([k, v]) => `${k}=${v}`)
    .join("&");
  const payloadHash = header(req.headers, "x-amz-content-sha256") ?? q.get("X-Amz-Content-Sha256") ?? "UNSIGNED-PAYLOAD";
  const canonicalRequest = [req.method, rawPath, canonicalQuery, canonicalHeaders, signedHeaders, payloadHash].join("\n");
  const scope = `${day}/${region}/${service}/aws4_request`;
  const stringToSign = ["AWS4-HMAC-SHA256", amzDate, scope, sha256hex(canonicalRequest)].join("\n");
  const key = hmac(hmac(hmac(hmac(`AWS4${secret}`, day), region), service), "aws4_request");
  const expected = createHmac("sha256", key).update(stringToSign, "utf8").digest("hex");
  const given = Buffer.from(signature, "utf8");
  if (given.length !== expected.length || !timingSafeEqual(given, Buffer.from(expected, "utf8"))) return "the signature does not match";
  return null;
}

type KoaLike = {
  method: string;
  url: string;
  headers: IncomingHttpHeaders;
  ip: string;
  req: { socket: { remoteAddress?: string } };
  status: number;
  type: string;
  body: unknown;
  get(name: string): string;
  set(name: string, value: string): void;
  response: { get(name: string): string };
};

const denied = (ctx: KoaLike, why: string) => {
  ctx.status = 403;
  ctx.type = "application/xml";
  ctx.body = `<?xml version="1.0" encoding="UTF-8"?>\n<Error><Code>AccessDenied</Code><Message>${why.replace(/[<&>]/g, "")}</Message></Error>`;
};

const LOOPBACK = new Set(["127.0.0.1", "::1", "::ffff:127.0.0.1"]);

/** The Koa middleware that runs before s3rver's own. */
export function privateBucketGuard(o: { accessKeyId: string; secret: string; allowedOrigins: string[] }) {
  return async (ctx: KoaLike, next: () => Promise<void>) => {
    if (!LOOPBACK.has(ctx.req.socket.remoteAddress ?? "")) return denied(ctx, "only loopback clients are served");
    const origin = ctx.get("origin");
    if (origin && !o.allowedOrigins.includes(origin)) return denied(ctx, "this origin may not use the store");
    if (ctx.method !== "OPTIONS") {
      const why = checkSignatureV4({ method: ctx.method, url: ctx.url, headers: ctx.headers }, o.accessKeyId, o.secret);
      if (why) return denied(ctx, why);
    }
    await next();
    // s3rver answers a matching CORS rule with "*"; name the one origin instead.
    if (origin && ctx.response.get("Access-Control-Allow-Origin")) {
      ctx.set("Access-Control-Allow-Origin", origin);
      ctx.set("Vary", "Origin");
    }
  };
}
