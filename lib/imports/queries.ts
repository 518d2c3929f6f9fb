import "server-only";
import type { Knex } from "knex";
import { db as defaultDb } from "@/lib/db/knex";
import { whereVesselInScope, type VesselScope } from "@/lib/auth/scope";
import { num } from "@/lib/inspections/row-values";
import { loadProfiles } from "@/lib/profiles/queries";
import type { ColumnMapping } from "./layout";
import type { CsvOptions } from "./parse";
import type { ImportContext, PriorGauging, RowIssue } from "./preview";
import type { ImportStatus } from "./schemas";

type Conn = Knex | Knex.Transaction;

const day = (v: unknown) => (v instanceof Date ? v.toISOString().slice(0, 10) : String(v).slice(0, 10));

/**
 * What the importer needs to know about one engine: its profile, units, every liner it has had,
 * the approved gaugings already on record (for "last time"), the days already holding a record,
 * and the whole running-hours log. A fixed number of queries however long the history.
 */
export async function loadImportContext(conn: Conn, engineId: number): Promise<ImportContext | null> {
  const engine = await conn("main_engines as e").join("vessels as v", "v.id", "e.vessel_id").where("e.id", engineId).first("e.id", "e.serial", "e.profile_id", "v.id as vessel_id", "v.name as vessel_name");
  if (!engine) return null;
  const profile = (await loadProfiles(conn, [engine.profile_id])).get(engine.profile_id);
  if (!profile) return null;
  const units = await conn("cylinder_units").where({ engine_id: engineId }).orderBy("cylinder_no").select("id", "cylinder_no");
  const unitIds = units.map((u) => u.id as number);
  const [liners, inspections, log] = await Promise.all([
    unitIds.length
      ? conn("liners").whereIn("unit_id", unitIds).select("id", "unit_id", "serial", "installed_on", "removed_on", "installed_engine_hours", "liner_hours_at_install")
      : [],
    unitIds.length
      ? conn("inspections")
          .whereIn("unit_id", unitIds)
          .whereNot("state", "superseded")
          .select("id", "unit_id", "liner_id", "state", "inspected_on", "engine_hours", "liner_hours", "gauge_temp_c", "liner_temp_c", "import_id")
      : [],
    conn("running_hours_log").where({ engine_id: engineId }).orderBy("logged_on").select("logged_on", "engine_hours"),
  ]);
  const approvedIds = inspections.filter((i) => i.state === "approved").map((i) => i.id as number);
  const readings = approvedIds.length
    ? await conn("liner_readings as r").join("profile_stations as s", "s.id", "r.station_id").whereIn("r.inspection_id", approvedIds).select("r.inspection_id", "s.station_key", "r.axis_key", "r.diameter_mm")
    : [];
  const readingsOf = new Map<number, PriorGauging["readings"]>();
  for (const r of readings) {
    let list = readingsOf.get(r.inspection_id);
    if (!list) readingsOf.set(r.inspection_id, (list = []));
    list.push({ stationKey: r.station_key, axisKey: r.axis_key, diameterMm: Number(r.diameter_mm) });
  }
  const prior: PriorGauging[] = inspections
    .filter((i) => i.state === "approved")
    .map((i) => ({
      id: i.id,
      unitId: i.unit_id,
      linerId: i.liner_id,
      importId: i.import_id ?? null,
      inspectedOn: day(i.inspected_on),
      engineHours: Number(i.engine_hours),
      linerHours: Number(i.liner_hours),
      gaugeTempC: num(i.gauge_temp_c),
      linerTempC: num(i.liner_temp_c),
      readings: readingsOf.get(i.id) ?? [],
    }))
    .sort((a, b) => (a.inspectedOn < b.inspectedOn ? -1 : a.inspectedOn > b.inspectedOn ? 1 : a.engineHours - b.engineHours));
  return {
    engine: { id: engine.id, serial: engine.serial, vesselId: engine.vessel_id, vesselName: engine.vessel_name },
    profile,
    units: units.map((u) => ({
      id: u.id,
      cylinderNo: u.cylinder_no,
      liners: liners
        .filter((l) => l.unit_id === u.id)
        .map((l) => ({
          id: l.id,
          serial: l.serial,
          installedOn: day(l.installed_on),
          removedOn: l.removed_on ? day(l.removed_on) : null,
          installedEngineHours: Number(l.installed_engine_hours),
          linerHoursAtInstall: Number(l.liner_hours_at_install),
        })),
    })),
    prior,
    existing: inspections.map((i) => ({ unitId: i.unit_id, inspectedOn: day(i.inspected_on), inspectionId: i.id, importId: i.import_id ?? null })),
    hoursLog: log.map((l) => ({ date: day(l.logged_on), engineHours: Number(l.engine_hours) })),
  };
}

/** The vessel of an import, or null when there is no such import. */
export async function getImportVesselId(importId: number, conn: Conn = defaultDb): Promise<number | null> {
  const row = await conn("gauge_imports").where({ id: importId }).first("vessel_id");
  return row ? Number(row.vessel_id) : null;
}

