import { beforeAll, describe, expect, it, vi } from "vitest";
import { asCaller, mockedCookies, mockedHeaders } from "../support/next-mocks";

vi.mock("next/headers", () => ({ headers: async () => mockedHeaders(), cookies: async () => mockedCookies() }));
vi.mock("next/cache", () => ({ revalidatePath: vi.fn(), revalidateTag: vi.fn(), updateTag: vi.fn(), refresh: vi.fn() }));

import { deactivateUserAction, reactivateUserAction, updateUserAccessAction } from "@/lib/admin/actions";
import { auth } from "@/lib/auth/auth";
import { handleAuthRequest } from "@/lib/auth/auth-route";
import { db } from "@/lib/db/knex";
import { serverEnv } from "@/lib/env";
import { GET as getMe } from "@/app/api/me/route";
import { request } from "../support/matrix";
import { buildRoleWorld, WORLD_PASSWORD, type RoleWorld } from "../support/role-world";
import { signInCookie } from "../support/sessions";

/*
 * better-auth's session cookie cache (SESSION_COOKIE_CACHE_S) spares two queries per request by
 * trusting a signed copy of the session for a short while. Kalibore's pages and API must still
 * refuse a session the moment it is revoked, its user deactivated or demoted: the window of the
 * cache is better-auth's own, never Kalibore's.
 */
let world: RoleWorld;
let adminCookie: string;

beforeAll(async () => {
  world = await buildRoleWorld(db, "cookie-cache");
  adminCookie = await signInCookie(world.users.admin.email, WORLD_PASSWORD);
});

const me = async (cookie: string) => {
  asCaller(cookie);
  const res = await getMe(request("GET", "/api/me"));
  return { status: res.status, body: res.status === 200 ? ((await res.json()) as { role: string; vessels: number[] | "all" }) : null };
};
const cachedSession = (cookie: string) => auth.api.getSession({ headers: new Headers({ cookie }) });

describe("session cookie cache", () => {
  it("is on, with a short max-age (the README's window)", async () => {
    expect(serverEnv.SESSION_COOKIE_CACHE_S).toBeGreaterThan(0);
    expect(serverEnv.SESSION_COOKIE_CACHE_S).toBeLessThanOrEqual(300);
    const res = await auth.api.signInEmail({ body: { email: world.users.chief.email, password: WORLD_PASSWORD }, asResponse: true });
    const dataCookie = res.headers.getSetCookie().find((c) => c.startsWith("better-auth.session_data="));
    expect(dataCookie).toBeDefined();
    expect(dataCookie).toMatch(new RegExp(`Max-Age=${serverEnv.SESSION_COOKIE_CACHE_S}\\b`));
  });

  it("the browser's session answer is never stored (a stored copy would outlive a sign-out)", async () => {
    const cookie = await signInCookie(world.users.chief.email, WORLD_PASSWORD);
    const res = await handleAuthRequest(new Request(new URL("/api/auth/get-session", serverEnv.APP_URL), { headers: { cookie } }));
    expect(res.status).toBe(200);
    expect(res.headers.get("cache-control")).toBe("no-store");
    expect(JSON.stringify(await res.json())).not.toMatch(/"token"/);
  });

  it("a revoked session is refused at once by Kalibore, though better-auth's cached copy still vouches for it", async () => {
    const cookie = await signInCookie(world.users.engineer.email, WORLD_PASSWORD);
    expect((await me(cookie)).status).toBe(200);
    // Revoked as sign-out-everywhere and a password reset do: the session row goes.
    const before = await cachedSession(cookie);
    await db("session").where({ id: before!.session.id }).delete();
    expect((await cachedSession(cookie))?.user.id).toBe(world.users.engineer.id); // the cache's window
    expect((await me(cookie)).status).toBe(401); // …which Kalibore does not honour
  });

  it("a deactivated user is refused at once, within the cache's window", async () => {
    const target = world.users.engineer2;
    const cookie = await signInCookie(target.email, WORLD_PASSWORD);
    expect((await me(cookie)).status).toBe(200);
    asCaller(adminCookie);
    expect((await deactivateUserAction(undefined, { userId: target.id })).ok).toBe(true);
    expect((await me(cookie)).status).toBe(401);
    asCaller(adminCookie);
    expect((await reactivateUserAction(undefined, { userId: target.id })).ok).toBe(true);
  });

  it("a role or vessel change takes effect on the next request, not when the cache expires", async () => {
    const target = world.users.chief2;
    const cookie = await signInCookie(target.email, WORLD_PASSWORD);
    expect((await me(cookie)).body).toMatchObject({ role: "chief_engineer", vessels: [world.vessel2] });
    asCaller(adminCookie);
    expect((await updateUserAccessAction(undefined, { userId: target.id, role: "engineer", vesselIds: [world.vessel1] })).ok).toBe(true);
    expect((await me(cookie)).body).toMatchObject({ role: "engineer", vessels: [world.vessel1] });
    asCaller(adminCookie);
    expect((await updateUserAccessAction(undefined, { userId: target.id, role: "chief_engineer", vesselIds: [world.vessel2] })).ok).toBe(true);
  });
});
