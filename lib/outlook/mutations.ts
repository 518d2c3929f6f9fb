import "server-only";
import type { Knex } from "knex";
import { writeAudit } from "@/lib/audit/mutations";
import { canSeeVessel, type VesselScope } from "@/lib/auth/scope";
import { db as defaultDb } from "@/lib/db/knex";
import { HttpError } from "@/lib/http/errors";
import type { PlanCreateInput, PlanUpdateInput, ScheduleEntryInput, SpareInput } from "./schemas";
import { inTransaction } from "@/lib/db/transaction";

/*
 * Changes to the ships' schedules, the renewal plans and the spares. Each runs in one
 * transaction with its audit row. Edits carry the revision the person saw: a record changed
 * meanwhile is a conflict (409) to reload, never a silent overwrite; two people opening a plan
 * for the same unit and part at once meet the unique key on open plans and the second gets 409.
 */

export type Actor = { id: string; name: string };

const isDuplicate = (err: unknown) => (err as { code?: string })?.code === "ER_DUP_ENTRY";
const fieldError = (field: string, message: string) => new HttpError(400, `${message} (field: ${field})`, { field, fields: { [field]: [message] } });
const conflict = (message: string, details?: Record<string, unknown>) => new HttpError(409, message, details);

// ───────────────────────────── schedule ─────────────────────────────

/** Adds a port stay or docking to a vessel's schedule; returns its id. */
export async function createScheduleEntry(actor: Actor, vesselId: number, input: ScheduleEntryInput, db: Knex = defaultDb): Promise<number> {
  return inTransaction(db, async (trx) => {
    const [id] = await trx("vessel_schedule").insert({
      vessel_id: vesselId,
      kind: input.kind,
      place: input.place,
      starts_on: input.startsOn,
      ends_on: input.endsOn,
      note: input.note,
      created_by: actor.id,
    });
    await writeAudit({ actor, action: "schedule.create", entityType: "vessel_schedule", entityId: id, vesselId, detail: { ...input } }, trx);
    return id;
  });
}

async function scheduleRow(trx: Knex.Transaction, vesselId: number, entryId: number) {
  const row = await trx("vessel_schedule").where({ id: entryId, vessel_id: vesselId }).forUpdate().first();
  if (!row) throw new HttpError(404, "No such port stay or docking on this vessel.");
  return row;
}

/** Changes a schedule entry at the revision the person saw. */
export async function updateScheduleEntry(actor: Actor, vesselId: number, entryId: number, input: ScheduleEntryInput & { revision: number }, db: Knex = defaultDb): Promise<{ revision: number }> {
  return inTransaction(db, async (trx) => {
    const row = await scheduleRow(trx, vesselId, entryId);
    if (row.revision !== input.revision) throw conflict("Someone changed this port stay or docking meanwhile; reload to see their change.", { revision: row.revision });
    await trx("vessel_schedule")
      .where({ id: entryId })
      .update({ kind: input.kind, place: input.place, starts_on: input.startsOn, ends_on: input.endsOn, note: input.note, revision: row.revision + 1 });
    await writeAudit(
      { actor, action: "schedule.update", entityType: "vessel_schedule", entityId: entryId, vesselId, detail: { before: { kind: row.kind, place: row.place, startsOn: row.starts_on, endsOn: row.ends_on }, after: { kind: input.kind, place: input.place, startsOn: input.startsOn, endsOn: input.endsOn } } },
      trx,
    );
    return { revision: row.revision + 1 };
  });
}

/** Removes a schedule entry; plans that named it keep their day and the place in words. */
export async function deleteScheduleEntry(actor: Actor, vesselId: number, entryId: number, db: Knex = defaultDb): Promise<void> {
  await inTransaction(db, async (trx) => {
    const row = await scheduleRow(trx, vesselId, entryId);
    await trx("renewal_plans").where({ schedule_id: entryId }).whereNull("port_or_yard").update({ port_or_yard: row.place });
    await trx("vessel_schedule").where({ id: entryId }).delete();
    await writeAudit({ actor, action: "schedule.delete", entityType: "vessel_schedule", entityId: entryId, vesselId, detail: { kind: row.kind, place: row.place, startsOn: row.starts_on, endsOn: row.ends_on } }, trx);
  });
}

