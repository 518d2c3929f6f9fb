import "server-only";
import { loadProfiles } from "@/lib/analysis/load";
import type { Knex } from "knex";
import type { UnitSummary } from "@/lib/analysis/compute";
import type { CurrentUser } from "@/lib/auth/session";
import { db } from "@/lib/db/knex";
import type { ContextProfile, InspectionContext, PreviousInspection } from "./context";
import type { ChecklistInput, InspectionDraft, InspectionDto, InspectionState, PhotoDto } from "./schemas";
import { emptyChecklist } from "./schemas";

type Conn = Knex | Knex.Transaction;

// Same rule as canSeeVessel in lib/auth/session.ts, kept here so scripts can load this module without Next.js.
const canSeeVessel = (user: CurrentUser, vesselId: number) => user.vessels === "all" || user.vessels.includes(vesselId);

const num = (v: unknown) => (v === null || v === undefined ? null : Number(v));
const iso = (v: unknown) => (v == null ? null : v instanceof Date ? v.toISOString() : new Date(String(v)).toISOString());

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

async function loadProfile(conn: Conn, profileId: number): Promise<ContextProfile | null> {
  return (await loadProfiles(conn, [profileId])).get(profileId) ?? null;
}

async function readingsOf(conn: Conn, inspectionId: number) {
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
    const first = await conn("inspections")
      .where({ liner_id: liner.id, state: "approved" })
      .whereNot("id", options.inspection?.id ?? 0)
      .orderBy("inspected_on", "asc")
      .first("id");
    if (first) {
      asFitted = (await readingsOf(conn, first.id)).map((r) => ({ stationKey: r.station_key, axisKey: r.axis_key, diameterMm: Number(r.diameter_mm) }));
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

export async function listPhotos(inspectionId: number, conn: Conn = db): Promise<PhotoDto[]> {
  const rows = await conn("inspection_photos as p")
    .join("stored_files as f", "f.id", "p.file_id")
    .leftJoin("profile_stations as s", "s.id", "p.station_id")
    .where("p.inspection_id", inspectionId)
    .where("f.status", "stored")
    .orderBy("p.id")
    .select(
      "p.id",
      "p.caption",
      "s.station_key",
      "p.ring_position",
      "p.thumbnail_file_id",
      "p.created_at",
      "f.content_type",
      "f.size_bytes",
      "f.sha256",
      "f.original_name",
    );
  return rows.map((r) => ({
    id: r.id,
    caption: r.caption,
    stationKey: r.station_key ?? null,
    ringPosition: r.ring_position,
    contentType: r.content_type,
    sizeBytes: Number(r.size_bytes),
    sha256: r.sha256,
    originalName: r.original_name,
    hasThumbnail: r.thumbnail_file_id != null,
    createdAt: iso(r.created_at)!,
  }));
}

/** The stored objects behind one photo of one inspection. */
export async function getPhotoObjects(inspectionId: number, photoId: number, conn: Conn = db) {
  const r = await conn("inspection_photos as p")
    .join("stored_files as f", "f.id", "p.file_id")
    .leftJoin("stored_files as t", "t.id", "p.thumbnail_file_id")
    .where({ "p.id": photoId, "p.inspection_id": inspectionId })
    .first("p.id", "p.file_id", "p.thumbnail_file_id", "f.object_key", "f.content_type", "f.status", "f.original_name", "t.object_key as thumb_key");
  if (!r) return null;
  return {
    id: r.id as number,
    fileId: r.file_id as number,
    thumbnailFileId: (r.thumbnail_file_id as number | null) ?? null,
    objectKey: r.object_key as string,
    contentType: r.content_type as string,
    status: r.status as string,
    originalName: (r.original_name as string | null) ?? null,
    thumbKey: (r.thumb_key as string | null) ?? null,
  };
}

/** A pending upload's ledger row, for the "complete" step. */
export async function getPendingFile(fileId: number, conn: Conn = db) {
  return conn("stored_files")
    .where({ id: fileId })
    .first("id", "object_key", "kind", "content_type", "size_bytes", "status", "vessel_id", "uploaded_by", "original_name") as Promise<
    | {
        id: number;
        object_key: string;
        kind: string;
        content_type: string;
        size_bytes: number;
        status: string;
        vessel_id: number | null;
        uploaded_by: string | null;
        original_name: string | null;
      }
    | undefined
  >;
}

export type AuditRow = { id: number; at: string; actorName: string | null; action: string; entityId: string; detail: Record<string, unknown> | null };

/** The audit trail of an inspection and every version in its amendment chain, oldest first. */
export async function listInspectionAudit(inspectionId: number, conn: Conn = db): Promise<AuditRow[]> {
  const ids = new Set<number>([inspectionId]);
  // Walk back to the first version and forward to the newest, so each version shows the whole story.
  let cursor: number | null = inspectionId;
  for (let i = 0; cursor && i < 50; i++) {
    const r: { supersedes_id: number | null } | undefined = await conn("inspections").where({ id: cursor }).first("supersedes_id");
    cursor = r?.supersedes_id ?? null;
    if (cursor) ids.add(cursor);
  }
  let frontier = [...ids];
  for (let i = 0; frontier.length && i < 50; i++) {
    const next = (await conn("inspections").whereIn("supersedes_id", frontier).select("id")).map((r) => r.id as number).filter((id) => !ids.has(id));
    next.forEach((id) => ids.add(id));
    frontier = next;
  }
  const rows = await conn("audit_log")
    .where("entity_type", "inspection")
    .whereIn("entity_id", [...ids].map(String))
    .orderBy([{ column: "at" }, { column: "id" }])
    .select("id", "at", "actor_name", "action", "entity_id", "detail");
  return rows.map((r) => ({
    id: Number(r.id),
    at: iso(r.at)!,
    actorName: r.actor_name,
    action: r.action,
    entityId: r.entity_id,
    detail: typeof r.detail === "string" ? JSON.parse(r.detail) : r.detail,
  }));
}

/** The unit's stored analysis (band, rates, projections), as the fleet screens read it. */
export async function getStoredUnitSummary(unitId: number, conn: Conn = db): Promise<UnitSummary | null> {
  const r = await conn("unit_analysis").where({ unit_id: unitId }).first("summary");
  if (!r) return null;
  return (typeof r.summary === "string" ? JSON.parse(r.summary) : r.summary) as UnitSummary;
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
  if (user.vessels !== "all") q.whereIn("v.id", user.vessels.length ? user.vessels : [-1]);
  const rows = await q;
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
