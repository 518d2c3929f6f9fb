import fc from "fast-check";
import { fuzzCase, hostileString, mutatedFrom, type FuzzCase } from "../../support/fuzz";
import type { RoleWorld } from "../../support/role-world";

// Fuzz cases for the platform routes: health, the narrowed better-auth endpoints, the caller, users, vessels.

const noFixture = async (w: RoleWorld) => w;

export const fuzzCases: Record<string, FuzzCase<RoleWorld>> = {
  "GET /api/health": fuzzCase({ as: "engineer", setup: noFixture }),
  "GET /api/me": fuzzCase({ as: "engineer", setup: noFixture }),
  "GET /api/admin/users": fuzzCase({ as: "admin", setup: noFixture }),
  "GET /api/vessels": fuzzCase({ as: "supt", setup: noFixture }),
  "GET /api/vessels/[vesselId]": fuzzCase({
    as: "chief",
    setup: noFixture,
    params: (w) => fc.constantFrom(w.vessel1, w.vessel2).map((v) => ({ vesselId: String(v) })),
  }),
  "GET /api/auth/[...all]": fuzzCase({
    as: "engineer",
    setup: noFixture,
    params: () =>
      fc
        .oneof(
          { weight: 3, arbitrary: fc.constant(["get-session"]) },
          fc.constantFrom(["list-sessions"], ["admin", "list-users"], ["session"], ["ok"], ["get-session", ".."], ["verify-email"]),
          fc.array(hostileString(), { minLength: 1, maxLength: 3 }),
        )
        .map((all) => ({ all: [...all] })),
    query: () => fc.constantFrom("", "disableCookieCache=true", "token=abc", "callbackURL=https://evil.example"),
  }),
  // Called as crew of vessel 2, whose session a sign-out may end (the fuzzer signs them in again).
  // Failed sign-ins are counted (sign_in_throttle) and a reset request writes its token and mail even when refused later.
  "POST /api/auth/[...all]": fuzzCase({
    as: "engineer2",
    setup: noFixture,
    mayWrite: ["sign_in_throttle", "session", "verification", "mail_outbox", "rateLimit", "rate_limit"],
    params: () =>
      fc
        .oneof(
          { weight: 4, arbitrary: fc.constantFrom(["sign-in", "email"], ["request-password-reset"], ["reset-password"]) },
          { weight: 1, arbitrary: fc.constantFrom(["sign-up", "email"], ["admin", "set-role"], ["admin", "impersonate-user"], ["change-password"], ["update-user"]) },
          { weight: 1, arbitrary: fc.array(hostileString(), { minLength: 1, maxLength: 3 }) },
        )
        .map((all) => ({ all: [...all] })),
    body: () =>
      fc.oneof(
        mutatedFrom({ email: "nobody@fuzz.test", password: "not-the-password", rememberMe: true }),
        mutatedFrom({ email: "nobody@fuzz.test", redirectTo: "/reset-password" }),
        mutatedFrom({ token: "a".repeat(24), newPassword: "A-new-password-long-enough" }),
      ),
  }),
};
