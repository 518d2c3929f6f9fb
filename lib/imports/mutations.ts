import "server-only";
import { createHash, randomUUID } from "node:crypto";
import type { Knex } from "knex";
import { recomputeUnits } from "@/lib/analysis/recompute";
import { writeAudit, writeAuditMany } from "@/lib/audit/mutations";
import { isRole } from "@/lib/auth/roles";
import { db as defaultDb } from "@/lib/db/knex";
import { HttpError } from "@/lib/http/errors";
import { approvalRefusal } from "@/lib/inspections/approval";
import { createInspection } from "@/lib/inspections/mutations";
import { derivedLinerHours } from "@/lib/inspections/rules";
import { presignUpload, readObject, removeObject, writeObject } from "@/lib/photos/storage";
import { mm } from "@/lib/format";
import { IMPORT_MAX_BYTES, shapeKey } from "./layout";
import { parseCsv, type ParsedFile } from "./parse";
import { buildPreview, previewSummary, type DraftTarget, type ImportContext, type Preview } from "./preview";
import { getImportDto, loadImportContext, type ImportDto, type StoredPreview } from "./queries";
import type { CommitImportInput, CreateImportInput, CreateUploadInput } from "./schemas";
import { presignImportDownload } from "./storage";
import { inTransaction } from "@/lib/db/transaction";

/*
 * Importing in three steps. An upload slot (a pending ledger row and a presigned PUT, as for
 * photos: the browser sends the file straight to the store). A preview: the server reads the
 * object back, hashes it, moves it to a key no upload URL was signed for, refuses a file already
 * imported on the vessel (unless it replaces that import), parses and checks it and stores the
 * preview. A commit: the file is read again and checked against its hash, the preview rebuilt
 * against the records as they are now, and everything written in one transaction or nothing.
 * Records from past files then wait for a chief engineer or the superintendent, other than the
 * importer, to approve the import as a whole (lib/inspections/approval.ts), which puts them in
 * the trend and the projections.
 */

type Actor = { id: string; name: string };

const CAP = { issues: 500, groups: 1000, readings: 300, sampleRows: 12 } as const;
const CHUNK = 2000;

const sha256 = (b: Buffer) => createHash("sha256").update(b).digest("hex");

/** Reserves an object key for one file and returns where to PUT it (text/csv, exactly this size). */
export async function createImportUpload(actor: Actor, input: CreateUploadInput, db: Knex = defaultDb): Promise<{ fileId: number; uploadUrl: string; headers: Record<string, string> }> {
  const key = `imports/uploads/${randomUUID()}`;
  const [fileId] = await db("stored_files").insert({
    object_key: key,
    kind: "gauge_import",
    content_type: "text/csv",
    size_bytes: input.sizeBytes,
    original_name: input.fileName.slice(0, 255),
    status: "pending",
    vessel_id: input.vesselId,
    uploaded_by: actor.id,
  });
  const { url, headers } = await presignUpload(key, "text/csv", input.sizeBytes);
  return { fileId, uploadUrl: url, headers };
}

/** Text from a file's bytes: UTF-8 (with or without a BOM), else Windows-1252 as older spreadsheet programs write. */
export function decodeText(bytes: Buffer): string {
  if (bytes.includes(0)) throw new HttpError(400, "This is not a text file (it holds binary data). Save the sheet as CSV and choose that file. (field: file)", { field: "file" });
  try {
    return new TextDecoder("utf-8", { fatal: true }).decode(bytes);
  } catch {
    return new TextDecoder("windows-1252").decode(bytes);
  }
}

type StoredFile = { id: number; key: string; sha256: string; bytes: Buffer; name: string };

