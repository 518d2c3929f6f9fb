import type { Knex } from "knex";
import { gapLinerIncrease, type RingInspection } from "@/lib/rings/rings";
import { temperatureCorrection } from "@/lib/wear/correction";
import type { RunningHoursEntry } from "@/lib/wear/calendar";
import type { Inspection } from "@/lib/wear/types";
import { loadProfiles, type ProfileRow } from "@/lib/profiles/queries";
import { asFittedGauging, correctedAsFittedReadings } from "@/lib/wear/as-fitted";
import type { UnitInput } from "./compute";
import { toGauging } from "./input";

/*
 * Loaders for the analysis, taking the connection as a parameter so a mutation can run
 * them inside its transaction and the benchmark can time them apart from the computing.
 * They read only approved inspections: the analysis is of the record, not of drafts.
 */

/**
 * The liner diameter increase where a gap was read in a worn part, referred to 20 °C with the
 * inspection's temperatures like its bore readings; a refused (under-nominal) diameter is passed
 * on as the negative figure, so the ring analysis reports it and uses the gap as measured.
 */
function increaseOf(
  profile: ProfileRow,
  i: { gauge_temp_c: unknown; liner_temp_c: unknown },
  diameterMm: number,
): number | null {
  const { factor } = temperatureCorrection(profile, i.gauge_temp_c == null ? null : Number(i.gauge_temp_c), i.liner_temp_c == null ? null : Number(i.liner_temp_c));
  const inc = gapLinerIncrease(profile.boreMm, diameterMm, factor);
  return inc.kind === "ok" ? inc.increaseMm : inc.kind === "invalid" ? diameterMm * factor - profile.boreMm : null;
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
          linerDiameterIncreaseMm: r.gapLinerDiameterMm === null ? null : increaseOf(profile, i, r.gapLinerDiameterMm),
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
