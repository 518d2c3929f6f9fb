import { beforeAll, describe, expect, it, vi } from "vitest";
import { asCaller, mockedCookies, mockedHeaders } from "../support/next-mocks";

vi.mock("next/headers", () => ({ headers: async () => mockedHeaders(), cookies: async () => mockedCookies() }));
vi.mock("next/cache", () => ({ revalidatePath: vi.fn(), revalidateTag: vi.fn(), updateTag: vi.fn(), refresh: vi.fn() }));

import { GET as outlookGet } from "@/app/api/outlook/route";
import { POST as planPost } from "@/app/api/units/[unitId]/plans/route";
import { PUT as planPut } from "@/app/api/units/[unitId]/plans/[planId]/route";
import { POST as schedulePost } from "@/app/api/vessels/[vesselId]/schedule/route";
import { POST as sparePost } from "@/app/api/spares/route";
import { db } from "@/lib/db/knex";
import { closePlansForInspection } from "@/lib/outlook/mutations";
import { request } from "../support/matrix";
import { buildRoleWorld, WORLD_PASSWORD, type RoleWorld, type WorldUser } from "../support/role-world";
import { signInCookie } from "../support/sessions";

let world: RoleWorld;
let units1: number[];
let units2: number[];
const cookies = new Map<string, string>();
const as = (u: WorldUser) => asCaller(cookies.get(u.id)!);
const future = (days: number) => new Date(Date.now() + days * 86_400_000).toISOString().slice(0, 10);
// eslint-disable-next-line @typescript-eslint/no-explicit-any
const call = (handler: (req: Request, ctx: { params: Promise<any> }) => Promise<Response>, req: Request, params: Record<string, string> = {}) =>
  handler(req, { params: Promise.resolve(params) });

beforeAll(async () => {
  world = await buildRoleWorld(db, "outlook");
  for (const u of Object.values(world.users)) cookies.set(u.id, await signInCookie(u.email, WORLD_PASSWORD));
  units1 = await db("cylinder_units").where({ engine_id: world.engine1 }).orderBy("cylinder_no").pluck("id");
  units2 = await db("cylinder_units").where({ engine_id: world.engine2 }).orderBy("cylinder_no").pluck("id");
  await db("renewal_plans").whereIn("unit_id", [...units1, ...units2]).delete();
});

describe("GET /api/outlook", () => {
  it("a chief sees his own ship's units only; the chief of another ship sees none of them", async () => {
    as(world.users.chief);
    const mine = await (await call(outlookGet, request("GET", "/api/outlook"))).json();
    expect(mine.rows.length).toBeGreaterThanOrEqual(6);
    expect(new Set(mine.rows.map((r: { vesselId: number }) => r.vesselId))).toEqual(new Set([world.vessel1]));
    as(world.users.chief2);
    const theirs = await (await call(outlookGet, request("GET", "/api/outlook"))).json();
    expect(theirs.rows.filter((r: { unitId: number }) => units1.includes(r.unitId))).toEqual([]);
    expect(theirs.rows.length).toBeGreaterThanOrEqual(6);
    // Asking for the other ship by id is answered as if it did not exist.
    expect((await call(outlookGet, request("GET", `/api/outlook?vessel=${world.vessel1}`))).status).toBe(404);
  });

  it.each([
    ["horizon=0", "horizon"],
    ["horizon=121", "horizon"],
    ["horizon=twelve", "horizon"],
    ["horizon=1.5", "horizon"],
    ["status=green", "status"],
    ["format=xlsx", "format"],
  ])("refuses ?%s naming the field %s", async (query, field) => {
    as(world.users.supt);
    const res = await call(outlookGet, request("GET", `/api/outlook?${query}`));
    expect(res.status).toBe(400);
    const body = await res.json();
    expect(body.details.field).toBe(field);
    expect(body.error).toContain(`(field: ${field})`);
  });

  it("answers a CSV: UTF-8 with a byte-order mark, a header row, one line per unit of the ship", async () => {
    as(world.users.supt);
    const res = await call(outlookGet, request("GET", `/api/outlook?format=csv&vessel=${world.vessel2}`));
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("text/csv; charset=utf-8");
    expect(res.headers.get("content-disposition")).toMatch(/attachment; filename="renewal-outlook-\d{4}-\d{2}-\d{2}\.csv"/);
    const bytes = new Uint8Array(await res.arrayBuffer());
    expect([...bytes.slice(0, 3)]).toEqual([0xef, 0xbb, 0xbf]);
    const lines = new TextDecoder("utf-8", { ignoreBOM: true }).decode(bytes).slice(1).trimEnd().split("\r\n");
    expect(lines[0].split(",").slice(0, 3)).toEqual(["vessel", "engine", "cylinder"]);
    expect(lines).toHaveLength(1 + 6);
    expect(lines.slice(1).every((l) => l.startsWith("Test Fulmar,"))).toBe(true);
  });
});