/** The vessel of an uploaded file, or null. */
export async function getUploadVesselId(fileId: number, conn: Conn = defaultDb): Promise<number | null> {
  const row = await conn("stored_files").where({ id: fileId, kind: "gauge_import" }).first("vessel_id");
  return row?.vessel_id ? Number(row.vessel_id) : null;
}

/** What the preview keeps for the screen: the summary, the first issues, the gaugings and sample readings. */
export type StoredPreview = {
  summary: string;
  rowCount: number;
  blankLines: number;
  commentLines: number;
  header: string[] | null;
  /** The first rows of the file as read, for the mapping screen. */
  sampleRows: { line: number; cells: string[] }[];
  errorLines: number[];
  issues: RowIssue[];
  issuesLeftOut: number;
  groups: { unitId: number; cylinderNo: number; inspectedOn: string; engineHours: number; linerHours: number; readings: number; rings: number; maxWearMm: number | null; firstLine: number; lastLine: number }[];
  groupsLeftOut: number;
  readings: { line: number; cylinderNo: number; inspectedOn: string; stationKey: string; axisKey: string; diameterMm: number; enteredUnit: "mm" | "in"; wearMm: number | null; warning: string | null }[];
  readingsLeftOut: number;
  /** For a draft: typed values the file would change (which, what is there, what the file says, its line). */
  overwrites: { what: string; typed: string; file: string; line: number }[];
};

export type ImportDto = {
  id: number;
  vesselId: number;
  vesselName: string;
  engineId: number | null;
  engineSerial: string | null;
  unitId: number | null;
  cylinderNo: number | null;
  inspectionId: number | null;
  destination: "draft" | "history";
  status: ImportStatus;
  fileId: number;
  fileName: string;
  sizeBytes: number;
  sha256: string;
  mapping: ColumnMapping;
  options: CsvOptions;
  excludedLines: number[];
  rowCount: number;
  errorCount: number;
  warningCount: number;
  groupCount: number;
  createdBy: { id: string; name: string };
  createdAt: string;
  committedAt: string | null;
  approvedBy: { id: string; name: string } | null;
  approvedAt: string | null;
  replacesId: number | null;
  supersededById: number | null;
  /** Records this import made (history) or filled (draft). */
  inspectionIds: number[];
  preview: StoredPreview | null;
};

const json = <T>(v: unknown): T => (typeof v === "string" ? (JSON.parse(v) as T) : (v as T));
const when = (v: unknown) => (v == null ? null : v instanceof Date ? v.toISOString() : new Date(String(v)).toISOString());

function importBase(conn: Conn) {
  return conn("gauge_imports as g")
    .join("vessels as v", "v.id", "g.vessel_id")
    .join("stored_files as f", "f.id", "g.file_id")
    .join("user as c", "c.id", "g.created_by")
    .leftJoin("user as a", "a.id", "g.approved_by")
    .leftJoin("main_engines as e", "e.id", "g.engine_id")
    .leftJoin("cylinder_units as u", "u.id", "g.unit_id")
    .select(
      "g.id",
      "g.vessel_id",
      "v.name as vessel_name",
      "g.engine_id",
      "e.serial as engine_serial",
      "g.unit_id",
      "u.cylinder_no",
      "g.inspection_id",
      "g.destination",
      "g.status",
      "g.file_id",
      "f.original_name",
      "f.size_bytes",
      "g.sha256",
      "g.column_mapping",
      "g.options",
      "g.excluded_lines",
      "g.row_count",
      "g.error_count",
      "g.warning_count",
      "g.group_count",
      "g.created_by",
      "c.name as created_by_name",
      "g.created_at",
      "g.committed_at",
      "g.approved_by",
      "a.name as approved_by_name",
      "g.approved_at",
      "g.replaces_id",
      "g.superseded_by_id",
    );
}

type ImportRow = Awaited<ReturnType<ReturnType<typeof importBase>["first"]>>;

function toDto(r: NonNullable<ImportRow>, inspectionIds: number[], preview: StoredPreview | null): ImportDto {
  return {
    id: r.id,
    vesselId: r.vessel_id,
    vesselName: r.vessel_name,
    engineId: r.engine_id ?? null,
    engineSerial: r.engine_serial ?? null,
    unitId: r.unit_id ?? null,
    cylinderNo: r.cylinder_no ?? null,
    inspectionId: r.inspection_id ?? null,
    destination: r.destination,
    status: r.status,
    fileId: r.file_id,
    fileName: r.original_name ?? "file.csv",
    sizeBytes: Number(r.size_bytes),
    sha256: r.sha256,
    mapping: json<ColumnMapping>(r.column_mapping) ?? {},
    options: json<CsvOptions>(r.options),
    excludedLines: json<number[]>(r.excluded_lines) ?? [],
    rowCount: r.row_count ?? 0,
    errorCount: r.error_count ?? 0,
    warningCount: r.warning_count ?? 0,
    groupCount: r.group_count ?? 0,
    createdBy: { id: r.created_by, name: r.created_by_name },
    createdAt: when(r.created_at)!,
    committedAt: when(r.committed_at),
    approvedBy: r.approved_by ? { id: r.approved_by, name: r.approved_by_name } : null,
    approvedAt: when(r.approved_at),
    replacesId: r.replaces_id ?? null,
    supersededById: r.superseded_by_id ?? null,
    inspectionIds,
    preview,
  };
}

