import "server-only";
import { db } from "@/lib/db/knex";
import type { PredictionFit } from "@/lib/stats/regression";
import { fleetRates } from "./load";
import { ratePercentile } from "./numbers";

export type UnitTrend = {
  unitId: number;
  cylinderNo: number;
  points: { linerHours: number; maxWearMm: number | null; steady: boolean }[];
  fit: PredictionFit | null;
  wearRate: number | null;
  /** Share of the units of the same profile, fleet-wide, wearing at or below this rate (0–1). */
  percentile: number | null;
  /** How many units of the profile the rank is among. */
  among: number;
};

const parsed = <T>(v: unknown): T | null => (v === null || v === undefined ? null : typeof v === "string" ? (JSON.parse(v) as T) : (v as T));

/**
 * Every unit's stored wear trend on one engine, with its wear rate's percentile among all units
 * of the same engine profile across the fleet (only the rank crosses ships, never their figures).
 * The caller has checked the engine is on the person's vessels.
 */
export async function getEngineTrends(engineId: number, profileId: number): Promise<UnitTrend[]> {
  const [rows, rates] = await Promise.all([
    db("cylinder_units as u")
      .leftJoin("unit_analysis as a", "a.unit_id", "u.id")
      .where("u.engine_id", engineId)
      .orderBy("u.cylinder_no")
      .select("u.id as unitId", "u.cylinder_no as cylinderNo", db.raw("JSON_EXTRACT(a.detail, '$.points') as points"), "a.fit_json as fit", "a.wear_rate_mm_per_1000h as wearRate"),
    fleetRates(db, [profileId]),
  ]);
  const sorted = rates.get(profileId) ?? [];
  return rows.map((r: { unitId: number; cylinderNo: number; points: unknown; fit: unknown; wearRate: number | null }) => {
    const wearRate = r.wearRate === null ? null : Number(r.wearRate);
    const points = (parsed<{ linerHours: number; maxWearMm: number | null; steady: boolean }[]>(r.points) ?? []).map((p) => ({ linerHours: p.linerHours, maxWearMm: p.maxWearMm, steady: p.steady }));
    return { unitId: r.unitId, cylinderNo: r.cylinderNo, points, fit: parsed<PredictionFit>(r.fit), wearRate, percentile: ratePercentile(sorted, wearRate), among: sorted.length };
  });
}
