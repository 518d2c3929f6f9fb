import "server-only";
import type { VesselScope } from "@/lib/auth/scope";
import { db } from "@/lib/db/knex";
import { loadOutlook, loadOutlookRows, type OutlookBundle, type OutlookRow } from "./load";

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
