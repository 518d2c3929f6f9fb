import { beforeAll, describe, expect, it, vi } from "vitest";
import { asCaller, mockedCookies, mockedHeaders } from "../support/next-mocks";

vi.mock("next/headers", () => ({ headers: async () => mockedHeaders(), cookies: async () => mockedCookies() }));
vi.mock("next/cache", () => ({ revalidatePath: vi.fn(), revalidateTag: vi.fn(), updateTag: vi.fn(), refresh: vi.fn() }));

import { deactivateUserAction, reactivateUserAction, inviteUserAction, saveProfileAction, updateUserAccessAction } from "@/lib/admin/actions";
import { auth } from "@/lib/auth/auth";
import { db } from "@/lib/db/knex";
import { acceptInvitation } from "@/lib/invitations/mutations";
import { hashInvitationToken } from "@/lib/invitations/token";
import { GET as getMe } from "@/app/api/me/route";
import { request, throwawayInvitation, unique } from "../support/matrix";
import { buildRoleWorld, WORLD_PASSWORD, type RoleWorld } from "../support/role-world";
import { signInCookie } from "../support/sessions";

let world: RoleWorld;
let adminCookie: string;

beforeAll(async () => {
  world = await buildRoleWorld(db, "accounts");
  adminCookie = await signInCookie(world.users.admin.email, WORLD_PASSWORD);
});

const me = async (cookie: string) => {
  asCaller(cookie);
  return (await getMe(request("GET", "/api/me"))).status;
};

describe("invitations", () => {
  it("stores only a hash of the token, and a link works exactly once", async () => {
    const { id, token } = await throwawayInvitation(world);
    const row = await db("invitations").where({ id }).first("token_hash");
    expect(row.token_hash).toBe(hashInvitationToken(token));
    expect(row.token_hash).not.toContain(token);
    const [first, second] = await Promise.all([acceptInvitation(token, "A-long-enough-password"), acceptInvitation(token, "Another-long-password")]);
    expect([first.ok, second.ok].sort()).toEqual([false, true]);
    const again = await acceptInvitation(token, "A-long-enough-password");
    expect(again).toEqual({ ok: false, reason: "used" });
  });

  it("creates a user who can sign in, with the invited role and vessels, and no password in the user row", async () => {
    const { token } = await throwawayInvitation(world);
    const result = await acceptInvitation(token, "A-long-enough-password");
    if (!result.ok) throw new Error(result.reason);
    const user = await db("user").where({ id: result.userId }).first("role", "emailVerified");
    expect(user.role).toBe("engineer");
    const vessels = await db("user_vessels").where({ user_id: result.userId }).pluck("vessel_id");
    expect(vessels).toEqual([world.vessel1]);
    const cookie = await signInCookie(result.email, "A-long-enough-password");
    expect(await me(cookie)).toBe(200);
  });

  it("refuses an expired invitation", async () => {
    const { token } = await throwawayInvitation(world, true);
    expect(await acceptInvitation(token, "A-long-enough-password")).toEqual({ ok: false, reason: "expired" });
  });

  it("a double submit of the invite form issues one invitation and one e-mail", async () => {
    asCaller(adminCookie);
    const input = { name: "Twice Clicked", email: `${unique("twice")}@roles.test`, role: "engineer", vesselIds: [String(world.vessel1)] };
    const [a, b] = await Promise.all([inviteUserAction(undefined, input), inviteUserAction(undefined, input)]);
    expect(a.ok && b.ok).toBe(true);
    expect(await db("invitations").where({ email: input.email }).count({ n: "*" }).first()).toMatchObject({ n: 1 });
  });

  it("refuses to invite an address that already has an account, naming the field", async () => {
    asCaller(adminCookie);
    const r = await inviteUserAction(undefined, { name: "Dup", email: world.users.chief.email, role: "engineer", vesselIds: [String(world.vessel1)] });
    expect(r.ok).toBe(false);
    expect(r.fieldErrors.email?.[0]).toMatch(/already has an account/);
    expect(r.values.email).toBe(world.users.chief.email);
  });
});

describe("deactivation", () => {
  it("ends the person's open session at once and blocks sign-in; reactivation lets them back", async () => {
    const target = world.users.engineer2;
    const cookie = await signInCookie(target.email, WORLD_PASSWORD);
    expect(await me(cookie)).toBe(200);

    asCaller(adminCookie);
    expect((await deactivateUserAction(undefined, { userId: target.id })).ok).toBe(true);
    expect(await me(cookie)).toBe(401);
    expect(await db("session").where({ userId: target.id }).count({ n: "*" }).first()).toMatchObject({ n: 0 });
    await expect(signInCookie(target.email, WORLD_PASSWORD)).rejects.toThrow(/403/);

    asCaller(adminCookie);
    expect((await reactivateUserAction(undefined, { userId: target.id })).ok).toBe(true);
    expect(await me(await signInCookie(target.email, WORLD_PASSWORD))).toBe(200);
    const audit = await db("audit_log").where({ entity_id: target.id }).whereIn("action", ["user.deactivate", "user.reactivate"]).pluck("action");
    expect(audit).toEqual(expect.arrayContaining(["user.deactivate", "user.reactivate"]));
  });

  it("an admin cannot deactivate or demote themselves", async () => {
    asCaller(adminCookie);
    expect((await deactivateUserAction(undefined, { userId: world.users.admin.id })).ok).toBe(false);
    const r = await updateUserAccessAction(undefined, { userId: world.users.admin.id, role: "engineer", vesselIds: [world.vessel1] });
    expect(r.ok).toBe(false);
    expect(r.fieldErrors.role).toBeDefined();
  });
});

describe("server refuses inconsistent profiles, naming the field", () => {
  it("ring gap limit below the new maximum", async () => {
    asCaller(adminCookie);
    const r = await saveProfileAction(undefined, {
      name: unique("Bad"), designation: "X", boreMm: 500, strokeMm: "", linerWearLimitMm: 3, ovalityLimitMm: 1, wearReference: "nominal",
      temperatureCorrection: false, linerMaterial: "Iron", alphaLinerPpmPerK: 10.5, gaugeMaterial: "Steel", alphaGaugePpmPerK: 11.5,
      runningInHours: 0, minPointsForProjection: 3, axisAKey: "fa", axisALabel: "Fore–aft", axisBKey: "ath", axisBLabel: "Athwartships",
      overhaulIntervalHours: 16000, rodNutPressureBar: "", notes: "",
      stations: [{ key: "a", label: "A", depthMm: 10, role: "unworn_top" }, { key: "b", label: "B", depthMm: 100, role: "ring_tdc" }, { key: "c", label: "C", depthMm: 400, role: "intermediate" }],
      rings: [{ label: "R1", gapNewMinMm: 2, gapNewMaxMm: 3, gapLimitMm: 2.5, grooveNewMinMm: 0.3, grooveNewMaxMm: 0.4, grooveLimitMm: 0.8 }],
    });
    expect(r.ok).toBe(false);
    expect(Object.keys(r.fieldErrors)).toEqual(["rings.0.gapLimitMm"]);
    expect(r.values.name).toMatch(/^Bad/);
  });
});

describe("password reset", () => {
  it("is enabled and answers the same for unknown addresses", async () => {
    const res = await auth.api.requestPasswordReset({ body: { email: "nobody@roles.test", redirectTo: "/reset-password" } });
    expect(res.status).toBe(true);
  });
});
