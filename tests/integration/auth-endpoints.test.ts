import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { auth } from "@/lib/auth/auth";
import { db } from "@/lib/db/knex";
import { call, startAuthServer, type AuthServer } from "../support/auth-server";
import { buildRoleWorld, WORLD_PASSWORD, type RoleWorld } from "../support/role-world";
import { signInCookie } from "../support/sessions";

// better-auth serves far more than the screens use. Everything outside the short list in
// lib/auth/auth-route.ts answers 404: its admin endpoints would change users and roles
// without Kalibore's audited actions (and impersonation would approve as someone else),
// and list-sessions hands out the raw tokens of the user's other sessions.
let server: AuthServer;
let world: RoleWorld;
let adminCookie: string;
let chiefCookie: string;

beforeAll(async () => {
  server = await startAuthServer();
  world = await buildRoleWorld(db);
  adminCookie = await signInCookie(world.users.admin.email, WORLD_PASSWORD);
  chiefCookie = await signInCookie(world.users.chief.email, WORLD_PASSWORD);
  await signInCookie(world.users.chief.email, WORLD_PASSWORD); // a second session of the chief
});
afterAll(() => server.close());

const ADMIN_ENDPOINTS: [string, string, (w: RoleWorld) => unknown][] = [
  ["POST", "/api/auth/admin/impersonate-user", (w) => ({ userId: w.users.chief.id })],
  ["POST", "/api/auth/admin/set-role", (w) => ({ userId: w.users.engineer.id, role: "admin" })],
  ["POST", "/api/auth/admin/create-user", () => ({ email: "sneaky@roles.test", password: "Sneaky-password-1", name: "Sneaky", role: "admin" })],
  ["POST", "/api/auth/admin/set-user-password", (w) => ({ userId: w.users.chief.id, newPassword: "Taken-over-password-1" })],
  ["POST", "/api/auth/admin/ban-user", (w) => ({ userId: w.users.chief.id })],
  ["POST", "/api/auth/admin/unban-user", (w) => ({ userId: w.users.chief.id })],
  ["POST", "/api/auth/admin/remove-user", (w) => ({ userId: w.users.engineer2.id })],
  ["POST", "/api/auth/admin/update-user", (w) => ({ userId: w.users.chief.id, data: { role: "admin" } })],
  ["POST", "/api/auth/admin/revoke-user-sessions", (w) => ({ userId: w.users.chief.id })],
  ["POST", "/api/auth/admin/list-user-sessions", (w) => ({ userId: w.users.chief.id })],
  ["GET", "/api/auth/admin/list-users", () => undefined],
  ["POST", "/api/auth/admin/stop-impersonating", () => ({})],
];

describe("better-auth's admin endpoints", () => {
  it.each(ADMIN_ENDPOINTS)("%s %s answers 404, even to an administrator", async (method, path, body) => {
    const res = await call(server, method, path, { body: body(world), headers: { cookie: adminCookie } });
    expect(res.status).toBe(404);
  });

  it("changed nothing: roles, passwords and sessions are as before", async () => {
    expect(await db("user").where({ id: world.users.engineer.id }).first("role")).toMatchObject({ role: "engineer" });
    expect(await db("user").where({ email: "sneaky@roles.test" }).first()).toBeUndefined();
    expect(await db("session").whereNotNull("impersonatedBy").first()).toBeUndefined();
    expect(await signInCookie(world.users.chief.email, WORLD_PASSWORD)).toBeTruthy();
  });

  it("are refused by permission as well when called inside the server (no role holds better-auth's user statements)", async () => {
    const headers = new Headers({ cookie: adminCookie });
    await expect(auth.api.impersonateUser({ body: { userId: world.users.chief.id }, headers })).rejects.toMatchObject({ statusCode: 403 });
    await expect(auth.api.setRole({ body: { userId: world.users.engineer.id, role: "admin" }, headers })).rejects.toMatchObject({ statusCode: 403 });
    await expect(auth.api.setUserPassword({ body: { userId: world.users.chief.id, newPassword: "Taken-over-password-1" }, headers })).rejects.toMatchObject({ statusCode: 403 });
    expect(await db("user").where({ id: world.users.engineer.id }).first("role")).toMatchObject({ role: "engineer" });
  });
});

describe("sessions", () => {
  it("list-sessions answers 404: no raw token of another session reaches the browser", async () => {
    const res = await call(server, "GET", "/api/auth/list-sessions", { headers: { cookie: chiefCookie } });
    expect(res.status).toBe(404);
    const tokens = await db("session").where({ userId: world.users.chief.id }).pluck("token");
    expect(tokens.length).toBeGreaterThan(1);
    for (const t of tokens) expect(res.body).not.toContain(t);
  });

  it("get-session answers who is signed in, without the session token", async () => {
    const res = await call(server, "GET", "/api/auth/get-session", { headers: { cookie: chiefCookie } });
    expect(res.status).toBe(200);
    const body = JSON.parse(res.body);
    expect(body.user.email).toBe(world.users.chief.email);
    expect(body.session).not.toHaveProperty("token");
    const tokens = await db("session").where({ userId: world.users.chief.id }).pluck("token");
    for (const t of tokens) expect(res.body).not.toContain(t);
  });

  it.each([
    ["POST", "/api/auth/revoke-other-sessions"],
    ["POST", "/api/auth/update-user"],
    ["POST", "/api/auth/change-email"],
    ["POST", "/api/auth/sign-up/email"],
    ["GET", "/api/auth/reset-password/some-token"],
  ])("%s %s (not used by the screens) answers 404", async (method, path) => {
    const res = await call(server, method, path, { body: method === "POST" ? {} : undefined, headers: { cookie: chiefCookie } });
    expect(res.status).toBe(404);
  });

  it("sign-in and sign-out still work through the route", async () => {
    const signedIn = await call(server, "POST", "/api/auth/sign-in/email", { from: "127.0.4.1", body: { email: world.users.engineer.email, password: WORLD_PASSWORD } });
    expect(signedIn.status).toBe(200);
    const cookie = (signedIn.headers["set-cookie"] as string[]).map((c) => c.split(";")[0]).join("; ");
    expect((await call(server, "POST", "/api/auth/sign-out", { body: {}, headers: { cookie } })).status).toBe(200);
  });
});