// ───────────────────────────── plans ─────────────────────────────

async function unitForPlan(trx: Knex.Transaction, unitId: number) {
  const unit = await trx("cylinder_units as u")
    .join("main_engines as e", "e.id", "u.engine_id")
    .join("vessels as v", "v.id", "e.vessel_id")
    .where("u.id", unitId)
    .first("u.id", "e.vessel_id as vesselId", "e.profile_id as profileId", "v.company_id as companyId");
  if (!unit) throw new HttpError(404, "Unit not found.");
  const liner = await trx("liners").where({ unit_id: unitId }).whereNull("removed_on").orderBy("installed_on", "desc").first("id");
  return { ...unit, linerId: (liner?.id as number | undefined) ?? null } as { id: number; vesselId: number; profileId: number; companyId: number; linerId: number | null };
}

/** The opportunity and spare a plan names must belong to the unit's ship and engine profile. */
async function checkPlanRefs(trx: Knex.Transaction, unit: { vesselId: number; profileId: number; companyId: number }, part: string, scheduleId: number | null | undefined, spareId: number | null | undefined) {
  let place: string | null = null;
  if (scheduleId != null) {
    const s = await trx("vessel_schedule").where({ id: scheduleId, vessel_id: unit.vesselId }).first("place", "kind", "starts_on as startsOn");
    if (!s) throw fieldError("scheduleId", "That port stay or docking is not on this ship's schedule.");
    place = `${s.kind === "docking" ? "Docking" : "Port stay"} at ${s.place}`;
  }
  if (spareId != null) {
    const s = await trx("spares_stock").where({ id: spareId }).first("profile_id as profileId", "part", "vessel_id as vesselId", "company_id as companyId");
    const fits = s && s.profileId === unit.profileId && s.part === part && s.companyId === unit.companyId && (s.vesselId === null || s.vesselId === unit.vesselId);
    if (!fits) throw fieldError("spareId", "That spare is not for this engine and part, or is on another ship.");
  }
  return place;
}

/**
 * Opens a plan to renew a unit's liner or ring set at an opportunity. A second open plan for the
 * same unit and part is refused with 409 (the database's unique key on open plans decides, so two
 * people at once cannot both succeed). Returns the new plan's id and revision.
 */
export async function createPlan(actor: Actor, unitId: number, input: PlanCreateInput, db: Knex = defaultDb): Promise<{ id: number; revision: number }> {
  try {
    return await inTransaction(db, async (trx) => {
      const unit = await unitForPlan(trx, unitId);
      const place = await checkPlanRefs(trx, unit, input.part, input.scheduleId, input.spareId);
      const [id] = await trx("renewal_plans").insert({
        unit_id: unitId,
        part: input.part,
        planned_on: input.plannedOn,
        port_or_yard: input.opportunity ?? place,
        schedule_id: input.scheduleId,
        spare_id: input.spareId,
        liner_id: input.part === "liner" ? unit.linerId : null,
        status: "pencilled",
        note: input.note,
        created_by: actor.id,
      });
      await writeAudit({ actor, action: "plan.create", entityType: "renewal_plan", entityId: id, vesselId: unit.vesselId, detail: { unitId, ...input, state: "pencilled" } }, trx);
      return { id, revision: 1 };
    });
  } catch (err) {
    if (isDuplicate(err)) {
      const open = await db("renewal_plans as r").leftJoin("user as u", "u.id", "r.created_by").where({ "r.unit_id": unitId, "r.part": input.part }).whereIn("r.status", ["pencilled", "confirmed"]).first("r.id", "u.name");
      throw conflict(`A ${input.part === "liner" ? "liner" : "ring-set"} renewal is already planned for this unit${open?.name ? ` (by ${open.name})` : ""}; open that plan instead of making a second.`, { planId: open?.id ?? null });
    }
    throw err;
  }
}

const ALLOWED_MOVES: Record<string, string[]> = { pencilled: ["confirmed", "dropped", "pencilled"], confirmed: ["pencilled", "dropped", "confirmed"], dropped: ["pencilled"] };

/**
 * Changes a plan at the revision the person saw: its state (pencilled ↔ confirmed, dropped, or a
 * dropped plan pencilled in again), day, opportunity, spare or note. A closed plan is history and
 * stays as it is. 404 for a plan not on this unit; 409 for a stale revision or a move not allowed.
 */
