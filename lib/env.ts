import { z } from "zod";

/**
 * The one configuration schema. Every variable has a working local default so
 * `npm start` runs on a fresh machine; pointing the S3_* and SMTP_* variables at a
 * real MinIO/S3 or mail server needs no code change.
 */
const port = (fallback: number) =>
  z.coerce
    .number({ error: "must be a port number (1–65535)" })
    .int("must be a port number (1–65535)")
    .min(1, "must be a port number (1–65535)")
    .max(65535, "must be a port number (1–65535)")
    .default(fallback);

/**
 * Secrets anyone can read (the one this code used to fall back to, the one in
 * .env.example, the development default below): a production server refuses them, since a
 * session cookie signed with a published secret can be forged.
 */
export const PUBLISHED_AUTH_SECRETS: readonly string[] = [
  "local-demo-secret-change-me-0123456789abcdef",
  "development-only-secret-never-used-in-production",
];
const DEVELOPMENT_AUTH_SECRET = "development-only-secret-never-used-in-production";

/** Local defaults for the private MariaDB and the S3 fake on loopback (see the production check below). */
const LOCAL_DB_PASSWORD = "kalibore-local";
const LOCAL_S3_KEY = "S3RVER";
const isLoopback = (host: string) => host === "localhost" || host === "::1" || host === "[::1]" || /^127\./.test(host);

const count = (fallback: number, min: number, what: string) =>
  z.coerce.number({ error: `must be ${what}` }).int(`must be ${what}`).min(min, `must be ${what}`).default(fallback);

export const serverEnvSchema = z.object({
  NODE_ENV: z.enum(["development", "production", "test"]).default("development"),
  APP_URL: z.url("must be a full address such as http://localhost:3000").default("http://localhost:3000"),
  PORT: port(3000),
  DB_HOST: z.string().min(1).default("127.0.0.1"),
  DB_PORT: port(3307),
  DB_NAME: z.string().regex(/^[A-Za-z0-9_]+$/, "letters, digits and _ only").default("kalibore"),
  DB_USER: z.string().min(1).default("kalibore"),
  DB_PASSWORD: z.string().min(1).default(LOCAL_DB_PASSWORD),
  // The schema's owner, for migrations and the seed only; the app itself connects as DB_USER, which may not
  // change or delete audit rows (scripts/db-grants.ts). Unset: migrations run as DB_USER.
  DB_MIGRATION_USER: z.string().min(1).optional(),
  DB_MIGRATION_PASSWORD: z.string().min(1).optional(),
  DB_POOL_MAX: count(10, 1, "a whole number of connections, at least 1"),
  S3_ENDPOINT: z.url("must be a full address such as http://127.0.0.1:4569").default("http://127.0.0.1:4569"),
  S3_REGION: z.string().min(1).default("us-east-1"),
  S3_BUCKET: z.string().min(3).default("kalibore"),
  S3_ACCESS_KEY_ID: z.string().min(1).default(LOCAL_S3_KEY),
  S3_SECRET_ACCESS_KEY: z.string().min(1).default(LOCAL_S3_KEY),
  S3_FORCE_PATH_STYLE: z.stringbool().default(true),
  SMTP_HOST: z.string().min(1).default("127.0.0.1"),
  SMTP_PORT: port(2525),
  SMTP_SECURE: z.stringbool().default(false),
  SMTP_USER: z.string().optional(),
  SMTP_PASSWORD: z.string().optional(),
  MAIL_FROM: z.string().min(3).default("Kalibore <no-reply@kalibore.local>"),
  BETTER_AUTH_SECRET: z.string().min(32, "must be at least 32 characters").optional(),
  AUTH_RATE_LIMIT_MAX: count(5, 1, "a whole number of attempts, at least 1"),
  AUTH_RATE_LIMIT_WINDOW_S: count(60, 1, "a whole number of seconds, at least 1"),
  TRUSTED_PROXY_HEADER: z.string().regex(/^[A-Za-z0-9-]+$/, "must be a header name such as X-Forwarded-For").optional(),
  SESSION_MAX_AGE_S: count(60 * 60 * 12, 300, "a whole number of seconds, at least 300"),
  // better-auth keeps a signed copy of the session in a cookie for this long, sparing its two session
  // queries per request; 0 turns it off. Kalibore's own routes still check the session row (lib/auth/session.ts).
  SESSION_COOKIE_CACHE_S: z.coerce.number({ error: "must be 0–300 seconds" }).int("must be 0–300 seconds").min(0, "must be 0–300 seconds").max(300, "must be 0–300 seconds").default(60),
  /** Bearer token a scheduler sends to POST /api/jobs/*; unset, those routes refuse every call. */
  JOBS_TOKEN: z.string().min(32, "must be at least 32 characters (openssl rand -base64 48)").regex(/^[\x21-\x7e]+$/, "must be printable characters without spaces").optional(),
})
  .superRefine((env, ctx) => {
    if (env.NODE_ENV !== "production") return;
    const secret = env.BETTER_AUTH_SECRET;
    const problem = !secret
      ? "must be set in production (at least 32 random characters; npm start generates one into .data/auth-secret)"
      : PUBLISHED_AUTH_SECRETS.includes(secret)
        ? "is a published example value; generate your own (e.g. openssl rand -base64 48)"
        : new Set(secret).size < 12
          ? "is too regular to be secret; generate a random one (e.g. openssl rand -base64 48)"
          : null;
    if (problem) ctx.addIssue({ code: "custom", path: ["BETTER_AUTH_SECRET"], message: problem });
    // The local defaults below are published (in this file and .env.example): fine for the private
    // database and fake store on loopback that npm start runs, refused for a real server or bucket.
    if (!isLoopback(env.DB_HOST) && env.DB_PASSWORD === LOCAL_DB_PASSWORD) {
      ctx.addIssue({ code: "custom", path: ["DB_PASSWORD"], message: `is the published local default; set the password of the database on ${env.DB_HOST}` });
    }
    const s3Host = new URL(env.S3_ENDPOINT).hostname;
    if (!isLoopback(s3Host) && (env.S3_ACCESS_KEY_ID === LOCAL_S3_KEY || env.S3_SECRET_ACCESS_KEY === LOCAL_S3_KEY)) {
      ctx.addIssue({ code: "custom", path: ["S3_SECRET_ACCESS_KEY"], message: `is the local fake's published key; set the credentials of the store at ${s3Host}` });
    }
  })
  // Outside production a fixed development secret keeps `next dev` and the unit tests simple.
  .transform((env) => ({ ...env, BETTER_AUTH_SECRET: env.BETTER_AUTH_SECRET ?? DEVELOPMENT_AUTH_SECRET }));

export type ServerEnv = z.infer<typeof serverEnvSchema>;

/** Parses an environment; throws one message naming every bad variable. */
export function parseServerEnv(source: Record<string, string | undefined>): ServerEnv {
  const cleaned = Object.fromEntries(Object.entries(source).filter(([, v]) => v !== undefined && v !== ""));
  const result = serverEnvSchema.safeParse(cleaned);
  if (!result.success) {
    const lines = result.error.issues.map((i) => `  ${i.path.join(".")}: ${i.message}`);
    throw new Error(`Invalid configuration:\n${lines.join("\n")}`);
  }
  return result.data;
}

export const serverEnv: ServerEnv = parseServerEnv(process.env);