describe("renewal plans", () => {
  it("two people planning the same unit at once: one plan and one conflict (409)", async () => {
    as(world.users.supt);
    const body = { part: "liner", plannedOn: future(90), opportunity: "Harbourtown port stay" };
    const [a, b] = await Promise.all([
      call(planPost, request("POST", `/api/units/${units1[0]}/plans`, body), { unitId: String(units1[0]) }),
      call(planPost, request("POST", `/api/units/${units1[0]}/plans`, body), { unitId: String(units1[0]) }),
    ]);
    expect([a.status, b.status].sort()).toEqual([201, 409]);
    const refused = a.status === 409 ? a : b;
    expect((await refused.json()).error).toMatch(/already planned/);
    expect(await db("renewal_plans").where({ unit_id: units1[0], part: "liner" }).count({ n: "*" })).toEqual([{ n: 1 }]);
    expect(await db("audit_log").where({ action: "plan.create", entity_type: "renewal_plan" }).whereRaw("JSON_VALUE(detail, '$.unitId') = ?", [units1[0]]).count({ n: "*" })).toEqual([{ n: 1 }]);
  });

  it("an edit at a stale revision is a conflict; a fresh one moves the plan on and is audited", async () => {
    as(world.users.supt);
    const plan = await db("renewal_plans").where({ unit_id: units1[0], part: "liner" }).first("id", "revision");
    const params = { unitId: String(units1[0]), planId: String(plan.id) };
    const ok = await call(planPut, request("PUT", `/api/units/${units1[0]}/plans/${plan.id}`, { revision: plan.revision, state: "confirmed" }), params);
    expect(ok.status).toBe(200);
    const stale = await call(planPut, request("PUT", `/api/units/${units1[0]}/plans/${plan.id}`, { revision: plan.revision, state: "dropped" }), params);
    expect(stale.status).toBe(409);
    expect((await db("renewal_plans").where({ id: plan.id }).first("status")).status).toBe("confirmed");
    expect(await db("audit_log").where({ action: "plan.confirm", entity_id: String(plan.id) }).count({ n: "*" })).toEqual([{ n: 1 }]);
  });

  it("a plan on a unit outside the caller's vessels is 404, and so is another unit's plan id", async () => {
    // The superintendent loses vessel 1 for this check.
    await db("user_vessels").where({ user_id: world.users.supt.id, vessel_id: world.vessel1 }).delete();
    try {
      as(world.users.supt);
      const res = await call(planPost, request("POST", `/api/units/${units1[1]}/plans`, { part: "liner", plannedOn: future(90) }), { unitId: String(units1[1]) });
      expect(res.status).toBe(404);
    } finally {
      await db("user_vessels").insert({ user_id: world.users.supt.id, vessel_id: world.vessel1 });
    }
    const plan = await db("renewal_plans").where({ unit_id: units1[0], part: "liner" }).first("id", "revision");
    const res = await call(planPut, request("PUT", `/api/units/${units1[1]}/plans/${plan.id}`, { revision: plan.revision, state: "dropped" }), { unitId: String(units1[1]), planId: String(plan.id) });
    expect(res.status).toBe(404);
  });

  it.each([
    [{ part: "liner", plannedOn: "2027-02-30" }, "plannedOn"],
    [{ part: "liner", plannedOn: "2099-01-01" }, "plannedOn"],
    [{ part: "piston", plannedOn: future(10) }, "part"],
  ])("refuses %j naming %s", async (body, field) => {
    as(world.users.supt);
    const res = await call(planPost, request("POST", `/api/units/${units1[2]}/plans`, body), { unitId: String(units1[2]) });
    expect(res.status).toBe(400);
    expect((await res.json()).details.field).toBe(field);
  });

  it("refuses an opportunity from another ship's schedule", async () => {
    const [other] = await db("vessel_schedule").insert({ vessel_id: world.vessel2, kind: "docking", place: "Ostrand", starts_on: future(50), ends_on: future(60) });
    as(world.users.supt);
    const res = await call(planPost, request("POST", `/api/units/${units1[3]}/plans`, { part: "liner", plannedOn: future(50), scheduleId: other }), { unitId: String(units1[3]) });
    expect(res.status).toBe(400);
    expect((await res.json()).details.field).toBe("scheduleId");
  });

  it("an approved inspection on a newly fitted liner closes the open liner plan", async () => {
    const unitId = units1[4];
    const [oldLiner] = await db("liners").insert({ unit_id: unitId, serial: `OL-${Date.now()}`, installed_on: "2020-01-01", installed_engine_hours: 1000 });
    const [planId] = await db("renewal_plans").insert({ unit_id: unitId, part: "liner", planned_on: future(5), status: "confirmed", liner_id: oldLiner, created_by: world.users.supt.id });
    await db("liners").where({ id: oldLiner }).update({ removed_on: future(0), removed_engine_hours: 20_000 });
    const [newLiner] = await db("liners").insert({ unit_id: unitId, serial: `NL-${Date.now()}`, installed_on: future(0), installed_engine_hours: 20_000 });
    const [inspectionId] = await db("inspections").insert({ unit_id: unitId, liner_id: newLiner, inspected_on: future(0), engine_hours: 20_000, liner_hours: 0, state: "approved", created_by: world.users.chief.id });
    const n = await db.transaction((trx) => closePlansForInspection(trx, inspectionId, { id: world.users.chief2.id, name: "Casey Chief" }));
    expect(n).toBe(1);
    const plan = await db("renewal_plans").where({ id: planId }).first("status", "closed_by_inspection_id as by");
    expect(plan).toEqual({ status: "closed", by: inspectionId });
  });
});

