import type { Knex } from "knex";
import type { RingInspection } from "@/lib/rings/rings";
import type { RunningHoursEntry } from "@/lib/wear/calendar";
import type { ContextProfile } from "@/lib/inspections/context";
import type { Inspection, StationRole, WearProfile } from "@/lib/wear/types";
import { asFittedGauging, correctedAsFittedReadings } from "@/lib/wear/as-fitted";
import type { UnitInput } from "./compute";
import { toGauging } from "./input";

/*
 * Loaders for the analysis, taking the connection as a parameter so a mutation can run
 * them inside its transaction and the benchmark can time them apart from the computing.
 * They read only approved inspections: the analysis is of the record, not of drafts.
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

export type LoadedEngineUnits = { units: UnitInput[]; profiles: Map<number, ProfileRow> };

/**
 * The analysis inputs of every unit of the given engines, in a fixed number of queries
 * however many units there are.
 */
export async function loadUnitInputs(
  db: Knex | Knex.Transaction,
  filter: { engineIds?: number[]; unitIds?: number[] },
  profileCache?: Map<number, ProfileRow>,
): Promise<LoadedEngineUnits> {
  const uq = db("cylinder_units as u")
    .join("main_engines as e", "e.id", "u.engine_id")
    .leftJoin("liners as l", function () {
      this.on("l.unit_id", "u.id").andOnNull("l.removed_on");
    })
    .select("u.id", "u.engine_id", "u.next_overhaul_engine_hours", "e.profile_id", "l.id as liner_id");
  if (filter.engineIds) uq.whereIn("u.engine_id", filter.engineIds);
  if (filter.unitIds) uq.whereIn("u.id", filter.unitIds);
  const units = await uq;
  if (!units.length) return { units: [], profiles: profileCache ?? new Map() };

  const profiles = profileCache ?? (await loadProfiles(db, [...new Set(units.map((u) => u.profile_id as number))]));
  const unitIds = units.map((u) => u.id as number);
  const engineIds = [...new Set(units.map((u) => u.engine_id as number))];

  const [inspections, log] = await Promise.all([
    db("inspections")
      .whereIn("unit_id", unitIds)
      .where("state", "approved")
      .select("id", "unit_id", "liner_id", "inspected_on", "engine_hours", "liner_hours", "gauge_temp_c", "liner_temp_c"),
    db("running_hours_log").whereIn("engine_id", engineIds).orderBy(["engine_id", "logged_on"]).select("engine_id", "logged_on", "engine_hours"),
  ]);
  const inspIds = inspections.map((i) => i.id as number);
  const [readings, rings] = inspIds.length
    ? await Promise.all([
        db("liner_readings as r")
          .join("profile_stations as s", "s.id", "r.station_id")
          .whereIn("r.inspection_id", inspIds)
          .select("r.inspection_id", "s.station_key", "r.axis_key", "r.diameter_mm"),
        db("ring_readings")
          .whereIn("inspection_id", inspIds)
          .select("inspection_id", "ring_position", "closed_gap_mm", "gap_measured_in", "gap_liner_diameter_mm", "groove_clearance_mm", "renewed"),
      ])
    : [[], []];

  const readingsByInsp = new Map<number, Inspection["readings"]>();
  for (const r of readings) {
    let list = readingsByInsp.get(r.inspection_id);
    if (!list) readingsByInsp.set(r.inspection_id, (list = []));
    list.push({ stationKey: r.station_key, axisKey: r.axis_key, diameterMm: Number(r.diameter_mm) });
  }
  // The liner diameter where a gap was read in a worn part is kept as read; the increase
  // over nominal needs the unit's profile, so it is worked out per unit below.
  type RingRow = RingInspection["readings"][number] & { gapLinerDiameterMm: number | null };
  const ringsByInsp = new Map<number, RingRow[]>();
  for (const r of rings) {
    let list = ringsByInsp.get(r.inspection_id);
    if (!list) ringsByInsp.set(r.inspection_id, (list = []));
    list.push({
      position: r.ring_position,
      closedGapMm: r.closed_gap_mm === null ? null : Number(r.closed_gap_mm),
      gapMeasuredIn: r.gap_measured_in,
      gapLinerDiameterMm: r.gap_liner_diameter_mm === null ? null : Number(r.gap_liner_diameter_mm),
      grooveClearanceMm: r.groove_clearance_mm === null ? null : Number(r.groove_clearance_mm),
      renewed: !!r.renewed,
    });
  }
  const logByEngine = new Map<number, RunningHoursEntry[]>();
  for (const l of log) {
    let list = logByEngine.get(l.engine_id);
    if (!list) logByEngine.set(l.engine_id, (list = []));
    list.push({ date: l.logged_on, engineHours: Number(l.engine_hours) });
  }
  const inspByUnit = new Map<number, typeof inspections>();
  for (const i of inspections) {
    let list = inspByUnit.get(i.unit_id);
    if (!list) inspByUnit.set(i.unit_id, (list = []));
    list.push(i);
  }

  const out: UnitInput[] = units.map((u) => {
    const profile = profiles.get(u.profile_id)!;
    const all = inspByUnit.get(u.id) ?? [];
    const ofLiner = all.filter((i) => i.liner_id === u.liner_id);
    const toInspection = (i: (typeof all)[number]): Inspection =>
      toGauging(
        i.id,
        {
          inspectedOn: i.inspected_on,
          engineHours: Number(i.engine_hours),
          linerHours: Number(i.liner_hours),
          gaugeTempC: i.gauge_temp_c === null ? null : Number(i.gauge_temp_c),
          linerTempC: i.liner_temp_c === null ? null : Number(i.liner_temp_c),
        },
        readingsByInsp.get(i.id) ?? [],
      );
    const linerInspections = ofLiner.map(toInspection);
    // The same as-fitted rule as the sheet and the record: the earliest approved gauging, corrected to 20 °C.
    const reference = profile.wearReference === "as_fitted" ? asFittedGauging(linerInspections) : null;
    const asFitted = reference ? correctedAsFittedReadings(profile, reference) : undefined;
    return {
      unitId: u.id,
      linerId: u.liner_id,
      profile,
      inspections: linerInspections,
      asFittedReadings: asFitted,
      ringInspections: all.map((i) => ({
        inspectionId: String(i.id),
        engineHours: Number(i.engine_hours),
        // Built field by field: object spread in this loop (every ring of every inspection) is slow in V8.
        readings: (ringsByInsp.get(i.id) ?? []).map((r) => ({
          position: r.position,
          closedGapMm: r.closedGapMm,
          gapMeasuredIn: r.gapMeasuredIn,
          linerDiameterIncreaseMm: r.gapLinerDiameterMm === null ? null : r.gapLinerDiameterMm - profile.boreMm,
          grooveClearanceMm: r.grooveClearanceMm,
          renewed: r.renewed,
        })),
      })),
      hoursLog: logByEngine.get(u.engine_id) ?? [],
      nextOverhaulEngineHours: u.next_overhaul_engine_hours === null ? null : Number(u.next_overhaul_engine_hours),
      overhaulIntervalHours: profile.overhaulIntervalHours,
    };
  });
  return { units: out, profiles };
}