/** One import with its stored preview and the records it made. Vessel scope is the caller's job. */
export async function getImportDto(importId: number, conn: Conn = defaultDb): Promise<ImportDto | null> {
  const row = await importBase(conn).where("g.id", importId).first();
  if (!row) return null;
  const [made, preview] = await Promise.all([
    conn("inspections").where({ import_id: importId }).orderBy("id").pluck("id"),
    conn("gauge_imports").where({ id: importId }).first("preview"),
  ]);
  const ids = row.destination === "draft" ? (row.inspection_id ? [row.inspection_id] : []) : (made as number[]);
  return toDto(row, ids, preview?.preview ? json<StoredPreview>(preview.preview) : null);
}

/** The import log of a vessel, newest first (without previews). */
export async function listImports(user: VesselScope, o: { vesselId?: number | null; limit?: number } = {}, conn: Conn = defaultDb): Promise<ImportDto[]> {
  const q = importBase(conn).whereNot("g.status", "discarded").orderBy("g.id", "desc").limit(o.limit ?? 200);
  whereVesselInScope(q, user, "g.vessel_id");
  if (o.vesselId) q.where("g.vessel_id", o.vesselId);
  const rows = await q;
  const ids = rows.map((r) => r.id as number);
  const made = ids.length ? await conn("inspections").whereIn("import_id", ids).select("import_id", "id") : [];
  return rows.map((r) => toDto(r, r.destination === "draft" ? (r.inspection_id ? [r.inspection_id] : []) : made.filter((m) => m.import_id === r.id).map((m) => m.id), null));
}

/** The mapping saved for this vessel and file shape, if any. */
export async function getSavedMapping(vesselId: number, shapeKey: string, conn: Conn = defaultDb): Promise<{ mapping: ColumnMapping; options: CsvOptions } | null> {
  const row = await conn("import_mappings").where({ vessel_id: vesselId, shape_key: shapeKey }).first("mapping", "options");
  return row ? { mapping: json<ColumnMapping>(row.mapping), options: json<CsvOptions>(row.options) } : null;
}

/** Every mapping saved for a vessel, by shape, for the screen to offer when a file of that shape is opened. */
export async function listSavedMappings(vesselId: number, conn: Conn = defaultDb): Promise<Record<string, { mapping: ColumnMapping; options: CsvOptions }>> {
  const rows = await conn("import_mappings").where({ vessel_id: vesselId }).select("shape_key", "mapping", "options");
  return Object.fromEntries(rows.map((r) => [r.shape_key, { mapping: json<ColumnMapping>(r.mapping), options: json<CsvOptions>(r.options) }]));
}

/** The engines, units and open drafts of the vessels a person may import into, for the import screen. */
export async function listImportTargets(user: VesselScope, conn: Conn = defaultDb) {
  const vq = conn("vessels as v").whereNull("v.archived_at").orderBy("v.name").select("v.id", "v.name");
  whereVesselInScope(vq, user, "v.id");
  const vessels = await vq;
  const vesselIds = vessels.map((v) => v.id as number);
  if (!vesselIds.length) return [];
  const [engines, units, drafts] = await Promise.all([
    conn("main_engines as e").join("engine_profiles as p", "p.id", "e.profile_id").whereIn("e.vessel_id", vesselIds).select("e.id", "e.vessel_id", "e.serial", "p.bore_mm", "p.name as profile_name"),
    conn("cylinder_units as u").join("main_engines as e", "e.id", "u.engine_id").whereIn("e.vessel_id", vesselIds).orderBy("u.cylinder_no").select("u.id", "u.engine_id", "u.cylinder_no"),
    conn("inspections as i")
      .join("cylinder_units as u", "u.id", "i.unit_id")
      .join("main_engines as e", "e.id", "u.engine_id")
      .whereIn("e.vessel_id", vesselIds)
      .whereIn("i.state", ["draft", "returned"])
      .select("i.id", "i.unit_id", "i.inspected_on", "i.engine_hours"),
  ]);
  return vessels.map((v) => ({
    id: v.id as number,
    name: v.name as string,
    engines: engines
      .filter((e) => e.vessel_id === v.id)
      .map((e) => ({
        id: e.id as number,
        serial: e.serial as string,
        boreMm: Number(e.bore_mm),
        profileName: e.profile_name as string,
        units: units
          .filter((u) => u.engine_id === e.id)
          .map((u) => ({
            id: u.id as number,
            cylinderNo: u.cylinder_no as number,
            drafts: drafts.filter((d) => d.unit_id === u.id).map((d) => ({ id: d.id as number, inspectedOn: day(d.inspected_on), engineHours: Number(d.engine_hours) })),
          })),
      })),
  }));
}
export type ImportTargets = Awaited<ReturnType<typeof listImportTargets>>;
