import { db } from "@/lib/db/knex";
import { firstUnitOf, request, unique, type RouteCase } from "../../support/matrix";

// Renewal planning. Each allowed call works on records of its own: a plan on a unit whose open
// plans are cleared first, a schedule entry made for the call, a stock line of a fresh part.

const future = (days: number) => new Date(Date.now() + days * 86_400_000).toISOString().slice(0, 10);

async function unitWithoutOpenPlans(engineId: number, offset: number) {
  const units = await db("cylinder_units").where({ engine_id: engineId }).orderBy("cylinder_no").pluck("id");
  const unitId = units[offset % units.length];
  await db("renewal_plans").where({ unit_id: unitId }).delete();
  return unitId as number;
}

async function scheduleEntry(vesselId: number) {
  const [id] = await db("vessel_schedule").insert({ vessel_id: vesselId, kind: "port_stay", place: unique("Port"), starts_on: future(30), ends_on: future(32) });
  return id as number;
}

export const routeCases: Record<string, RouteCase> = {
  "GET /api/outlook": async () => ({ request: request("GET", "/api/outlook?horizon=12") }),
  "POST /api/units/[unitId]/plans": async (w) => {
    const unitId = await unitWithoutOpenPlans(w.engine1, 1);
    return { request: request("POST", `/api/units/${unitId}/plans`, { part: "liner", plannedOn: future(60) }), params: { unitId: String(unitId) } };
  },
  "PUT /api/units/[unitId]/plans/[planId]": async (w) => {
    const unitId = await unitWithoutOpenPlans(w.engine1, 2);
    const [planId] = await db("renewal_plans").insert({ unit_id: unitId, part: "ring_set", planned_on: future(60), status: "pencilled", created_by: w.users.supt.id });
    return { request: request("PUT", `/api/units/${unitId}/plans/${planId}`, { revision: 1, state: "confirmed" }), params: { unitId: String(unitId), planId: String(planId) } };
  },
  "GET /api/vessels/[vesselId]/schedule": async (w) => ({ request: request("GET", `/api/vessels/${w.vessel1}/schedule`), params: { vesselId: String(w.vessel1) } }),
  "POST /api/vessels/[vesselId]/schedule": async (w) => ({
    request: request("POST", `/api/vessels/${w.vessel1}/schedule`, { kind: "docking", place: "Ostrand yard", startsOn: future(100), endsOn: future(110) }),
    params: { vesselId: String(w.vessel1) },
  }),
  "PUT /api/vessels/[vesselId]/schedule/[entryId]": async (w) => {
    const id = await scheduleEntry(w.vessel1);
    return {
      request: request("PUT", `/api/vessels/${w.vessel1}/schedule/${id}`, { revision: 1, kind: "port_stay", place: "Harbourtown", startsOn: future(40), endsOn: future(41) }),
      params: { vesselId: String(w.vessel1), entryId: String(id) },
    };
  },
  "DELETE /api/vessels/[vesselId]/schedule/[entryId]": async (w) => {
    const id = await scheduleEntry(w.vessel1);
    return { request: request("DELETE", `/api/vessels/${w.vessel1}/schedule/${id}`), params: { vesselId: String(w.vessel1), entryId: String(id) } };
  },
  "POST /api/spares": async (w) => {
    await db("spares_stock").where({ profile_id: w.profileId, vessel_id: w.vessel1, part: "liner" }).delete();
    return { request: request("POST", "/api/spares", { profileId: w.profileId, part: "liner", vesselId: w.vessel1, onHand: 1, leadTimeDays: 90, unitCost: 41500 }) };
  },
  "PUT /api/spares/[spareId]": async (w) => {
    await db("spares_stock").where({ profile_id: w.profileId, vessel_id: w.vessel2, part: "ring_set" }).delete();
    const [id] = await db("spares_stock").insert({ company_id: w.companyId, profile_id: w.profileId, part: "ring_set", vessel_id: w.vessel2, on_hand: 1, lead_time_days: 30 });
    return {
      request: request("PUT", `/api/spares/${id}`, { revision: 1, profileId: w.profileId, part: "ring_set", vesselId: w.vessel2, onHand: 2, leadTimeDays: 30 }),
      params: { spareId: String(id) },
    };
  },
};
