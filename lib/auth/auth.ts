import "server-only";
import { betterAuth } from "better-auth";
import { APIError, createAuthMiddleware, isAPIError } from "better-auth/api";
import { nextCookies } from "better-auth/next-js";
import { admin } from "better-auth/plugins";
import { createAccessControl } from "better-auth/plugins/access";
import { defaultStatements } from "better-auth/plugins/admin/access";
import { createPool } from "mysql2/promise";
import { writeAudit } from "@/lib/audit/mutations";
import { serverEnv } from "@/lib/env";
import { queueMail } from "@/lib/mail/outbox";
import { passwordResetEmail } from "@/lib/mail/templates";
import { CLIENT_ADDRESS_HEADER } from "./client-address";
import { clearSignInFailures, reserveSignInAttempt } from "./sign-in-throttle";

/** A reset link is good for an hour and once; using it signs the person out everywhere. */
const RESET_TOKEN_TTL_S = 60 * 60;

// better-auth's own user-management statements, granted to no role, administrators
// included: users and roles change only through Kalibore's audited admin actions
// (lib/admin), never impersonation, set-role, create-user or set-password. The HTTP
// route refuses those endpoints too (lib/auth/auth-route.ts).
const ac = createAccessControl(defaultStatements);
const noUserAdmin = ac.newRole({ user: [], session: [] });

/** The per-address limit applies only where the client's address is known (see client-address.ts). */
const perAddress = (rule: { window: number; max: number }) => (req: Request) => (req.headers.get(CLIENT_ADDRESS_HEADER) ? rule : false);
const signInLimit = { window: serverEnv.AUTH_RATE_LIMIT_WINDOW_S, max: serverEnv.AUTH_RATE_LIMIT_MAX };

function signInEmailOf(body: unknown): string | null {
  const email = (body as { email?: unknown } | null)?.email;
  return typeof email === "string" && email.trim() ? email : null;
}

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
    // Queued, not sent: it runs as a background task (below) and the outbox sends after the
    // answer, so a known address is answered as fast as an unknown one.
    sendResetPassword: async ({ user, token }) => {
      const url = new URL("/reset-password", serverEnv.APP_URL);
      url.searchParams.set("token", token);
      const content = passwordResetEmail({ name: user.name, url: url.href, validMinutes: RESET_TOKEN_TTL_S / 60 });
      await queueMail({ to: user.email, userId: user.id, kind: "password_reset", linkPath: "/reset-password", ...content });
    },
    onPasswordReset: async ({ user }) => {
      await clearSignInFailures(user.email);
      await writeAudit({ actor: { id: user.id, name: user.name }, action: "user.password_reset", entityType: "user", entityId: user.id });
    },
  },
  session: {
    expiresIn: serverEnv.SESSION_MAX_AGE_S,
    updateAge: 60 * 60,
    // A signed copy of the session in a short-lived cookie: better-auth then skips its session and
    // user queries. A revoked session or a deactivated user is still refused at once by Kalibore's
    // pages and API, which read the session row, role and ban on every request (lib/auth/session.ts).
    cookieCache: { enabled: serverEnv.SESSION_COOKIE_CACHE_S > 0, maxAge: serverEnv.SESSION_COOKIE_CACHE_S },
  },
  rateLimit: {
    enabled: true,
    // In the database, not in memory: every instance behind a balancer counts against one limit.
    storage: "database",
    window: serverEnv.AUTH_RATE_LIMIT_WINDOW_S,
    max: 100,
    customRules: {
      "/sign-in/email": perAddress(signInLimit),
      "/request-password-reset": perAddress(signInLimit),
    },
  },
  hooks: {
    // The per-account limit: counted before the password is checked, cleared on success.
    before: createAuthMiddleware(async (ctx) => {
      if (ctx.path !== "/sign-in/email") return;
      const email = signInEmailOf(ctx.body);
      if (!email) return;
      const reservation = await reserveSignInAttempt(email);
      if (!reservation.allowed) {
        const s = reservation.retryAfterS;
        throw new APIError(
          "TOO_MANY_REQUESTS",
          { message: `Too many attempts on this account. Try again in ${s} second${s === 1 ? "" : "s"}.`, code: "ACCOUNT_SIGN_IN_THROTTLED" },
          { "Retry-After": String(s) },
        );
      }
    }),
    after: createAuthMiddleware(async (ctx) => {
      if (ctx.path !== "/sign-in/email") return;
      const email = signInEmailOf(ctx.body);
      if (email && ctx.context.returned && !isAPIError(ctx.context.returned)) await clearSignInFailures(email);
    }),
  },
  advanced: {
    database: { generateId: () => crypto.randomUUID() },
    // Only Kalibore's server sets this header, from the socket or the configured proxy
    // header; better-auth's default (X-Forwarded-For) is whatever the client sends.
    ipAddress: { ipAddressHeaders: [CLIENT_ADDRESS_HEADER] },
    // Work better-auth may do after answering (queueing the reset mail) is not awaited.
    backgroundTasks: { handler: (promise) => void promise },
  },
  plugins: [
    admin({
      ac,
      roles: { admin: noUserAdmin, superintendent: noUserAdmin, chief_engineer: noUserAdmin, engineer: noUserAdmin },
      adminRoles: ["admin"],
      defaultRole: "engineer",
    }),
    nextCookies(),
  ],
});

export type AuthSession = typeof auth.$Infer.Session;
