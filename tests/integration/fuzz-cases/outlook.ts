import fc from "fast-check";
import { db } from "@/lib/db/knex";
import { fuzzCase, hostileString, mutatedFrom, type FuzzCase } from "../../support/fuzz";
import type { RoleWorld } from "../../support/role-world";

// Fuzz cases for renewal planning: the outlook, plans, ship schedules and spares (the superintendent's).

const future = (days: number) => new Date(Date.now() + days * 86_400_000).toISOString().slice(0, 10);

type Fx = { world: RoleWorld; unitId: number; planId: number; entryId: number; spareId: number };
let built: Promise<Fx> | null = null;

async function build(world: RoleWorld): Promise<Fx> {
  const units = await db("cylinder_units").where({ engine_id: world.engine1 }).orderBy("cylinder_no").pluck("id");
  const unitId = units[units.length - 1] as number;
  await db("renewal_plans").where({ unit_id: unitId }).delete();
  const [planId] = await db("renewal_plans").insert({ unit_id: unitId, part: "ring_set", planned_on: future(60), status: "pencilled", created_by: world.users.supt.id });
  const [entryId] = await db("vessel_schedule").insert({ vessel_id: world.vessel1, kind: "port_stay", place: "Fuzz harbour", starts_on: future(30), ends_on: future(32) });
  await db("spares_stock").where({ profile_id: world.profileId, vessel_id: world.vessel2, part: "liner" }).delete();
  const [spareId] = await db("spares_stock").insert({ company_id: world.companyId, profile_id: world.profileId, part: "liner", vessel_id: world.vessel2, on_hand: 1, lead_time_days: 30 });
  return { world, unitId, planId, entryId, spareId };
}
const setup = (world: RoleWorld) => (built ??= build(world));

/** Bodies carry "CURRENT" where the row's revision goes. */
const withRevision = (table: string, id: (fx: Fx) => number) => async (fx: Fx, input: { body?: unknown }) => {
  const b = input.body as Record<string, unknown> | undefined;
  if (!b || typeof b !== "object" || Array.isArray(b) || b.revision !== "CURRENT") return input;
  const row = await db(table).where({ id: id(fx) }).first("revision");
  return { ...input, body: { ...b, revision: row?.revision ?? 1 } };
};

export const fuzzCases: Record<string, FuzzCase<Fx>> = {
  "GET /api/outlook": fuzzCase({
    as: "supt",
    setup,
    query: (fx) =>
      fc.oneof(
        fc.constantFrom("horizon=12", "horizon=0", "horizon=-1", "horizon=1e9", "horizon=abc", `vesselId=${fx.world.vessel1}`, "format=csv", "format=xml", "sort=__proto__"),
        fc.tuple(fc.constantFrom("horizon", "vesselId", "format", "sort", "band", "probability"), hostileString()).map(([k, v]) => `${k}=${encodeURIComponent(v)}`),
      ),
  }),
  "POST /api/units/[unitId]/plans": fuzzCase({
    as: "supt",
    setup,
    params: (fx) => fc.constant({ unitId: String(fx.unitId) }),
    body: () => mutatedFrom({ part: "liner", plannedOn: future(60), note: "Fuzz plan" }),
  }),
  "PUT /api/units/[unitId]/plans/[planId]": fuzzCase({
    as: "supt",
    setup,
    params: (fx) => fc.constant({ unitId: String(fx.unitId), planId: String(fx.planId) }),
    body: () => mutatedFrom({ revision: "CURRENT", state: "confirmed", plannedOn: future(61) }),
    prepare: withRevision("renewal_plans", (fx) => fx.planId),
  }),
  "GET /api/vessels/[vesselId]/schedule": fuzzCase({ as: "supt", setup, params: (fx) => fc.constantFrom(fx.world.vessel1, fx.world.vessel2).map((v) => ({ vesselId: String(v) })) }),
  "POST /api/vessels/[vesselId]/schedule": fuzzCase({
    as: "supt",
    setup,
    params: (fx) => fc.constant({ vesselId: String(fx.world.vessel1) }),
    body: () => mutatedFrom({ kind: "docking", place: "Ostrand yard", startsOn: future(100), endsOn: future(110) }),
  }),
  "PUT /api/vessels/[vesselId]/schedule/[entryId]": fuzzCase({
    as: "supt",
    setup,
    params: (fx) => fc.constant({ vesselId: String(fx.world.vessel1), entryId: String(fx.entryId) }),
    body: () => mutatedFrom({ revision: "CURRENT", kind: "port_stay", place: "Harbourtown", startsOn: future(40), endsOn: future(41) }),
    prepare: withRevision("vessel_schedule", (fx) => fx.entryId),
  }),
  "DELETE /api/vessels/[vesselId]/schedule/[entryId]": fuzzCase({
    as: "supt",
    setup,
    params: (fx) => fc.constant({ vesselId: String(fx.world.vessel1), entryId: String(fx.entryId) }),
  }),
  "POST /api/spares": fuzzCase({
    as: "supt",
    setup,
    body: (fx) => mutatedFrom({ profileId: fx.world.profileId, part: "ring_set", vesselId: fx.world.vessel1, onHand: 1, leadTimeDays: 90, unitCost: 41500 }),
  }),
  "PUT /api/spares/[spareId]": fuzzCase({
    as: "supt",
    setup,
    params: (fx) => fc.constant({ spareId: String(fx.spareId) }),
    body: (fx) => mutatedFrom({ revision: "CURRENT", profileId: fx.world.profileId, part: "liner", vesselId: fx.world.vessel2, onHand: 2, leadTimeDays: 30 }),
    prepare: withRevision("spares_stock", (fx) => fx.spareId),
  }),
};