describe("schedule and spares input", () => {
  it.each([
    [{ kind: "port_stay", place: "Harbourtown", startsOn: future(20), endsOn: future(10) }, "endsOn"],
    [{ kind: "port_stay", place: "", startsOn: future(20), endsOn: future(21) }, "place"],
    [{ kind: "canal", place: "Harbourtown", startsOn: future(20), endsOn: future(21) }, "kind"],
  ])("a schedule entry %j is refused naming %s", async (body, field) => {
    as(world.users.supt);
    const res = await call(schedulePost, request("POST", `/api/vessels/${world.vessel1}/schedule`, body), { vesselId: String(world.vessel1) });
    expect(res.status).toBe(400);
    expect((await res.json()).details.field).toBe(field);
  });

  it.each([
    [{ leadTimeDays: 0 }, "leadTimeDays"],
    [{ leadTimeDays: 9999 }, "leadTimeDays"],
    [{ unitCost: -5 }, "unitCost"],
    [{ jobCost: "lots" }, "jobCost"],
    [{ unitCost: 1.005 }, "unitCost"],
    [{ onOrder: 2 }, "onOrderDue"],
    [{ onOrder: 2, onOrderDue: "2027-13-01" }, "onOrderDue"],
  ])("a stock line with %j is refused naming %s", async (change, field) => {
    as(world.users.supt);
    const body = { profileId: world.profileId, part: "liner", vesselId: world.vessel1, onHand: 1, leadTimeDays: 90, ...change };
    const res = await call(sparePost, request("POST", "/api/spares", body));
    expect(res.status).toBe(400);
    expect((await res.json()).details.field).toBe(field);
  });
});
