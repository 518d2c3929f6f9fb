import "server-only";
import type { Knex } from "knex";
import type { CurrentUser } from "@/lib/auth/session";
import { whereVesselInScope } from "@/lib/auth/scope";
import { db } from "@/lib/db/knex";

/** Limits a query joined to `main_engines as e` to the user's vessels. */
const inScope = (q: Knex.QueryBuilder, user: CurrentUser) => whereVesselInScope(q, user, "e.vessel_id");

export type HomeInspectionRow = {
  id: number;
  unitId: number;
  cylinderNo: number;
  vesselName: string;
  inspectedOn: string;
  state: string;
  byName: string | null;
  at: string | null;
  returnComment: string | null;
};

const inspectionColumns = [
  "i.id",
  "i.unit_id as unitId",
  "u.cylinder_no as cylinderNo",
  "v.name as vesselName",
  "i.inspected_on as inspectedOn",
  "i.state",
  "i.return_comment as returnComment",
];

function inspectionBase(user: CurrentUser) {
  return inScope(
    db("inspections as i")
      .join("cylinder_units as u", "u.id", "i.unit_id")
      .join("main_engines as e", "e.id", "u.engine_id")
      .join("vessels as v", "v.id", "e.vessel_id"),
    user,
  );
}

const toIso = (d: unknown) => (d ? new Date(d as string).toISOString() : null);

function submittedRows(user: CurrentUser, limit: number, narrow: (q: Knex.QueryBuilder) => void): Promise<HomeInspectionRow[]> {
  // Records from an import of past records are approved with their import (the imports page lists those).
  const q = inspectionBase(user).leftJoin("user as s", "s.id", "i.submitted_by").where("i.state", "submitted").whereNull("i.import_id");
  narrow(q);
  return q
    .orderBy("i.submitted_at", "asc")
    .limit(limit)
    .select([...inspectionColumns, "s.name as byName", "i.submitted_at as at"])
    .then((rows: HomeInspectionRow[]) => rows.map((r) => ({ ...r, at: toIso(r.at) })));
}

/** Neither entered nor submitted by `userId` (lib/inspections/approval.ts says why). */
const notTheirOwn = (q: Knex.QueryBuilder, userId: string) =>
  q.whereNot("i.created_by", userId).where((w) => w.whereNull("i.submitted_by").orWhereNot("i.submitted_by", userId));

/**
 * Records submitted on the chief's vessels that he may approve, oldest first: not the
 * ones he entered or submitted himself.
 */
export async function listAwaitingApproval(user: CurrentUser, limit = 50): Promise<HomeInspectionRow[]> {
  return submittedRows(user, limit, (q) => notTheirOwn(q, user.id));
}

/** The chief's own submitted records: waiting for another chief of the vessel or the superintendent. */
export async function listAwaitingSomeoneElse(user: CurrentUser, limit = 50): Promise<HomeInspectionRow[]> {
  return submittedRows(user, limit, (q) => q.where((w) => w.where("i.created_by", user.id).orWhere("i.submitted_by", user.id)));
}

/**
 * The superintendent's queue: records on his vessels that no chief engineer assigned to
 * the vessel may approve, because every one of them entered or submitted it (typically a
 * chief who gauged and submitted himself).
 */
export async function listAwaitingSuperintendent(user: CurrentUser, limit = 50): Promise<HomeInspectionRow[]> {
  return submittedRows(user, limit, (q) => {
    notTheirOwn(q, user.id).whereNotExists(
      db("user_vessels as uv")
        .join("user as c", "c.id", "uv.user_id")
        .whereRaw("uv.vessel_id = e.vessel_id")
        .where("c.role", "chief_engineer")
        .where((w) => w.whereNull("c.banned").orWhere("c.banned", false))
        .whereRaw("c.id <> i.created_by")
        .whereRaw("(i.submitted_by IS NULL OR c.id <> i.submitted_by)")
        .select(db.raw("1")),
    );
  });
}

/** The user's own drafts and returned records, newest change first. */
export async function listMyDrafts(user: CurrentUser, limit = 50): Promise<HomeInspectionRow[]> {
  const rows = await inspectionBase(user)
    .where("i.created_by", user.id)
    .whereIn("i.state", ["draft", "returned"])
    .orderBy("i.updated_at", "desc")
    .limit(limit)
    .select([...inspectionColumns, db.raw("NULL as byName"), "i.updated_at as at"]);
  return rows.map((r: HomeInspectionRow) => ({ ...r, at: toIso(r.at) }));
}

export type HomeUnitRow = {
  unitId: number;
  cylinderNo: number;
  band: string | null;
  maxWearMm: number | null;
  limitOn: string | null;
  lastInspectedOn: string | null;
};

export type HomeEngine = {
  engineId: number;
  vesselId: number;
  vesselName: string;
  designation: string;
  linerWearLimitMm: number;
  units: HomeUnitRow[];
};

/** Main engines of the user's vessels with each unit's current band. */
export async function listEnginesWithUnits(user: CurrentUser): Promise<HomeEngine[]> {
  const rows = await inScope(
    db("cylinder_units as u")
      .join("main_engines as e", "e.id", "u.engine_id")
      .join("vessels as v", "v.id", "e.vessel_id")
      .join("engine_profiles as p", "p.id", "e.profile_id")
      .leftJoin("unit_analysis as a", "a.unit_id", "u.id")
      .whereNull("v.archived_at")
      .orderBy(["v.name", "e.id", "u.cylinder_no"]),
    user,
  ).select(
    "e.id as engineId",
    "v.id as vesselId",
    "v.name as vesselName",
    "p.designation",
    "p.liner_wear_limit_mm as linerWearLimitMm",
    "u.id as unitId",
    "u.cylinder_no as cylinderNo",
    "a.band",
    "a.max_wear_mm as maxWearMm",
    "a.limit_on as limitOn",
    "a.last_inspected_on as lastInspectedOn",
  );
  const engines = new Map<number, HomeEngine>();
  for (const r of rows) {
    if (!engines.has(r.engineId)) {
      engines.set(r.engineId, {
        engineId: r.engineId,
        vesselId: r.vesselId,
        vesselName: r.vesselName,
        designation: r.designation,
        linerWearLimitMm: Number(r.linerWearLimitMm),
        units: [],
      });
    }
    engines.get(r.engineId)!.units.push({
      unitId: r.unitId,
      cylinderNo: r.cylinderNo,
      band: r.band,
      maxWearMm: r.maxWearMm === null ? null : Number(r.maxWearMm),
      limitOn: r.limitOn,
      lastInspectedOn: r.lastInspectedOn,
    });
  }
  return [...engines.values()];
}
