import { beforeAll, describe, expect, it, vi } from "vitest";
import { asCaller, mockedCookies, mockedHeaders } from "../support/next-mocks";

vi.mock("next/headers", () => ({ headers: async () => mockedHeaders(), cookies: async () => mockedCookies() }));
vi.mock("next/cache", () => ({ revalidatePath: vi.fn(), revalidateTag: vi.fn(), updateTag: vi.fn(), refresh: vi.fn() }));

import { db } from "@/lib/db/knex";
import { logRunningHoursAction } from "@/lib/hours/actions";
import { buildRoleWorld, WORLD_PASSWORD, type RoleWorld } from "../support/role-world";
import { signInCookie } from "../support/sessions";

let world: RoleWorld;
let engineId: number;

// A fresh engine on vessel 1 of the test world, so the log starts empty.
beforeAll(async () => {
  world = await buildRoleWorld(db, "hours");
  [engineId] = await db("main_engines").insert({ vessel_id: world.vessel1, profile_id: world.profileId, serial: `HRS-${Date.now()}`, cylinder_count: 6 });
  asCaller(await signInCookie(world.users.chief.email, WORLD_PASSWORD));
});

const log = (loggedOn: string, engineHours: number | string) => logRunningHoursAction(undefined, { engineId, loggedOn, engineHours });

describe("the running-hours log", () => {
  it("records a reading once, even when it is sent twice", async () => {
    expect((await log("2026-01-01", 50_000)).ok).toBe(true);
    const again = await log("2026-01-01", 50_000);
    expect(again.ok).toBe(true);
    expect(again.message).toMatch(/already logged/);
    expect(await db("running_hours_log").where({ engine_id: engineId }).count({ n: "*" })).toEqual([{ n: 1 }]);
  });

  it("refuses a counter that goes back, naming the field and keeping what was typed", async () => {
    const r = await log("2026-01-10", 49_000);
    expect(r.ok).toBe(false);
    expect(r.fieldErrors.engineHours?.[0]).toMatch(/At least 50000 h/);
    expect(r.values.engineHours).toBe(49_000);
  });

  it("refuses more than 24 running hours a day", async () => {
    // 9 days after 1 Jan at most 9 × 24 = 216 h more
    const r = await log("2026-01-10", 50_217);
    expect(r.ok).toBe(false);
    expect(r.fieldErrors.engineHours?.[0]).toMatch(/At most 50216 h/);
    expect((await log("2026-01-10", 50_216)).ok).toBe(true);
  });

  it("refuses text, a future date and a second different reading for one day", async () => {
    expect((await log("2026-01-11", "lots")).fieldErrors.engineHours).toBeTruthy();
    expect((await log("2999-01-01", 60_000)).fieldErrors.loggedOn?.[0]).toMatch(/future/);
    expect((await log("2026-01-10", 50_100)).fieldErrors.loggedOn?.[0]).toMatch(/already has a reading/);
  });

  it("is refused to an engineer, and not found for the chief of another vessel", async () => {
    asCaller(await signInCookie(world.users.engineer.email, WORLD_PASSWORD));
    expect((await log("2026-01-12", 50_230)).code).toBe("forbidden");
    // Another vessel's engine is answered as if it did not exist, so ids cannot be probed.
    asCaller(await signInCookie(world.users.chief2.email, WORLD_PASSWORD));
    expect((await log("2026-01-12", 50_230)).code).toBe("not_found");
    asCaller(await signInCookie(world.users.chief.email, WORLD_PASSWORD));
  });
});
