import "server-only";
import type { Knex } from "knex";
import { canSeeVessel, whereVesselInScope } from "@/lib/auth/scope";
import type { CurrentUser } from "@/lib/auth/session";
import { db } from "@/lib/db/knex";
import { loadInspectionContext, readingsOf } from "./context-queries";
import { listPhotos } from "./photo-queries";
import { iso, num } from "./row-values";
import type { ChecklistInput, InspectionDraft, InspectionDto, InspectionState } from "./schemas";
import { emptyChecklist } from "./schemas";

type Conn = Knex | Knex.Transaction;



/** The vessel a unit belongs to, or null when the unit does not exist. */
export async function getUnitVesselId(unitId: number, conn: Conn = db): Promise<number | null> {
  const row = await conn("cylinder_units as u").join("main_engines as e", "e.id", "u.engine_id").where("u.id", unitId).first("e.vessel_id as vesselId");
  return row ? Number(row.vesselId) : null;
}

/** The vessel an inspection belongs to, or null when the inspection does not exist. */
export async function getInspectionVesselId(inspectionId: number, conn: Conn = db): Promise<number | null> {
  const row = await conn("inspections as i")
    .join("cylinder_units as u", "u.id", "i.unit_id")
    .join("main_engines as e", "e.id", "u.engine_id")
    .where("i.id", inspectionId)
    .first("e.vessel_id as vesselId");
  return row ? Number(row.vesselId) : null;
}

const INSPECTION_COLUMNS = [
  "i.id",
  "i.unit_id",
  "i.liner_id",
  "i.inspected_on",
  "i.engine_hours",
  "i.liner_hours",
  "i.liner_hours_reason",
  "i.crew",
  "i.gauge_temp_c",
  "i.liner_temp_c",
  "i.state",
  "i.version",
  "i.supersedes_id",
  "i.amendment_reason",
  "i.revision",
  "i.last_save_id",
  "i.notes",
  "i.return_comment",
  "i.created_by",
  "i.submitted_by",
  "i.submitted_at",
  "i.approved_by",
  "i.approved_at",
  "i.source",
  "i.created_at",
  "i.updated_at",
  "e.vessel_id",
] as const;

export type InspectionRow = {
  id: number;
  unitId: number;
  linerId: number;
  vesselId: number;
  state: InspectionState;
  version: number;
  revision: number;
  supersedesId: number | null;
  inspectedOn: string;
  createdBy: string;
};

/** The bare row (for locking and guards inside a transaction); `forUpdate` locks it. */
export async function getInspectionRow(conn: Conn, id: number, forUpdate = false): Promise<InspectionRow | null> {
  const q = conn("inspections as i")
    .join("cylinder_units as u", "u.id", "i.unit_id")
    .join("main_engines as e", "e.id", "u.engine_id")
    .where("i.id", id)
    .first("i.id", "i.unit_id", "i.liner_id", "i.state", "i.version", "i.revision", "i.supersedes_id", "i.inspected_on", "i.created_by", "e.vessel_id");
  if (forUpdate) q.forUpdate();
  const r = await q;
  if (!r) return null;
  return {
    id: r.id,
    unitId: r.unit_id,
    linerId: r.liner_id,
    vesselId: r.vessel_id,
    state: r.state,
    version: r.version,
    revision: r.revision,
    supersedesId: r.supersedes_id,
    inspectedOn: r.inspected_on,
    createdBy: r.created_by,
  };
}

function checklistFromRows(rows: { item_key: string; kind: string; label: string; count_in: number | null; count_out: number | null; value_number: unknown; done: number | boolean; signed_name: string | null; signed_at: unknown; note: string | null }[]): ChecklistInput {
  const c = emptyChecklist();
  for (const r of rows) {
    if (r.kind === "tally") c.tally.push({ key: r.item_key, label: r.label, countIn: r.count_in, countOut: r.count_out });
    else if (r.item_key === "closing_inspection") c.closing = { signedName: r.signed_name, signedAt: iso(r.signed_at) };
    else if (r.item_key === "rod_nut_pressure") c.rodNutPressureBar = num(r.value_number);
    else if (r.item_key === "stuffing_box") c.stuffingBox = { done: !!r.done, note: r.note };
    else if (r.item_key === "cylinder_lubrication") c.cylinderLubrication = { done: !!r.done, note: r.note };
  }
  return c;
}