/** The uploaded file, checked and moved to its own key on first use; read again (and its hash checked) after. */
async function takeFile(actor: Actor, fileId: number, vesselId: number, db: Knex): Promise<StoredFile> {
  const file = await db("stored_files").where({ id: fileId, kind: "gauge_import" }).first("id", "object_key", "status", "size_bytes", "sha256", "vessel_id", "uploaded_by", "original_name");
  if (!file || file.vessel_id !== vesselId) throw new HttpError(404, "No such uploaded file on this vessel. Upload the file again. (field: fileId)", { field: "fileId" });
  if (file.status === "deleted") throw new HttpError(409, "This upload was refused or removed; upload the file again.");
  if (file.status === "stored") {
    const bytes = await readObject(file.object_key);
    if (sha256(bytes) !== file.sha256) throw new HttpError(409, "The stored file no longer matches its fingerprint (SHA-256); nothing was imported. Upload the file again.");
    return { id: file.id, key: file.object_key, sha256: file.sha256, bytes, name: file.original_name ?? "file.csv" };
  }
  if (file.uploaded_by !== actor.id) throw new HttpError(403, "Only the person who uploaded this file can import it.");
  let bytes: Buffer;
  try {
    bytes = await readObject(file.object_key);
  } catch {
    throw new HttpError(400, "The file did not arrive in the store. Upload it again. (field: fileId)", { field: "fileId" });
  }
  if (bytes.length > IMPORT_MAX_BYTES) {
    await removeObject(file.object_key).catch(() => undefined);
    await db("stored_files").where({ id: file.id }).update({ status: "deleted" });
    throw new HttpError(413, `The file is larger than ${IMPORT_MAX_BYTES / (1024 * 1024)} MB; it was not kept.`);
  }
  const hash = sha256(bytes);
  // The bytes that were hashed go to a key no upload URL was signed for: the evidence cannot be swapped.
  const key = `imports/${vesselId}/${randomUUID()}`;
  await writeObject(key, bytes, "text/csv");
  await removeObject(file.object_key).catch(() => undefined);
  await db("stored_files").where({ id: file.id, status: "pending" }).update({ object_key: key, status: "stored", sha256: hash, size_bytes: bytes.length });
  return { id: file.id, key, sha256: hash, bytes, name: file.original_name ?? "file.csv" };
}

/** The import of the same file already on the vessel (not superseded), other than `except`. */
async function earlierImportOf(conn: Knex | Knex.Transaction, vesselId: number, hash: string, except: number | null) {
  const q = conn("gauge_imports as g").join("user as u", "u.id", "g.created_by").where({ "g.vessel_id": vesselId, "g.sha256": hash }).whereIn("g.status", ["committed", "approved"]);
  if (except) q.whereNot("g.id", except);
  return q.first("g.id", "g.created_at", "u.name", "g.status");
}

function duplicateError(found: { id: number; created_at: Date | string; name: string }): never {
  const when = new Date(found.created_at).toISOString().slice(0, 10);
  throw new HttpError(409, `This very file (same SHA-256) was already imported on ${when} by ${found.name} (import ${found.id}). It was not imported twice. Import it again only as a replacement of import ${found.id}, which is then kept as superseded.`, {
    field: "fileId",
    duplicateOf: found.id,
  });
}

type Plan = { parsed: ParsedFile; ctx: ImportContext; preview: Preview; draft: DraftTarget | null; typed: Map<string, { what: string; value: number }> };

