import { z } from "zod";

/**
 * The one configuration schema. Every variable has a working local default so
 * `npm start` runs on a fresh machine; pointing the S3_* and SMTP_* variables at a
 * real MinIO/S3 or mail server needs no code change.
 */
export const serverEnvSchema = z.object({
  NODE_ENV: z.enum(["development", "production", "test"]).default("development"),
  APP_URL: z.url().default("http://localhost:3000"),
  PORT: z.coerce.number().int().min(1).max(65535).default(3000),
  DB_HOST: z.string().min(1).default("127.0.0.1"),
  DB_PORT: z.coerce.number().int().min(1).max(65535).default(3307),
  DB_NAME: z.string().regex(/^[A-Za-z0-9_]+$/, "letters, digits and _ only").default("kalibore"),
  DB_USER: z.string().min(1).default("kalibore"),
  DB_PASSWORD: z.string().min(1).default("kalibore-local"),
  DB_POOL_MAX: z.coerce.number().int().min(1).max(100).default(10),
  S3_ENDPOINT: z.url().default("http://127.0.0.1:4569"),
  S3_REGION: z.string().min(1).default("us-east-1"),
  S3_BUCKET: z.string().min(3).default("kalibore"),
  S3_ACCESS_KEY_ID: z.string().min(1).default("S3RVER"),
  S3_SECRET_ACCESS_KEY: z.string().min(1).default("S3RVER"),
  S3_FORCE_PATH_STYLE: z.stringbool().default(true),
  SMTP_HOST: z.string().min(1).default("127.0.0.1"),
  SMTP_PORT: z.coerce.number().int().min(1).max(65535).default(2525),
  SMTP_SECURE: z.stringbool().default(false),
  SMTP_USER: z.string().optional(),
  SMTP_PASSWORD: z.string().optional(),
  MAIL_FROM: z.string().min(3).default("Kalibore <no-reply@kalibore.local>"),
  BETTER_AUTH_SECRET: z.string().min(32, "must be at least 32 characters").default("local-demo-secret-change-me-0123456789abcdef"),
  AUTH_RATE_LIMIT_MAX: z.coerce.number().int().min(1).default(5),
  AUTH_RATE_LIMIT_WINDOW_S: z.coerce.number().int().min(1).default(60),
  SESSION_MAX_AGE_S: z.coerce.number().int().min(300).default(60 * 60 * 12),
});

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