export async function updatePlan(actor: Actor, unitId: number, planId: number, input: PlanUpdateInput, db: Knex = defaultDb): Promise<{ revision: number; state: string }> {
  try {
    return await inTransaction(db, async (trx) => {
      const row = await trx("renewal_plans").where({ id: planId, unit_id: unitId }).forUpdate().first();
      if (!row) throw new HttpError(404, "No such plan on this unit.");
      if (row.revision !== input.revision) throw conflict("Someone changed this plan meanwhile; reload to see their change.", { revision: row.revision, state: row.status });
      const to = input.state ?? row.status;
      if (row.status === "closed") throw conflict("This plan was closed by the inspection that recorded the renewal; it cannot change.");
      if (!ALLOWED_MOVES[row.status]?.includes(to)) throw conflict(`A ${row.status} plan cannot become ${to}.`);
      const unit = await unitForPlan(trx, unitId);
      const scheduleId = input.scheduleId === undefined ? row.schedule_id : input.scheduleId;
      const spareId = input.spareId === undefined ? row.spare_id : input.spareId;
      const place = await checkPlanRefs(trx, unit, row.part, input.scheduleId === undefined ? null : scheduleId, input.spareId === undefined ? null : spareId);
      const change: Record<string, unknown> = { status: to, revision: row.revision + 1 };
      if (input.plannedOn !== undefined) change.planned_on = input.plannedOn;
      if (input.scheduleId !== undefined) {
        change.schedule_id = scheduleId;
        change.port_or_yard = input.opportunity ?? place;
      } else if (input.opportunity !== undefined) change.port_or_yard = input.opportunity;
      if (input.spareId !== undefined) change.spare_id = spareId;
      if (input.note !== undefined) change.note = input.note;
      const n = await trx("renewal_plans").where({ id: planId, revision: row.revision }).update(change);
      if (n !== 1) throw conflict("Someone changed this plan meanwhile; reload to see their change.");
      const { revision: _r, ...asked } = input;
      await writeAudit({ actor, action: to !== row.status ? `plan.${to === "dropped" ? "drop" : to === "confirmed" ? "confirm" : "pencil"}` : "plan.update", entityType: "renewal_plan", entityId: planId, vesselId: unit.vesselId, detail: { unitId, from: row.status, to, ...asked } }, trx);
      return { revision: row.revision + 1, state: to };
    });
  } catch (err) {
    if (isDuplicate(err)) throw conflict("Another renewal of this part is already planned for this unit; this plan cannot be opened again.");
    throw err;
  }
}

/**
 * Closes the open plans an approved inspection carries out: a liner plan when the inspection
 * gauged a liner other than the one in the unit when the plan was made, a ring-set plan when
 * the inspection records a renewed ring. Called in the approval's transaction.
 */
export async function closePlansForInspection(trx: Knex.Transaction, inspectionId: number, actor: Actor | null): Promise<number> {
  const insp = await trx("inspections as i")
    .join("cylinder_units as u", "u.id", "i.unit_id")
    .join("main_engines as e", "e.id", "u.engine_id")
    .where("i.id", inspectionId)
    .first("i.unit_id as unitId", "i.liner_id as linerId", "e.vessel_id as vesselId");
  if (!insp) return 0;
  const open = await trx("renewal_plans").where({ unit_id: insp.unitId }).whereIn("status", ["pencilled", "confirmed"]).select("id", "part", "liner_id as linerId", "revision");
  if (!open.length) return 0;
  const ringsRenewed = !!(await trx("ring_readings").where({ inspection_id: inspectionId, renewed: true }).first("id"));
  let closed = 0;
  for (const p of open) {
    const done = p.part === "liner" ? p.linerId !== null && p.linerId !== insp.linerId : ringsRenewed;
    if (!done) continue;
    await trx("renewal_plans").where({ id: p.id }).update({ status: "closed", closed_by_inspection_id: inspectionId, closed_at: new Date(), revision: p.revision + 1 });
    await writeAudit({ actor, action: "plan.close", entityType: "renewal_plan", entityId: p.id, vesselId: insp.vesselId, detail: { inspectionId, part: p.part } }, trx);
    closed++;
  }
  return closed;
}