/** Parses the file and builds the preview against the records as they stand on `conn`. */
async function plan(conn: Knex | Knex.Transaction, text: string, input: Pick<CreateImportInput, "destination" | "engineId" | "unitId" | "inspectionId" | "newDraft" | "mapping" | "options" | "excludedLines" | "replacesImportId">, vesselId: number): Promise<Plan> {
  let engineId = input.engineId ?? null;
  let draft: DraftTarget | null = null;
  const typed = new Map<string, { what: string; value: number }>();
  if (input.destination === "draft") {
    const unit = await conn("cylinder_units as u").join("main_engines as e", "e.id", "u.engine_id").where("u.id", input.unitId!).first("u.id", "u.engine_id", "e.vessel_id");
    if (!unit || unit.vessel_id !== vesselId) throw new HttpError(404, "No such unit on this vessel. (field: unitId)", { field: "unitId" });
    engineId = unit.engine_id;
    if (input.inspectionId) {
      const row = await conn("inspections").where({ id: input.inspectionId }).first("id", "unit_id", "state", "liner_id", "inspected_on", "engine_hours", "liner_hours", "gauge_temp_c", "liner_temp_c");
      if (!row || row.unit_id !== unit.id) throw new HttpError(404, "No such draft for this unit. (field: inspectionId)", { field: "inspectionId" });
      if (!["draft", "returned"].includes(row.state)) throw new HttpError(409, `Inspection ${row.id} is ${row.state}; a gauge file can only fill a draft.`);
      draft = {
        unitId: unit.id,
        linerId: row.liner_id,
        header: {
          inspectedOn: String(row.inspected_on).slice(0, 10),
          engineHours: Number(row.engine_hours),
          linerHours: Number(row.liner_hours),
          gaugeTempC: row.gauge_temp_c == null ? null : Number(row.gauge_temp_c),
          linerTempC: row.liner_temp_c == null ? null : Number(row.liner_temp_c),
        },
      };
      const [readings, rings] = await Promise.all([
        conn("liner_readings as r").join("profile_stations as s", "s.id", "r.station_id").where("r.inspection_id", row.id).select("s.station_key", "s.label", "r.axis_key", "r.diameter_mm"),
        conn("ring_readings").where({ inspection_id: row.id }).select("ring_position", "closed_gap_mm", "groove_clearance_mm"),
      ]);
      for (const r of readings) typed.set(`${r.station_key}|${r.axis_key}`, { what: `${r.label} ${r.axis_key}`, value: Number(r.diameter_mm) });
      for (const r of rings) {
        if (r.closed_gap_mm != null) typed.set(`ring${r.ring_position}|gap`, { what: `Ring ${r.ring_position} closed gap`, value: Number(r.closed_gap_mm) });
        if (r.groove_clearance_mm != null) typed.set(`ring${r.ring_position}|groove`, { what: `Ring ${r.ring_position} groove clearance`, value: Number(r.groove_clearance_mm) });
      }
    } else {
      const liner = await conn("liners").where({ unit_id: unit.id }).whereNull("removed_on").orderBy("installed_on", "desc").first("id", "installed_engine_hours", "liner_hours_at_install");
      if (!liner) throw new HttpError(400, "This unit has no liner in service. Record the fitted liner before gauging it. (field: unitId)", { field: "unitId" });
      const nd = input.newDraft!;
      draft = {
        unitId: unit.id,
        linerId: liner.id,
        header: {
          inspectedOn: nd.inspectedOn,
          engineHours: nd.engineHours,
          linerHours: nd.linerHours ?? derivedLinerHours({ installedEngineHours: Number(liner.installed_engine_hours), linerHoursAtInstall: Number(liner.liner_hours_at_install) }, nd.engineHours),
          gaugeTempC: null,
          linerTempC: null,
        },
      };
    }
  }
  const ctx = engineId ? await loadImportContext(conn, engineId) : null;
  if (!ctx || ctx.engine.vesselId !== vesselId) throw new HttpError(404, "No such engine on this vessel. (field: engineId)", { field: "engineId" });
  const parsed = parseCsv(text, input.options);
  const preview = buildPreview(parsed.rows, ctx, {
    destination: input.destination,
    mapping: input.mapping,
    options: parsed.options,
    header: parsed.header,
    excludedLines: input.excludedLines,
    draft,
    replacesImportId: input.replacesImportId ?? null,
  });
  return { parsed, ctx, preview, draft, typed };
}

/** Typed values in a draft that the file would change. */
function overwritesOf(p: Plan): StoredPreview["overwrites"] {
  const out: StoredPreview["overwrites"] = [];
  for (const g of p.preview.groups) {
    for (const r of g.readings) {
      const t = p.typed.get(`${r.stationKey}|${r.axisKey}`);
      if (t && Math.abs(t.value - r.diameterMm) >= 0.0005) out.push({ what: t.what, typed: mm(t.value, 3), file: mm(r.diameterMm, 3), line: r.line });
    }
    for (const r of g.rings) {
      for (const [k, v] of [["gap", r.closedGapMm], ["groove", r.grooveClearanceMm]] as const) {
        const t = p.typed.get(`ring${r.position}|${k}`);
        if (t && v != null && Math.abs(t.value - v) >= 0.0005) out.push({ what: t.what, typed: mm(t.value, 2), file: mm(v, 2), line: r.line });
      }
    }
  }
  return out;
}

