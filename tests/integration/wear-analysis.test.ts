import { beforeAll, describe, expect, it, vi } from "vitest";
import { mockedCookies, mockedHeaders } from "../support/next-mocks";

vi.mock("next/headers", () => ({ headers: async () => mockedHeaders(), cookies: async () => mockedCookies() }));
vi.mock("next/cache", () => ({ revalidatePath: vi.fn(), revalidateTag: vi.fn(), updateTag: vi.fn(), refresh: vi.fn() }));

import { getUnitAnalysis } from "@/lib/analysis/queries";
import { db } from "@/lib/db/knex";
import { listUnitsToInspect } from "@/lib/inspections/queries";
import { approvedOn } from "../support/inspection-builders";
import { buildRoleWorld, type RoleWorld } from "../support/role-world";

/*
 * The stored analysis of a unit against the real MariaDB: what approval keeps current.
 * Each test takes a unit of its own on the world's first engine.
 */

let world: RoleWorld;
const actor = (k: "engineer" | "chief") => ({ id: world.users[k].id, name: world.users[k].name });

beforeAll(async () => {
  world = await buildRoleWorld(db, "wear");
}, 60_000);

/** A new cylinder unit on engine 1, with no inspections. */
async function newUnit(o: { nextOverhaulEngineHours?: number | null } = {}): Promise<number> {
  const maxNo = (await db("cylinder_units").where({ engine_id: world.engine1 }).max({ m: "cylinder_no" }).first())?.m ?? 0;
  const [id] = await db("cylinder_units").insert({ engine_id: world.engine1, cylinder_no: maxNo + 1, next_overhaul_engine_hours: o.nextOverhaulEngineHours ?? null });
  return id;
}

describe("next overhaul", () => {
  it("follows from the last approved overhaul and the profile's interval, recomputed when an inspection is approved", async () => {
    // A stale plan from an earlier overhaul, as the unit chooser showed it.
    const unitId = await newUnit({ nextOverhaulEngineHours: 73_795 });
    const { interval } = (await db("engine_profiles").where({ id: world.profileId }).first({ interval: "overhaul_interval_hours" })) as { interval: string };
    const { draft } = await approvedOn(unitId, actor("engineer"), actor("chief"));
    const expected = draft.header.engineHours + Number(interval);

    const unit = await db("cylinder_units").where({ id: unitId }).first("next_overhaul_engine_hours");
    expect(Number(unit.next_overhaul_engine_hours)).toBe(expected);
    const stored = await db("unit_analysis").where({ unit_id: unitId }).first("summary");
    const summary = typeof stored.summary === "string" ? JSON.parse(stored.summary) : stored.summary;
    expect(summary.nextOverhaulEngineHours).toBe(expected);
    const chooser = (await listUnitsToInspect({ ...world.users.engineer, vessels: [world.vessel1] } as never)).find((u) => u.id === unitId);
    expect(chooser?.nextOverhaulEngineHours).toBe(expected);
  });
});

describe("the unit screen reads the stored analysis", () => {
  it("answers from unit_analysis, kept current by approval, without recomputing on the request", async () => {
    const unitId = await newUnit();
    const { id } = await approvedOn(unitId, actor("engineer"), actor("chief"), { wearMm: 0.5 });
    const supt = { ...world.users.supt, vessels: "all" } as never;
    const first = (await getUnitAnalysis(supt, unitId))!;
    expect(first.points.map((p) => p.inspectionId)).toEqual([String(id)]);
    expect(first.summary.maxWearMm).toBeGreaterThan(0.4); // 0.5 mm as read, a little less at 20 °C
    expect(first.latest?.cells.length).toBeGreaterThan(0);

    // Mark the stored row: a screen that recomputed from the readings would not see the mark.
    const row = await db("unit_analysis").where({ unit_id: unitId }).first("summary");
    const summary = typeof row.summary === "string" ? JSON.parse(row.summary) : row.summary;
    await db("unit_analysis").where({ unit_id: unitId }).update({ summary: JSON.stringify({ ...summary, maxWearMm: 4.321 }) });
    expect((await getUnitAnalysis(supt, unitId))!.summary.maxWearMm).toBe(4.321);
  });

  it("a unit whose row has no stored detail yet is computed and stored once", async () => {
    const unitId = await newUnit();
    await approvedOn(unitId, actor("engineer"), actor("chief"));
    await db("unit_analysis").where({ unit_id: unitId }).update({ detail: null });
    const data = (await getUnitAnalysis({ ...world.users.supt, vessels: "all" } as never, unitId))!;
    expect(data.points).toHaveLength(1);
    const row = await db("unit_analysis").where({ unit_id: unitId }).first("detail");
    expect(row.detail).not.toBeNull();
  });
});