// ───────────────────────────── spares ─────────────────────────────

/** The company a stock line belongs to: the vessel's, or for the store the one company of the person's vessels. */
async function companyFor(trx: Knex.Transaction, scope: VesselScope, vesselId: number | null): Promise<number> {
  if (vesselId !== null) {
    const v = await trx("vessels").where({ id: vesselId }).first("company_id as companyId");
    if (!v || !canSeeVessel(scope, vesselId)) throw fieldError("vesselId", "That vessel is not one of yours.");
    return v.companyId;
  }
  const q = trx("vessels").distinct("company_id as companyId");
  if (scope.vessels !== "all") q.whereIn("id", scope.vessels.length ? scope.vessels : [-1]);
  const companies = (await q) as { companyId: number }[];
  if (companies.length !== 1) throw fieldError("vesselId", companies.length ? "Your vessels belong to several companies; choose a vessel rather than the company store." : "You have no vessels, so no company store.");
  return companies[0].companyId;
}

const spareRow = (input: SpareInput) => ({
  profile_id: input.profileId,
  part: input.part,
  vessel_id: input.vesselId,
  on_hand: input.onHand,
  on_order: input.onOrder,
  on_order_due: input.onOrder > 0 ? input.onOrderDue : null,
  lead_time_days: input.leadTimeDays,
  unit_cost: input.unitCost,
  job_cost: input.jobCost,
});

/** Adds a stock line (a part of a profile on a ship, or in the company store). One line per place: a second is 409. */
export async function createSpare(actor: Actor, scope: VesselScope, input: SpareInput, db: Knex = defaultDb): Promise<number> {
  try {
    return await inTransaction(db, async (trx) => {
      const companyId = await companyFor(trx, scope, input.vesselId);
      if (!(await trx("engine_profiles").where({ id: input.profileId }).first("id"))) throw fieldError("profileId", "Unknown engine profile.");
      // The unique key cannot see two store lines (a NULL vessel is never equal), so look first.
      const same = await trx("spares_stock").where({ company_id: companyId, profile_id: input.profileId, part: input.part }).where((q) => (input.vesselId === null ? q.whereNull("vessel_id") : q.where("vessel_id", input.vesselId))).forUpdate().first("id");
      if (same) throw conflict("There is already a stock line for this part at this place; change that line instead.", { spareId: same.id });
      const [id] = await trx("spares_stock").insert({ company_id: companyId, ...spareRow(input) });
      await writeAudit({ actor, action: "spare.create", entityType: "spares_stock", entityId: id, vesselId: input.vesselId, detail: { ...input } }, trx);
      return id;
    });
  } catch (err) {
    if (isDuplicate(err)) throw conflict("There is already a stock line for this part at this place; change that line instead.");
    throw err;
  }
}

/** Changes a stock line at the revision the person saw. 404 for a line on a vessel outside the person's scope. */
export async function updateSpare(actor: Actor, scope: VesselScope, spareId: number, input: SpareInput & { revision: number }, db: Knex = defaultDb): Promise<{ revision: number }> {
  return inTransaction(db, async (trx) => {
    const row = await trx("spares_stock").where({ id: spareId }).forUpdate().first();
    if (!row || (row.vessel_id !== null && !canSeeVessel(scope, row.vessel_id))) throw new HttpError(404, "No such stock line on your vessels.");
    if (row.revision !== input.revision) throw conflict("Someone changed this stock line meanwhile; reload to see their change.", { revision: row.revision });
    if (input.profileId !== row.profile_id || input.part !== row.part || input.vesselId !== row.vessel_id) {
      throw fieldError("vesselId", "A stock line keeps its part and place; add a new line for another.");
    }
    await trx("spares_stock").where({ id: spareId }).update({ ...spareRow(input), revision: row.revision + 1 });
    await writeAudit(
      { actor, action: "spare.update", entityType: "spares_stock", entityId: spareId, vesselId: row.vessel_id, detail: { before: { onHand: row.on_hand, onOrder: row.on_order, leadTimeDays: row.lead_time_days, unitCost: row.unit_cost, jobCost: row.job_cost }, after: { ...input } } },
      trx,
    );
    return { revision: row.revision + 1 };
  });
}
