// Builds the role world plus liners, running-hours logs and approved inspections in DB_NAME,
// for checking the inspection screens by hand on a scratch database:
//   DB_NAME=kalibore_d5 node --conditions=react-server --import tsx tests/support/build-inspection-world-cli.ts
import { db } from "@/lib/db/knex";
import { approveInspection, createInspection, saveDraft, submitInspection } from "@/lib/inspections/mutations";
import { loadInspectionContext } from "@/lib/inspections/context-queries";
import { randomToken } from "@/lib/inspections/form";
import { completeDraft, daysAgo, ensureHoursLog, ensureLiner, hoursOnDay } from "./inspection-builders";
import { buildRoleWorld } from "./role-world";

const name = process.env.DB_NAME ?? "";
if (!name || name === "kalibore") throw new Error("Set DB_NAME to a scratch database (not the demo database).");
const world = await buildRoleWorld(db);
const chief = { id: world.users.chief.id, name: world.users.chief.name };
const engineer = { id: world.users.engineer.id, name: world.users.engineer.name };
for (const engine of [world.engine1, world.engine2]) {
  await ensureHoursLog(db, engine);
  const units = await db("cylinder_units").where({ engine_id: engine }).orderBy("cylinder_no").select("id");
  for (const u of units) await ensureLiner(db, u.id);
}
const unit1 = (await db("cylinder_units").where({ engine_id: world.engine1, cylinder_no: 1 }).first("id")).id;
if (!(await db("inspections").where({ unit_id: unit1 }).first("id"))) {
  for (const [back, wear] of [[600, 0.3], [300, 0.55]] as const) {
    const ctx = (await loadInspectionContext(db, unit1, { inspectedOn: daysAgo(back) }))!;
    const engineHours = hoursOnDay(back, {});
    const draft = completeDraft(ctx, { inspectedOn: daysAgo(back), engineHours: Math.max(engineHours, ctx.liner.installedEngineHours + 100), wearMm: wear });
    const { id } = await createInspection(engineer, { unitId: unit1, clientToken: randomToken(24), ...draft.header }, db);
    const row = await db("inspections").where({ id }).first("revision");
    await saveDraft(engineer, id, row.revision, draft, db);
    await submitInspection(engineer, id, undefined, db);
    await approveInspection(chief, id, db);
  }
}
console.log(JSON.stringify({ unit1, users: Object.fromEntries(Object.entries(world.users).map(([k, u]) => [k, u.email])) }, null, 2));
await db.destroy();
