import type { Knex } from "knex";
import type { ContextProfile } from "@/lib/inspections/context";
import type { StationRole, WearProfile } from "@/lib/wear/types";

/*
 * Engine profiles (the maker's figures an admin typed in) as the analysis, the entry form and
 * the screens use them. Takes the connection as a parameter so a mutation can read them inside
 * its transaction and the scripts can use them without the app's pool.
 */

/** An engine profile as both the analysis and the entry form use it. */
export type ProfileRow = WearProfile & ContextProfile & { overhaulIntervalHours: number };

/** Every engine profile with its stations and rings (a handful of rows). */
export async function loadProfiles(db: Knex | Knex.Transaction, ids?: number[]): Promise<Map<number, ProfileRow>> {
  const pq = db("engine_profiles").select(
    "id",
    "name",
    "designation",
    "bore_mm",
    "liner_wear_limit_mm",
    "ovality_limit_mm",
    "wear_reference",
    "temperature_correction",
    "alpha_liner_per_k",
    "alpha_gauge_per_k",
    "running_in_hours",
    "min_points_for_projection",
    "axis_a_key",
    "axis_a_label",
    "axis_b_key",
    "axis_b_label",
    "overhaul_interval_hours",
    "rod_nut_pressure_bar",
    "rod_nut_tolerance_pct",
  );
  if (ids) pq.whereIn("id", ids);
  const profiles = await pq;
  const pids = profiles.map((p) => p.id);
  const [stations, rings] = await Promise.all([
    db("profile_stations").whereIn("profile_id", pids).orderBy(["profile_id", "position"]).select("id", "profile_id", "station_key", "label", "depth_mm", "role"),
    db("profile_rings")
      .whereIn("profile_id", pids)
      .orderBy(["profile_id", "position"])
      .select("profile_id", "position", "label", "gap_new_min_mm", "gap_new_max_mm", "gap_limit_mm", "groove_new_min_mm", "groove_new_max_mm", "groove_limit_mm"),
  ]);
  const out = new Map<number, ProfileRow>();
  for (const p of profiles) {
    out.set(p.id, {
      id: p.id,
      name: p.name,
      designation: p.designation,
      boreMm: Number(p.bore_mm),
      linerWearLimitMm: Number(p.liner_wear_limit_mm),
      ovalityLimitMm: Number(p.ovality_limit_mm),
      wearReference: p.wear_reference,
      temperatureCorrection: !!p.temperature_correction,
      alphaLinerPerK: Number(p.alpha_liner_per_k),
      alphaGaugePerK: Number(p.alpha_gauge_per_k),
      runningInHours: Number(p.running_in_hours),
      minPointsForProjection: Number(p.min_points_for_projection),
      overhaulIntervalHours: Number(p.overhaul_interval_hours),
      rodNutPressureBar: p.rod_nut_pressure_bar === null ? null : Number(p.rod_nut_pressure_bar),
      rodNutTolerancePct: p.rod_nut_tolerance_pct == null ? null : Number(p.rod_nut_tolerance_pct),
      axes: [
        { key: p.axis_a_key, label: p.axis_a_label },
        { key: p.axis_b_key, label: p.axis_b_label },
      ],
      stations: stations
        .filter((s) => s.profile_id === p.id)
        .map((s) => ({ id: s.id, key: s.station_key, label: s.label, depthMm: Number(s.depth_mm), role: s.role as StationRole })),
      rings: rings
        .filter((r) => r.profile_id === p.id)
        .map((r) => ({
          position: r.position,
          label: r.label,
          gapNewMinMm: Number(r.gap_new_min_mm),
          gapNewMaxMm: Number(r.gap_new_max_mm),
          gapLimitMm: Number(r.gap_limit_mm),
          grooveNewMinMm: Number(r.groove_new_min_mm),
          grooveNewMaxMm: Number(r.groove_new_max_mm),
          grooveLimitMm: Number(r.groove_limit_mm),
        })),
    });
  }
  return out;
}