/** One inspection with its readings, rings, checklist and photos. Vessel scope is the caller's job. */
export async function getInspectionDto(id: number, conn: Conn = db): Promise<InspectionDto | null> {
  const i = await conn("inspections as i")
    .join("cylinder_units as u", "u.id", "i.unit_id")
    .join("main_engines as e", "e.id", "u.engine_id")
    .where("i.id", id)
    .first(...INSPECTION_COLUMNS);
  if (!i) return null;
  const [readings, rings, checklist, photos, people, successor] = await Promise.all([
    readingsOf(conn, id),
    conn("ring_readings")
      .where({ inspection_id: id })
      .orderBy("ring_position")
      .select("ring_position", "closed_gap_mm", "gap_measured_in", "gap_liner_diameter_mm", "groove_clearance_mm", "renewed", "condition"),
    conn("checklist_entries")
      .where({ inspection_id: id })
      .orderBy("id")
      .select("item_key", "kind", "label", "count_in", "count_out", "value_number", "done", "signed_name", "signed_at", "note"),
    listPhotos(id, conn),
    conn("user").whereIn("id", [i.created_by, i.submitted_by, i.approved_by].filter(Boolean)).select("id", "name"),
    conn("inspections").where({ supersedes_id: id }).orderBy("id", "desc").first("id"),
  ]);
  const person = (uid: string | null) => (uid ? { id: uid, name: people.find((p) => p.id === uid)?.name ?? "(removed user)" } : null);
  const draft: InspectionDraft = {
    header: {
      inspectedOn: i.inspected_on,
      engineHours: Number(i.engine_hours),
      linerHours: Number(i.liner_hours),
      linerHoursReason: i.liner_hours_reason,
      crew: i.crew,
      gaugeTempC: num(i.gauge_temp_c),
      linerTempC: num(i.liner_temp_c),
      notes: i.notes,
    },
    readings: readings.map((r) => ({
      stationKey: r.station_key,
      axisKey: r.axis_key,
      diameterMm: Number(r.diameter_mm),
      enteredUnit: r.entered_unit,
      warningConfirmed: r.warning_confirmed,
    })),
    rings: rings.map((r) => ({
      position: r.ring_position,
      closedGapMm: num(r.closed_gap_mm),
      gapMeasuredIn: r.gap_measured_in,
      gapLinerDiameterMm: num(r.gap_liner_diameter_mm),
      grooveClearanceMm: num(r.groove_clearance_mm),
      renewed: !!r.renewed,
      condition: r.condition,
    })),
    checklist: checklistFromRows(checklist),
  };
  return {
    id: i.id,
    unitId: i.unit_id,
    linerId: i.liner_id,
    vesselId: i.vessel_id,
    state: i.state,
    version: i.version,
    revision: i.revision,
    lastSaveId: i.last_save_id ?? null,
    supersedesId: i.supersedes_id,
    supersededById: successor?.id ?? null,
    amendmentReason: i.amendment_reason,
    returnComment: i.return_comment,
    source: i.source,
    draft,
    createdBy: person(i.created_by),
    submittedBy: person(i.submitted_by),
    submittedAt: iso(i.submitted_at),
    approvedBy: person(i.approved_by),
    approvedAt: iso(i.approved_at),
    createdAt: iso(i.created_at)!,
    updatedAt: iso(i.updated_at)!,
    photos,
  };
}

/** An inspection with its context for a signed-in user, or null when it is missing or outside their vessels. */
export async function getInspectionForUser(user: CurrentUser, id: number) {
  const dto = await getInspectionDto(id);
  if (!dto || !canSeeVessel(user, dto.vesselId)) return null;
  const context = await loadInspectionContext(db, dto.unitId, {
    inspection: { id: dto.id, linerId: dto.linerId, supersedesId: dto.supersedesId, inspectedOn: dto.draft.header.inspectedOn },
  });
  if (!context) return null;
  return { inspection: dto, context };
}

/** The context for a new inspection of a unit the user may see, or null. */
export async function getNewInspectionContext(user: CurrentUser, unitId: number, inspectedOn?: string) {
  const vesselId = await getUnitVesselId(unitId);
  if (vesselId === null || !canSeeVessel(user, vesselId)) return null;
  return loadInspectionContext(db, unitId, { inspectedOn });
}

/** Open drafts of a unit (so the new-inspection page can offer to continue one). */
export async function listOpenInspections(unitId: number) {
  return db("inspections")
    .where({ unit_id: unitId })
    .whereIn("state", ["draft", "submitted", "returned"])
    .orderBy("updated_at", "desc")
    .select("id", "inspected_on as inspectedOn", "state", "version", "supersedes_id as supersedesId", "updated_at as updatedAt") as Promise<
    { id: number; inspectedOn: string; state: InspectionState; version: number; supersedesId: number | null; updatedAt: Date }[]
  >;
}

/** Units of the user's vessels with their current liner, for choosing what to inspect. */
export async function listUnitsToInspect(user: CurrentUser) {
  const q = db("cylinder_units as u")
    .join("main_engines as e", "e.id", "u.engine_id")
    .join("vessels as v", "v.id", "e.vessel_id")
    .leftJoin("liners as l", function () {
      this.on("l.unit_id", "u.id").andOnNull("l.removed_on");
    })
    .leftJoin("unit_analysis as a", "a.unit_id", "u.id")
    .whereNull("v.archived_at")
    .orderBy(["v.name", "e.id", "u.cylinder_no"])
    .select(
      "u.id",
      "u.cylinder_no as cylinderNo",
      "u.next_overhaul_engine_hours as nextOverhaulEngineHours",
      "e.id as engineId",
      "e.serial as engineSerial",
      "v.id as vesselId",
      "v.name as vesselName",
      "l.serial as linerSerial",
      "a.last_inspected_on as lastInspectedOn",
    );
  const rows = await whereVesselInScope(q, user, "v.id");
  return rows.map((r) => ({ ...r, nextOverhaulEngineHours: num(r.nextOverhaulEngineHours) })) as {
    id: number;
    cylinderNo: number;
    nextOverhaulEngineHours: number | null;
    engineId: number;
    engineSerial: string;
    vesselId: number;
    vesselName: string;
    linerSerial: string | null;
    lastInspectedOn: string | null;
  }[];
}
