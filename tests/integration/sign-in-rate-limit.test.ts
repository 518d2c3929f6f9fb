import { describe, expect, it } from "vitest";
import { auth } from "@/lib/auth/auth";
import { serverEnv } from "@/lib/env";

// The sign-in rate limit stays on in every environment; the test command sets 5 attempts
// per 60 s (AUTH_RATE_LIMIT_MAX / AUTH_RATE_LIMIT_WINDOW_S) so this runs in a second.
function attempt(ip: string) {
  return auth.handler(
    new Request(`${serverEnv.APP_URL}/api/auth/sign-in/email`, {
      method: "POST",
      headers: { "content-type": "application/json", origin: serverEnv.APP_URL, "x-forwarded-for": ip },
      body: JSON.stringify({ email: "nobody@kalibore.test", password: "wrong-password-123" }),
    }),
  );
}

describe("sign-in rate limit", () => {
  it("refuses the attempt after the allowed number from one address with 429, and not another address", async () => {
    const max = serverEnv.AUTH_RATE_LIMIT_MAX;
    const statuses: number[] = [];
    for (let i = 0; i < max; i++) statuses.push((await attempt("203.0.113.7")).status);
    // Wrong credentials: refused, but not yet limited. One generic 401, no hint whether the address exists.
    expect(statuses.every((s) => s === 401)).toBe(true);
    expect((await attempt("203.0.113.7")).status).toBe(429);
    expect((await attempt("203.0.113.8")).status).toBe(401);
  });
});