function storedPreview(p: Plan): StoredPreview {
  const { preview, parsed } = p;
  const readings = preview.groups.flatMap((g) => g.readings.map((r) => ({ ...r, cylinderNo: g.cylinderNo, inspectedOn: g.inspectedOn })));
  return {
    summary: previewSummary(preview),
    rowCount: preview.rowCount,
    blankLines: parsed.blankLines,
    commentLines: parsed.commentLines,
    header: parsed.header,
    sampleRows: parsed.rows.slice(0, CAP.sampleRows).map((r) => ({ line: r.line, cells: r.cells.map((c) => c.slice(0, 60)) })),
    errorLines: preview.errorLines.slice(0, 20_000),
    issues: preview.issues.slice(0, CAP.issues),
    issuesLeftOut: Math.max(0, preview.issues.length - CAP.issues),
    groups: preview.groups.slice(0, CAP.groups).map((g) => ({
      unitId: g.unitId,
      cylinderNo: g.cylinderNo,
      inspectedOn: g.inspectedOn,
      engineHours: g.engineHours,
      linerHours: g.linerHours,
      readings: g.readings.length,
      rings: g.rings.length,
      maxWearMm: g.maxWearMm,
      firstLine: Math.min(...g.lines),
      lastLine: Math.max(...g.lines),
    })),
    groupsLeftOut: Math.max(0, preview.groups.length - CAP.groups),
    readings: readings.slice(0, CAP.readings),
    readingsLeftOut: Math.max(0, readings.length - CAP.readings),
    overwrites: overwritesOf(p),
  };
}

/**
 * Checks an uploaded file and stores its preview under a mapping: nothing is written to the
 * records. The same file already imported on the vessel is refused (409, naming the import)
 * unless this import replaces it. The mapping is kept for the vessel and the file's shape.
 */
export async function previewImport(actor: Actor, input: CreateImportInput, db: Knex = defaultDb): Promise<ImportDto> {
  const file = await takeFile(actor, input.fileId, input.vesselId, db);
  if (input.replacesImportId) {
    const old = await db("gauge_imports").where({ id: input.replacesImportId }).first("id", "vessel_id", "status", "destination", "engine_id", "unit_id");
    if (!old || old.vessel_id !== input.vesselId || !["committed", "approved"].includes(old.status)) {
      throw new HttpError(409, `Import ${input.replacesImportId} is not an import on this vessel that can be replaced (only imported ones can). (field: replacesImportId)`, { field: "replacesImportId" });
    }
    if (old.destination !== input.destination) throw new HttpError(409, "A replacement goes where the import it replaces went (the same destination). (field: replacesImportId)", { field: "replacesImportId" });
  }
  const dup = await earlierImportOf(db, input.vesselId, file.sha256, input.replacesImportId ?? null);
  if (dup) duplicateError(dup);
  const text = decodeText(file.bytes);
  const p = await plan(db, text, input, input.vesselId);
  const stored = storedPreview(p);
  const id = await inTransaction(db, async (trx) => {
    // A file mapped again: the earlier preview of it by the same person gives way.
    await trx("gauge_imports").where({ file_id: file.id, status: "previewed", created_by: actor.id }).update({ status: "discarded" });
    const [id] = await trx("gauge_imports").insert({
      file_id: file.id,
      vessel_id: input.vesselId,
      engine_id: p.ctx.engine.id,
      unit_id: input.destination === "draft" ? input.unitId : null,
      inspection_id: input.destination === "draft" ? (input.inspectionId ?? null) : null,
      destination: input.destination,
      sha256: file.sha256,
      column_mapping: JSON.stringify(input.mapping),
      options: JSON.stringify({ ...p.parsed.options, ...(input.destination === "draft" && input.newDraft ? { newDraft: input.newDraft } : {}) }),
      excluded_lines: JSON.stringify(p.preview.excludedLines),
      preview: JSON.stringify(stored),
      status: "previewed",
      row_count: p.preview.rowCount,
      error_count: p.preview.errorCount,
      warning_count: p.preview.warningCount,
      group_count: p.preview.groups.length,
      replaces_id: input.replacesImportId ?? null,
      created_by: actor.id,
    });
    if (input.saveMapping) {
      await trx("import_mappings")
        .insert({ vessel_id: input.vesselId, shape_key: shapeKey(p.parsed.header, p.parsed.columnCount), mapping: JSON.stringify(input.mapping), options: JSON.stringify(p.parsed.options), updated_by: actor.id, updated_at: new Date() })
        .onConflict(["vessel_id", "shape_key"])
        .merge(["mapping", "options", "updated_by", "updated_at"]);
    }
    return id as number;
  });
  return (await getImportDto(id, db))!;
}

