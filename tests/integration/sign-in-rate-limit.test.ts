import { randomUUID } from "node:crypto";
import { hashPassword } from "better-auth/crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { accountKey, SIGN_IN_THROTTLE } from "@/lib/auth/sign-in-throttle";
import { db } from "@/lib/db/knex";
import { serverEnv } from "@/lib/env";
import { call, startAuthServer, type AuthServer } from "../support/auth-server";

// The sign-in limits stay on in every environment; the test command allows 5 attempts per
// 60 s from one address (AUTH_RATE_LIMIT_MAX / AUTH_RATE_LIMIT_WINDOW_S). Each test uses
// its own loopback addresses (127.0.0.x) and accounts, so they do not share buckets.
const PASSWORD = "Limits-test-password-1";
const max = serverEnv.AUTH_RATE_LIMIT_MAX;
let seq = 0;
const nobody = () => `nobody-${Date.now().toString(36)}-${++seq}@limits.test`;

async function makeUser(): Promise<string> {
  const id = randomUUID();
  const email = `person-${Date.now().toString(36)}-${++seq}@limits.test`;
  const now = new Date();
  await db("user").insert({ id, name: "Limit Tester", email, emailVerified: true, role: "engineer", banned: false, createdAt: now, updatedAt: now });
  await db("account").insert({ id: randomUUID(), accountId: id, providerId: "credential", userId: id, password: await hashPassword(PASSWORD), createdAt: now, updatedAt: now });
  return email;
}

let plain: AuthServer;
let proxied: AuthServer;
const signIn = (server: AuthServer, email: string, password: string, from: string, headers: Record<string, string> = {}) =>
  call(server, "POST", "/api/auth/sign-in/email", { from, body: { email, password }, headers });

beforeAll(async () => {
  plain = await startAuthServer(null);
  proxied = await startAuthServer("X-Test-Proxy-Client");
});
afterAll(async () => {
  await plain.close();
  await proxied.close();
});

describe("per-address limit", () => {
  it("takes the address from the socket: a client rotating X-Forwarded-For is still one client", async () => {
    const statuses: number[] = [];
    for (let i = 0; i <= max; i++) {
      statuses.push((await signIn(plain, nobody(), "wrong-password-123", "127.0.0.2", { "x-forwarded-for": `203.0.113.${i + 1}` })).status);
    }
    // Wrong credentials are refused with one generic 401 (no hint whether the address exists), then limited.
    expect(statuses.slice(0, max)).toEqual(Array(max).fill(401));
    expect(statuses[max]).toBe(429);
    // Another client is not affected.
    expect((await signIn(plain, nobody(), "wrong-password-123", "127.0.0.3")).status).toBe(401);
  });

  it("ignores a client-sent copy of the server's own address header", async () => {
    const statuses: number[] = [];
    for (let i = 0; i <= max; i++) {
      statuses.push((await signIn(plain, nobody(), "wrong-password-123", "127.0.0.4", { "x-kalibore-client-address": `198.51.100.${i + 1}` })).status);
    }
    expect(statuses[max]).toBe(429);
  });

  it("trusts a forwarding header only when configured, taking the address the proxy added last", async () => {
    // Behind the configured proxy, every request arrives from its one socket address.
    for (let i = 0; i <= max; i++) {
      const res = await signIn(proxied, nobody(), "wrong-password-123", "127.0.0.5", { "x-test-proxy-client": `192.0.2.66, 198.51.100.${i + 1}` });
      expect(res.status).toBe(401);
    }
    const one = { "x-test-proxy-client": "198.51.100.200" };
    const statuses: number[] = [];
    for (let i = 0; i <= max; i++) statuses.push((await signIn(proxied, nobody(), "wrong-password-123", "127.0.0.5", one)).status);
    expect(statuses[max]).toBe(429);
  });
});

describe("per-account limit", () => {
  it("slows guessing one account from any number of addresses, while other people still sign in", async () => {
    const victim = await makeUser();
    const other = await makeUser();
    const free = SIGN_IN_THROTTLE.freeFailures;
    for (let i = 0; i < free; i++) expect((await signIn(plain, victim, `guess-${i}-password`, `127.0.1.${i + 1}`)).status).toBe(401);
    // Even the right password waits now: the account rests, whoever asks.
    const refused = await signIn(plain, victim, PASSWORD, "127.0.1.100");
    expect(refused.status).toBe(429);
    expect(JSON.parse(refused.body).message).toMatch(/Too many failed sign-ins for this account\. Try again in \d+ seconds/);
    expect(Number(refused.headers["retry-after"])).toBeGreaterThan(SIGN_IN_THROTTLE.baseDelayS - 5);
    expect(Number(refused.headers["retry-after"])).toBeLessThanOrEqual(SIGN_IN_THROTTLE.baseDelayS);
    // Someone else, from an address the guesses came from, signs in as usual.
    expect((await signIn(plain, other, PASSWORD, "127.0.1.1")).status).toBe(200);

    // After the pause one more attempt is allowed; failing it doubles the pause.
    await db("sign_in_throttle").where({ account_key: accountKey(victim) }).update({ last_attempt_at: new Date(Date.now() - SIGN_IN_THROTTLE.baseDelayS * 1000 - 1000) });
    expect((await signIn(plain, victim, "another-wrong-guess", "127.0.1.101")).status).toBe(401);
    expect(Number((await signIn(plain, victim, PASSWORD, "127.0.1.102")).headers["retry-after"])).toBeGreaterThan(SIGN_IN_THROTTLE.baseDelayS + 5);

    // The right password after the pause signs in and clears the count.
    await db("sign_in_throttle").where({ account_key: accountKey(victim) }).update({ last_attempt_at: new Date(Date.now() - 3600_000) });
    expect((await signIn(plain, victim, PASSWORD, "127.0.1.103")).status).toBe(200);
    expect(await db("sign_in_throttle").where({ account_key: accountKey(victim) }).first()).toBeUndefined();
  });

  it("treats an unknown address exactly like a known one (no hint which exists)", async () => {
    const known = await makeUser();
    const unknown = nobody();
    const answers: Record<string, string[]> = { known: [], unknown: [] };
    for (const [label, email] of [["known", known], ["unknown", unknown]] as const) {
      for (let i = 0; i <= SIGN_IN_THROTTLE.freeFailures; i++) {
        const res = await signIn(plain, email, `guess-${i}-password`, `127.0.2.${label === "known" ? i + 1 : i + 50}`);
        answers[label].push(`${res.status} ${String(JSON.parse(res.body).message).replace(/\d+ seconds/, "N seconds")}`);
      }
    }
    expect(answers.unknown).toEqual(answers.known);
    expect(answers.known.at(-1)).toMatch(/^429 /);
  });

  it("counts a burst of parallel guesses one by one", async () => {
    const victim = await makeUser();
    const results = await Promise.all(Array.from({ length: 12 }, (_, i) => signIn(plain, victim, `burst-${i}-password`, `127.0.3.${i + 1}`)));
    const statuses = results.map((r) => r.status);
    expect(statuses.filter((s) => s !== 401 && s !== 429), results.map((r) => r.body).join("\n")).toEqual([]);
    expect(statuses.filter((s) => s === 401)).toHaveLength(SIGN_IN_THROTTLE.freeFailures);
    expect(statuses.filter((s) => s === 429)).toHaveLength(12 - SIGN_IN_THROTTLE.freeFailures);
  });
});
