import "server-only";
import { db } from "@/lib/db/knex";

const num = (v: unknown) => (v === null || v === undefined ? null : Number(v));

export type LinerRow = {
  id: number;
  serial: string;
  installedOn: string;
  installedEngineHours: number;
  linerHoursAtInstall: number;
  removedOn: string | null;
  removedEngineHours: number | null;
  removalReason: string | null;
};

export type InspectionListRow = {
  id: number;
  linerId: number;
  inspectedOn: string;
  engineHours: number;
  linerHours: number;
  state: string;
  version: number;
  crew: string | null;
  source: string;
};

/** Liners of a unit, newest first. Caller has already checked vessel scope. */
export async function listLiners(unitId: number): Promise<LinerRow[]> {
  const rows = await db("liners")
    .where({ unit_id: unitId })
    .orderBy("installed_on", "desc")
    .select(
      "id",
      "serial",
      "installed_on as installedOn",
      "installed_engine_hours as installedEngineHours",
      "liner_hours_at_install as linerHoursAtInstall",
      "removed_on as removedOn",
      "removed_engine_hours as removedEngineHours",
      "removal_reason as removalReason",
    );
  return rows.map((r) => ({
    ...r,
    installedEngineHours: Number(r.installedEngineHours),
    linerHoursAtInstall: Number(r.linerHoursAtInstall),
    removedEngineHours: num(r.removedEngineHours),
  }));
}

/** Inspections of a unit (superseded versions included), newest first. */
export async function listInspections(unitId: number): Promise<InspectionListRow[]> {
  const rows = await db("inspections")
    .where({ unit_id: unitId })
    .orderBy([{ column: "inspected_on", order: "desc" }, { column: "version", order: "desc" }])
    .select(
      "id",
      "liner_id as linerId",
      "inspected_on as inspectedOn",
      "engine_hours as engineHours",
      "liner_hours as linerHours",
      "state",
      "version",
      "crew",
      "source",
    );
  return rows.map((r) => ({ ...r, engineHours: Number(r.engineHours), linerHours: Number(r.linerHours) }));
}