async function insertChunked(trx: Knex.Transaction, table: string, rows: Record<string, unknown>[]) {
  for (let i = 0; i < rows.length; i += CHUNK) await trx(table).insert(rows.slice(i, i + CHUNK));
}

/**
 * Writes a previewed import, all or nothing, in one transaction: the file is read again and
 * checked against its SHA-256, the preview rebuilt against the records as they are now, and
 * refused while an error remains on a line not left out, or a warning is not confirmed. A
 * draft's typed readings are changed only when the importer chose to replace them. Only the
 * importer commits. A second commit of the same import answers with it, unchanged.
 */
export async function commitImport(actor: Actor, importId: number, flags: Partial<CommitImportInput>, db: Knex = defaultDb): Promise<ImportDto> {
  const head = await db("gauge_imports").where({ id: importId }).first("id", "status", "created_by", "file_id", "vessel_id");
  if (!head) throw new HttpError(404, "No such import.");
  if (head.status === "committed" || head.status === "approved") return (await getImportDto(importId, db))!;
  if (head.status !== "previewed") throw new HttpError(409, `This import is ${head.status === "discarded" ? "replaced by a newer mapping of the same file" : head.status}; nothing was written.`);
  if (head.created_by !== actor.id) throw new HttpError(403, "Only the person who previewed this import can import it.");
  const file = await takeFile(actor, head.file_id, head.vessel_id, db);
  const text = decodeText(file.bytes);
  const recompute = await inTransaction(db, async (trx) => {
    const row = await trx("gauge_imports").where({ id: importId }).forUpdate().first();
    if (row.status !== "previewed") throw new HttpError(409, "This import changed meanwhile; reload it.");
    const parse = <T>(v: unknown) => (typeof v === "string" ? JSON.parse(v) : v) as T;
    const options = parse<CreateImportInput["options"] & { newDraft?: CreateImportInput["newDraft"] }>(row.options);
    const input: Parameters<typeof plan>[2] = {
      destination: row.destination,
      engineId: row.engine_id,
      unitId: row.unit_id,
      inspectionId: row.inspection_id,
      newDraft: options.newDraft ?? null,
      mapping: parse(row.column_mapping),
      options: { delimiter: options.delimiter, decimalMark: options.decimalMark, hasHeader: options.hasHeader, lengthUnit: options.lengthUnit },
      excludedLines: parse<number[]>(row.excluded_lines) ?? [],
      replacesImportId: row.replaces_id,
    };
    // Serialise imports into one engine: a second waits here, then sees the first's records.
    await trx("main_engines").where({ id: row.engine_id }).forUpdate().first("id");
    const dup = await earlierImportOf(trx, row.vessel_id, row.sha256, row.replaces_id);
    if (dup) duplicateError(dup);
    const p = await plan(trx, text, input, row.vessel_id);
    if (p.preview.errorCount) {
      const first = p.preview.issues.find((i) => i.level === "error")!;
      throw new HttpError(400, `${p.preview.errorCount} error${p.preview.errorCount === 1 ? " remains" : "s remain"}; nothing was imported. Line ${first.line}: ${first.message}`, {
        errorLines: p.preview.errorLines.slice(0, 1000),
        issues: p.preview.issues.filter((i) => i.level === "error").slice(0, 50),
      });
    }
    if (p.preview.groups.length === 0) throw new HttpError(400, "No reading is left to import; nothing was imported.");
    if (p.preview.warningCount && !flags.confirmWarnings) {
      throw new HttpError(400, `Confirm the ${p.preview.warningCount} warning${p.preview.warningCount === 1 ? "" : "s"} first: the values are kept as read, and the confirmation is stored with them. (field: confirmWarnings)`, { field: "confirmWarnings" });
    }
    const stationId = new Map(p.ctx.profile.stations.map((s) => [s.key, s.id]));
    let inspectionIds: number[];
    let touchedUnits: number[] = [];
    if (row.destination === "draft") {
      inspectionIds = [await writeDraft(trx, actor, importId, row, input, p, flags, stationId)];
    } else {
      inspectionIds = await writeHistory(trx, actor, importId, file.name, p, stationId);
    }
    if (row.replaces_id) {
      const replaced = await trx("inspections").where({ import_id: row.replaces_id }).whereIn("state", ["submitted", "approved"]).select("id", "unit_id", "state");
      if (replaced.length) await trx("inspections").whereIn("id", replaced.map((r) => r.id)).update({ state: "superseded" });
      touchedUnits = [...new Set(replaced.filter((r) => r.state === "approved").map((r) => r.unit_id as number))];
      await trx("gauge_imports").where({ id: row.replaces_id }).update({ status: "superseded", superseded_by_id: importId });
      await writeAudit({ actor, action: "import.superseded", entityType: "import", entityId: row.replaces_id, vesselId: row.vessel_id, detail: { by: importId, records: replaced.map((r) => r.id) } }, trx);
    }
    await trx("gauge_imports")
      .where({ id: importId })
      .update({
        status: "committed",
        committed_at: new Date(),
        committed_by: actor.id,
        inspection_id: row.destination === "draft" ? inspectionIds[0] : null,
        row_count: p.preview.rowCount,
        error_count: 0,
        warning_count: p.preview.warningCount,
        group_count: p.preview.groups.length,
        preview: JSON.stringify(storedPreview(p)),
      });
    await writeAudit(
      {
        actor,
        action: "import.commit",
        entityType: "import",
        entityId: importId,
        vesselId: row.vessel_id,
        detail: { destination: row.destination, file: file.name, sha256: file.sha256, rows: p.preview.rowCount, gaugings: p.preview.groups.length, warningsConfirmed: p.preview.warningCount, leftOut: input.excludedLines, records: inspectionIds.slice(0, 2000), replaces: row.replaces_id },
      },
      trx,
    );
    return touchedUnits;
  });
  if (recompute.length) await recomputeUnits(db, { unitIds: recompute });
  return (await getImportDto(importId, db))!;
}

