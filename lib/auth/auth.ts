import "server-only";
import { betterAuth } from "better-auth";
import { nextCookies } from "better-auth/next-js";
import { admin } from "better-auth/plugins";
import { createAccessControl } from "better-auth/plugins/access";
import { defaultStatements, adminAc } from "better-auth/plugins/admin/access";
import { createPool } from "mysql2/promise";
import { writeAudit } from "@/lib/audit/mutations";
import { serverEnv } from "@/lib/env";
import { passwordResetEmail } from "@/lib/mail/templates";
import { sendMail } from "@/lib/mail/transport";

/** A reset link is good for an hour and once; using it signs the person out everywhere. */
const RESET_TOKEN_TTL_S = 60 * 60;

// better-auth's own user-management statements; the product's rules are in permissions.ts.
const ac = createAccessControl(defaultStatements);
const noUserAdmin = ac.newRole({ user: [], session: [] });

const globalForAuth = globalThis as unknown as { kaliboreAuthPool?: ReturnType<typeof createPool> };
const pool =
  globalForAuth.kaliboreAuthPool ??
  createPool({
    host: serverEnv.DB_HOST,
    port: serverEnv.DB_PORT,
    user: serverEnv.DB_USER,
    password: serverEnv.DB_PASSWORD,
    database: serverEnv.DB_NAME,
    timezone: "Z",
    connectionLimit: 5,
  });
globalForAuth.kaliboreAuthPool = pool;

export const auth = betterAuth({
  appName: "Kalibore",
  baseURL: serverEnv.APP_URL,
  secret: serverEnv.BETTER_AUTH_SECRET,
  trustedOrigins: [serverEnv.APP_URL, serverEnv.APP_URL.replace("localhost", "127.0.0.1")],
  database: pool,
  emailAndPassword: {
    enabled: true,
    disableSignUp: true,
    minPasswordLength: 10,
    maxPasswordLength: 128,
    resetPasswordTokenExpiresIn: RESET_TOKEN_TTL_S,
    revokeSessionsOnPasswordReset: true,
    // Links straight to our page (not better-auth's redirect endpoint) so the e-mail shows our address.
    sendResetPassword: async ({ user, token }) => {
      const url = new URL("/reset-password", serverEnv.APP_URL);
      url.searchParams.set("token", token);
      await sendMail({ to: user.email, ...passwordResetEmail({ name: user.name, url: url.href, validMinutes: RESET_TOKEN_TTL_S / 60 }) });
    },
    onPasswordReset: async ({ user }) => {
      await writeAudit({ actor: { id: user.id, name: user.name }, action: "user.password_reset", entityType: "user", entityId: user.id });
    },
  },
  session: {
    expiresIn: serverEnv.SESSION_MAX_AGE_S,
    updateAge: 60 * 60,
  },
  rateLimit: {
    enabled: true,
    storage: "memory",
    window: serverEnv.AUTH_RATE_LIMIT_WINDOW_S,
    max: 100,
    customRules: {
      "/sign-in/email": { window: serverEnv.AUTH_RATE_LIMIT_WINDOW_S, max: serverEnv.AUTH_RATE_LIMIT_MAX },
      "/request-password-reset": { window: serverEnv.AUTH_RATE_LIMIT_WINDOW_S, max: serverEnv.AUTH_RATE_LIMIT_MAX },
    },
  },
  advanced: { database: { generateId: () => crypto.randomUUID() } },
  plugins: [
    admin({
      ac,
      roles: { admin: adminAc, superintendent: noUserAdmin, chief_engineer: noUserAdmin, engineer: noUserAdmin },
      adminRoles: ["admin"],
      defaultRole: "engineer",
    }),
    nextCookies(),
  ],
});

export type AuthSession = typeof auth.$Infer.Session;
