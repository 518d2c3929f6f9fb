import "server-only";
import type { Knex } from "knex";
import { loadProfiles } from "@/lib/profiles/queries";
import type { ContextProfile, InspectionContext, PreviousInspection } from "./context";
import { num } from "./row-values";

type Conn = Knex | Knex.Transaction;

async function loadProfile(conn: Conn, profileId: number): Promise<ContextProfile | null> {
  return (await loadProfiles(conn, [profileId])).get(profileId) ?? null;
}

/** One inspection's liner readings in the profile's order (station by station, first direction first). */
export async function readingsOf(conn: Conn, inspectionId: number) {
  return conn("liner_readings as r")
    .join("profile_stations as s", "s.id", "r.station_id")
    .join("engine_profiles as p", "p.id", "s.profile_id")
    .where("r.inspection_id", inspectionId)
    // the profile's order: station by station, its first direction before its second
    .orderByRaw("s.position, r.axis_key = p.axis_b_key")
    .select("s.station_key", "r.axis_key", "r.diameter_mm", "r.entered_unit", "r.warning_confirmed");
}

export type ContextOptions = {
  /** The inspection the context is for (its own liner; itself and what it amends are not "previous"). */
  inspection?: { id: number; linerId: number; supersedesId: number | null; inspectedOn: string };
  /** For a new inspection: its date, so "previous" is the latest approved one on or before it. */
  inspectedOn?: string;
};

/**
 * The unit's profile, liner, previous approved inspection and recent running-hours log.
 * Null when the unit does not exist or has no liner fitted. Vessel scope is the caller's job.
 */
export async function loadInspectionContext(conn: Conn, unitId: number, options: ContextOptions = {}): Promise<InspectionContext | null> {
  const unit = await conn("cylinder_units as u")
    .join("main_engines as e", "e.id", "u.engine_id")
    .join("vessels as v", "v.id", "e.vessel_id")
    .where("u.id", unitId)
    .first("u.id", "u.cylinder_no", "e.id as engine_id", "e.serial as engine_serial", "e.profile_id", "v.id as vessel_id", "v.name as vessel_name");
  if (!unit) return null;
  const linerQ = conn("liners").where({ unit_id: unitId });
  if (options.inspection) linerQ.where({ id: options.inspection.linerId });
  else linerQ.whereNull("removed_on").orderBy("installed_on", "desc");
  const [profile, liner] = await Promise.all([
    loadProfile(conn, unit.profile_id),
    linerQ.first("id", "serial", "installed_on", "installed_engine_hours", "liner_hours_at_install"),
  ]);
  if (!profile || !liner) return null;

  const exclude = [options.inspection?.id, options.inspection?.supersedesId].filter((v): v is number => typeof v === "number");
  const onOrBefore = options.inspection?.inspectedOn ?? options.inspectedOn ?? null;
  const prevQ = conn("inspections").where({ unit_id: unitId, state: "approved" });
  if (exclude.length) prevQ.whereNotIn("id", exclude);
  if (onOrBefore) prevQ.where("inspected_on", "<=", onOrBefore);
  const prevRow = await prevQ
    .orderBy([
      { column: "inspected_on", order: "desc" },
      { column: "engine_hours", order: "desc" },
    ])
    .first("id", "liner_id", "inspected_on", "engine_hours", "liner_hours", "gauge_temp_c", "liner_temp_c");
  let previous: PreviousInspection | null = null;
  if (prevRow) {
    const readings = await readingsOf(conn, prevRow.id);
    previous = {
      id: prevRow.id,
      linerId: prevRow.liner_id,
      inspectedOn: prevRow.inspected_on,
      engineHours: Number(prevRow.engine_hours),
      linerHours: Number(prevRow.liner_hours),
      gaugeTempC: num(prevRow.gauge_temp_c),
      linerTempC: num(prevRow.liner_temp_c),
      readings: readings.map((r) => ({ stationKey: r.station_key, axisKey: r.axis_key, diameterMm: Number(r.diameter_mm) })),
    };
  }

  const log = await conn("running_hours_log")
    .where({ engine_id: unit.engine_id })
    .orderBy("logged_on", "desc")
    .limit(60)
    .select("logged_on", "engine_hours");

  let asFitted: InspectionContext["asFitted"] = null;
  if (profile.wearReference === "as_fitted") {
    // Candidates for the as-fitted gauging, in the order of the as-fitted rule (lib/wear/as-fitted.ts);
    // this inspection itself is compared with it where the analysis input is built.
    const firstQ = conn("inspections").where({ liner_id: liner.id, state: "approved" });
    if (exclude.length) firstQ.whereNotIn("id", exclude);
    const first = await firstQ
      .orderBy([
        { column: "inspected_on", order: "asc" },
        { column: "liner_hours", order: "asc" },
        { column: "id", order: "asc" },
      ])
      .first("id", "inspected_on", "engine_hours", "liner_hours", "gauge_temp_c", "liner_temp_c");
    if (first) {
      asFitted = {
        id: String(first.id),
        date: first.inspected_on,
        engineHours: Number(first.engine_hours),
        linerHours: Number(first.liner_hours),
        gaugeTempC: num(first.gauge_temp_c),
        linerTempC: num(first.liner_temp_c),
        readings: (await readingsOf(conn, first.id)).map((r) => ({ stationKey: r.station_key, axisKey: r.axis_key, diameterMm: Number(r.diameter_mm) })),
      };
    }
  }

  return {
    unit: {
      id: unit.id,
      cylinderNo: unit.cylinder_no,
      engineId: unit.engine_id,
      engineSerial: unit.engine_serial,
      vesselId: unit.vessel_id,
      vesselName: unit.vessel_name,
    },
    profile,
    liner: {
      id: liner.id,
      serial: liner.serial,
      installedOn: liner.installed_on,
      installedEngineHours: Number(liner.installed_engine_hours),
      linerHoursAtInstall: Number(liner.liner_hours_at_install),
    },
    previous,
    hoursLog: log.reverse().map((l) => ({ date: l.logged_on, engineHours: Number(l.engine_hours) })),
    asFitted,
  };
}