/** Fills a draft (an existing one, or one opened now) with the file's readings and rings. */
async function writeDraft(
  trx: Knex.Transaction,
  actor: Actor,
  importId: number,
  row: { inspection_id: number | null; unit_id: number; vessel_id: number },
  input: Parameters<typeof plan>[2],
  p: Plan,
  flags: Partial<CommitImportInput>,
  stationId: Map<string, number>,
): Promise<number> {
  const group = p.preview.groups[0];
  let id = row.inspection_id;
  if (!id) {
    const nd = input.newDraft!;
    const made = await createInspection(
      actor,
      { unitId: row.unit_id, clientToken: `import-${importId}-${randomUUID().slice(0, 8)}`, inspectedOn: nd.inspectedOn, engineHours: nd.engineHours, linerHours: p.draft!.header.linerHours, linerHoursReason: null, crew: null, gaugeTempC: group.gaugeTempC, linerTempC: group.linerTempC },
      trx as unknown as Knex,
    );
    if (made.existing) throw new HttpError(409, `Cylinder ${group.cylinderNo} already has an open draft (inspection ${made.id}). Choose it as the draft to fill; nothing was imported.`, { field: "inspectionId", inspectionId: made.id });
    id = made.id;
  } else {
    const locked = await trx("inspections").where({ id }).forUpdate().first("state", "revision");
    if (!locked || !["draft", "returned"].includes(locked.state)) throw new HttpError(409, "This draft was submitted or removed meanwhile; nothing was imported.");
  }
  const overwrites = overwritesOf(p);
  if (overwrites.length && !flags.typedReadings) {
    throw new HttpError(409, `${overwrites.length} reading${overwrites.length === 1 ? " already typed in this draft differs" : "s already typed in this draft differ"} from the file. Choose whether the file's values replace them or the typed ones stay; nothing was changed.`, {
      field: "typedReadings",
      overwrites: overwrites.slice(0, 100),
    });
  }
  const keep = flags.typedReadings === "keep";
  const readings = group.readings.filter((r) => !(keep && p.typed.has(`${r.stationKey}|${r.axisKey}`)));
  if (readings.length) {
    await trx("liner_readings")
      .insert(readings.map((r) => ({ inspection_id: id, station_id: stationId.get(r.stationKey)!, axis_key: r.axisKey, diameter_mm: r.diameterMm, entered_unit: r.enteredUnit, warning_confirmed: r.warning })))
      .onConflict(["inspection_id", "station_id", "axis_key"])
      .merge(["diameter_mm", "entered_unit", "warning_confirmed"]);
  }
  for (const r of group.rings) {
    const gap = keep && p.typed.has(`ring${r.position}|gap`) ? undefined : r.closedGapMm;
    const groove = keep && p.typed.has(`ring${r.position}|groove`) ? undefined : r.grooveClearanceMm;
    const values: Record<string, unknown> = {};
    if (gap != null) Object.assign(values, { closed_gap_mm: gap, gap_measured_in: "gauge_ring" });
    if (groove != null) values.groove_clearance_mm = groove;
    if (!Object.keys(values).length) continue;
    await trx("ring_readings").insert({ inspection_id: id, ring_position: r.position, renewed: false, ...values }).onConflict(["inspection_id", "ring_position"]).merge(Object.keys(values));
  }
  const header: Record<string, unknown> = {};
  const current = await trx("inspections").where({ id }).first("gauge_temp_c", "liner_temp_c", "gauge_serial", "revision");
  if (current.gauge_temp_c == null && group.gaugeTempC != null) header.gauge_temp_c = group.gaugeTempC;
  if (current.liner_temp_c == null && group.linerTempC != null) header.liner_temp_c = group.linerTempC;
  if (group.gaugeSerial) header.gauge_serial = group.gaugeSerial;
  // A new revision: a sheet open on another device sees the change instead of overwriting it.
  await trx("inspections").where({ id }).update({ ...header, revision: current.revision + 1 });
  await writeAudit(
    { actor, action: "inspection.import_readings", entityType: "inspection", entityId: id!, vesselId: row.vessel_id, detail: { import: importId, readings: readings.length, rings: group.rings.length, typedReadings: overwrites.length ? flags.typedReadings : null } },
    trx,
  );
  return id!;
}

