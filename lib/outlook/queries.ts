import "server-only";
import type { VesselScope } from "@/lib/auth/scope";
import { db } from "@/lib/db/knex";
import { loadOutlook, loadOutlookRows, loadPlans, loadSchedule, type OutlookBundle, type OutlookRow, type PlanSummary } from "./load";

/** Today as an ISO calendar day (UTC), the day the outlook counts from. */
export function todayIso(now = new Date()): string {
  return now.toISOString().slice(0, 10);
}

/**
 * The per-unit outlook rows for the vessels in `scope` (a person, or `{ vessels: [ids] }` for a
 * job acting for a set of ships): recommendation, next overhauls, the chance of passing the
 * wear limit by each, the open plans. `risk` is the chance above which a liner is not run on.
 */
export async function getOutlookRows(scope: VesselScope, options: { today?: string; risk?: number } = {}): Promise<OutlookRow[]> {
  return loadOutlookRows(db, scope, { today: options.today ?? todayIso(), risk: options.risk });
}

/** The whole outlook (rows, schedule, stock, shortfall with order-by dates, budget) over a horizon in months. */
export async function getOutlook(scope: VesselScope, options: { horizonMonths: number; today?: string; risk?: number }): Promise<OutlookBundle> {
  return loadOutlook(db, scope, { today: options.today ?? todayIso(), horizonMonths: options.horizonMonths, risk: options.risk });
}

/** The port stays and dockings of the given vessels from 31 days back on. */
export async function getSchedule(vesselIds: number[], today = todayIso()) {
  const from = new Date(Date.parse(`${today}T00:00:00Z`) - 31 * 86_400_000).toISOString().slice(0, 10);
  return loadSchedule(db, vesselIds, from);
}

/** Every plan (open, closed and dropped) of one unit, newest day first, for the unit page. */
export async function getUnitPlans(unitId: number, today = todayIso()): Promise<PlanSummary[]> {
  return (await loadPlans(db, [unitId], today, { all: true })).reverse();
}
