import "server-only";
import type { Knex } from "knex";
import { listCompanySettings } from "@/lib/company/settings";
import { addDays } from "@/lib/wear/calendar";

/*
 * Units whose projected limit comes inside their company's alert horizon: the early end of the
 * projection's interval (or the projected date itself, when there is no interval) is no later
 * than today plus the company's `alert_horizon_days`. Read from the stored analysis, so the
 * check is one query for any number of units.
 */

export type UnitInsideHorizon = {
  unitId: number;
  linerId: number;
  linerSerial: string | null;
  vesselId: number;
  vesselName: string;
  cylinderNo: number;
  limitOn: string;
  earliestOn: string;
  latestOn: string | null;
  horizonDays: number;
  maxWearMm: number | null;
  wearLimitMm: number;
  lastInspectedOn: string | null;
};

const dayAfter = (now: Date, days: number) => addDays(now.toISOString().slice(0, 10), days) ?? "9999-12-31";

export async function unitsInsideHorizon(
  conn: Knex | Knex.Transaction,
  filter: { vesselIds?: number[]; unitIds?: number[]; engineIds?: number[] },
  now = new Date(),
): Promise<UnitInsideHorizon[]> {
  const settings = await listCompanySettings(conn as Knex);
  if (!settings.length) return [];
  const q = conn("unit_analysis as a")
    .join("cylinder_units as u", "u.id", "a.unit_id")
    .join("main_engines as e", "e.id", "u.engine_id")
    .join("vessels as v", "v.id", "e.vessel_id")
    .join("engine_profiles as p", "p.id", "e.profile_id")
    .join("liners as l", "l.id", "a.liner_id")
    .whereNull("v.archived_at")
    .whereNull("l.removed_on")
    .whereNotNull("a.limit_on");
  if (filter.vesselIds) q.whereIn("e.vessel_id", filter.vesselIds.length ? filter.vesselIds : [-1]);
  if (filter.unitIds) q.whereIn("a.unit_id", filter.unitIds.length ? filter.unitIds : [-1]);
  if (filter.engineIds) q.whereIn("u.engine_id", filter.engineIds.length ? filter.engineIds : [-1]);
  // One bound per company: the early date must be on or before today + that company's horizon.
  q.where((w) => {
    for (const s of settings) {
      w.orWhere((c) => c.where("v.company_id", s.companyId).whereRaw("COALESCE(a.limit_on_earliest, a.limit_on) <= ?", [dayAfter(now, s.alertHorizonDays)]));
    }
  });
  const horizon = new Map(settings.map((s) => [s.companyId, s.alertHorizonDays]));
  const rows = await q
    .orderBy(["v.name", "u.cylinder_no"])
    .select(
      "a.unit_id as unitId",
      "a.liner_id as linerId",
      "l.serial as linerSerial",
      "e.vessel_id as vesselId",
      "v.company_id as companyId",
      "v.name as vesselName",
      "u.cylinder_no as cylinderNo",
      "a.limit_on as limitOn",
      "a.limit_on_earliest as earliestOn",
      "a.limit_on_latest as latestOn",
      "a.max_wear_mm as maxWearMm",
      "p.liner_wear_limit_mm as wearLimitMm",
      "a.last_inspected_on as lastInspectedOn",
    );
  return rows.map((r: Record<string, unknown>) => ({
    unitId: Number(r.unitId),
    linerId: Number(r.linerId),
    linerSerial: (r.linerSerial as string | null) ?? null,
    vesselId: Number(r.vesselId),
    vesselName: String(r.vesselName),
    cylinderNo: Number(r.cylinderNo),
    limitOn: String(r.limitOn),
    earliestOn: String(r.earliestOn ?? r.limitOn),
    latestOn: (r.latestOn as string | null) ?? null,
    horizonDays: horizon.get(Number(r.companyId)) ?? 0,
    maxWearMm: r.maxWearMm === null ? null : Number(r.maxWearMm),
    wearLimitMm: Number(r.wearLimitMm),
    lastInspectedOn: (r.lastInspectedOn as string | null) ?? null,
  }));
}