/** Past records: one inspection per unit and date, submitted for approval of the import as a whole. */
async function writeHistory(trx: Knex.Transaction, actor: Actor, importId: number, fileName: string, p: Plan, stationId: Map<string, number>): Promise<number[]> {
  const now = new Date();
  const token = (i: number) => `imp${importId}-${i}`;
  const note = (n: string | null) => [`Imported from past records (${fileName}).`, n].filter(Boolean).join("\n").slice(0, 5000);
  await insertChunked(
    trx,
    "inspections",
    p.preview.groups.map((g, i) => ({
      unit_id: g.unitId,
      liner_id: g.linerId,
      inspected_on: g.inspectedOn,
      engine_hours: g.engineHours,
      liner_hours: g.linerHours,
      gauge_temp_c: g.gaugeTempC,
      liner_temp_c: g.linerTempC,
      gauge_serial: g.gaugeSerial,
      notes: note(g.note),
      state: "submitted",
      version: 1,
      revision: 1,
      client_token: token(i),
      created_by: actor.id,
      submitted_by: actor.id,
      submitted_at: now,
      source: "import",
      import_id: importId,
    })),
  );
  const made = await trx("inspections").where({ import_id: importId }).select("id", "client_token");
  const idOf = new Map(made.map((m) => [m.client_token as string, m.id as number]));
  const ids = p.preview.groups.map((_, i) => idOf.get(token(i))!);
  const readings: Record<string, unknown>[] = [];
  const rings: Record<string, unknown>[] = [];
  p.preview.groups.forEach((g, i) => {
    for (const r of g.readings) readings.push({ inspection_id: ids[i], station_id: stationId.get(r.stationKey), axis_key: r.axisKey, diameter_mm: r.diameterMm, entered_unit: r.enteredUnit, warning_confirmed: r.warning });
    for (const r of g.rings) rings.push({ inspection_id: ids[i], ring_position: r.position, closed_gap_mm: r.closedGapMm, gap_measured_in: r.closedGapMm == null ? null : "gauge_ring", groove_clearance_mm: r.grooveClearanceMm, renewed: false });
  });
  await insertChunked(trx, "liner_readings", readings);
  await insertChunked(trx, "ring_readings", rings);
  await writeAuditMany(
    p.preview.groups.map((g, i) => ({
      actor,
      action: "inspection.import",
      entityType: "inspection",
      entityId: ids[i],
      vesselId: p.ctx.engine.vesselId,
      detail: { import: importId, file: fileName, unitId: g.unitId, cylinderNo: g.cylinderNo, inspectedOn: g.inspectedOn, lines: [Math.min(...g.lines), Math.max(...g.lines)] },
    })),
    trx,
  );
  return ids;
}

/**
 * Approves an import of past records as a whole: its records become approved and enter the
 * trend and projections. The approver is a chief engineer of the vessel or the superintendent
 * who neither made nor committed the import (the same rule as for one record).
 */
export async function approveImport(actor: Actor, importId: number, db: Knex = defaultDb): Promise<ImportDto> {
  const units = await inTransaction(db, async (trx) => {
    const row = await trx("gauge_imports").where({ id: importId }).forUpdate().first("id", "status", "destination", "created_by", "committed_by", "vessel_id");
    if (!row) throw new HttpError(404, "No such import.");
    if (row.status === "approved") return null;
    if (row.destination !== "history") throw new HttpError(409, "A gauge file fills a draft, which is submitted and approved as usual; there is no import to approve.");
    if (row.status !== "committed") throw new HttpError(409, `This import is ${row.status}; only an imported history waiting for approval can be approved.`);
    const approver = await trx("user").where({ id: actor.id }).first("role");
    const refusal = isRole(approver?.role) ? approvalRefusal({ id: actor.id, role: approver.role }, { createdBy: row.created_by, submittedBy: row.committed_by }) : "Your role does not approve inspection records.";
    if (refusal) throw new HttpError(403, refusal.replace("this record", "this import").replace("entered this", "imported this"));
    const records = await trx("inspections").where({ import_id: importId, state: "submitted" }).select("id", "unit_id");
    const now = new Date();
    for (let i = 0; i < records.length; i += CHUNK) {
      await trx("inspections").whereIn("id", records.slice(i, i + CHUNK).map((r) => r.id)).where({ state: "submitted" }).update({ state: "approved", approved_by: actor.id, approved_at: now });
    }
    await trx("gauge_imports").where({ id: importId, status: "committed" }).update({ status: "approved", approved_by: actor.id, approved_at: now });
    await writeAudit({ actor, action: "import.approve", entityType: "import", entityId: importId, vesselId: row.vessel_id, detail: { records: records.length } }, trx);
    await writeAuditMany(records.map((r) => ({ actor, action: "inspection.approve", entityType: "inspection", entityId: r.id, vesselId: row.vessel_id, detail: { import: importId, asPartOfImport: true } })), trx);
    const unitIds = [...new Set(records.map((r) => r.unit_id as number))];
    await recomputeUnits(trx, { unitIds });
    return unitIds;
  });
  void units;
  return (await getImportDto(importId, db))!;
}

/** A short-lived link to the imported file, as it was imported. */
export async function importFileUrl(importId: number, db: Knex = defaultDb): Promise<string> {
  const row = await db("gauge_imports as g").join("stored_files as f", "f.id", "g.file_id").where("g.id", importId).first("f.object_key", "f.status");
  if (!row || row.status !== "stored") throw new HttpError(404, "The file of this import is not in the store.");
  return presignImportDownload(row.object_key, importId);
}
