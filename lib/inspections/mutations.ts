import "server-only";
import type { Knex } from "knex";
import { recomputeUnits } from "@/lib/analysis/recompute";
import { writeAudit } from "@/lib/audit/mutations";
import { closePlansForInspection } from "@/lib/outlook/mutations";
import { isRole } from "@/lib/auth/roles";
import { RecordError } from "@/lib/inspections/errors";
import { db as defaultDb } from "@/lib/db/knex";
import { analyseGauging, toGauging } from "@/lib/analysis/input";
import { alertInspectionApproved, alertInspectionReturned, alertInspectionSubmitted, alertUnitsInsideHorizon } from "@/lib/notifications/alert-mutations";
import { removeObject } from "@/lib/photos/storage";
import { approvalRefusal } from "./approval";
import { toWearProfile, type InspectionContext } from "./context";
import { DEFAULT_TALLY_LABELS } from "./form";
import { loadInspectionContext } from "./context-queries";
import { getInspectionDto, getInspectionRow, type InspectionRow } from "./queries";
import { checkHours, derivedLinerHours, structuralErrors, submissionProblems, type Problem } from "./rules";
import type { CreateInspectionInput, InspectionDraft, InspectionState } from "./schemas";
import { inTransaction } from "@/lib/db/transaction";

/*
 * The inspection workflow: create → save draft (optimistic lock on `revision`) →
 * submit → approve or return → amend (a new row; the old one is superseded when the
 * amendment is approved). One transaction per step, each step in the audit trail, and
 * every state change guarded with `WHERE state = …` so a double click or a second
 * device cannot apply it twice. An approved row is never updated except to mark it
 * superseded.
 */

type Actor = { id: string; name: string };
type Conn = Knex | Knex.Transaction;

const EDITABLE: InspectionState[] = ["draft", "returned"];

/** 400 naming the first problem's field, with the full list for the form. */
function refuse(problems: Problem[], status: 400 | 409 = 400): never {
  throw new RecordError(status, `${problems[0].message} (field: ${problems[0].field})`, { field: problems[0].field, problems });
}

function isDuplicateToken(err: unknown): boolean {
  const e = err as { code?: string; sqlMessage?: string };
  return e?.code === "ER_DUP_ENTRY" && /client_token/.test(e.sqlMessage ?? "");
}

async function conflict(conn: Conn, id: number, message: string): Promise<never> {
  const server = await getInspectionDto(id, conn);
  throw new RecordError(409, message, { server });
}

function headerColumns(h: InspectionDraft["header"]) {
  return {
    inspected_on: h.inspectedOn,
    engine_hours: h.engineHours,
    liner_hours: h.linerHours,
    liner_hours_reason: h.linerHoursReason,
    crew: h.crew,
    gauge_temp_c: h.gaugeTempC,
    liner_temp_c: h.linerTempC,
    notes: h.notes,
  };
}

export type CreatedInspection = { id: number; created: boolean; existing?: boolean };

/**
 * The unit's open draft (a new record being entered or one returned for correction, not an
 * amendment), read with a lock so a second request waiting on the unit sees what the first wrote.
 */
async function openDraftOf(trx: Knex.Transaction, unitId: number): Promise<number | null> {
  const row = await trx("inspections").where({ unit_id: unitId }).whereIn("state", EDITABLE).whereNull("supersedes_id").orderBy("id").forUpdate().first("id");
  return row ? (row.id as number) : null;
}

/**
 * Opens a draft for a unit's current liner. Repeating the request with the same
 * `clientToken` (a double tap, a retry after a lost answer) returns the same row, and a
 * unit holds one open draft: when it already has one (opened on another device, or by a
 * crew mate), that draft is answered (`existing`) instead of a second one. The unit's row
 * is locked first, so two requests at once are served one after the other.
 */
export async function createInspection(actor: Actor, input: CreateInspectionInput, db: Knex = defaultDb): Promise<CreatedInspection> {
  const existing = async () => db("inspections").where({ client_token: input.clientToken }).first("id", "unit_id");
  const again = await existing();
  if (again) {
    if (again.unit_id !== input.unitId) throw new RecordError(409, "This request token was already used for another unit.");
    return { id: again.id, created: false };
  }
  try {
    return await inTransaction(db, async (trx) => {
      // Serialises creates on this unit: the second waits here and then finds the first's draft.
      await trx("cylinder_units").where({ id: input.unitId }).forUpdate().first("id");
      const open = await openDraftOf(trx, input.unitId);
      if (open !== null) return { id: open, created: false, existing: true };
      const ctx = await loadInspectionContext(trx, input.unitId, { inspectedOn: input.inspectedOn });
      if (!ctx) throw new RecordError(400, "This unit has no liner in service. Record the fitted liner before gauging it. (field: unitId)", { field: "unitId" });
      const linerHours = input.linerHours ?? derivedLinerHours(ctx.liner, input.engineHours);
      const hours = checkHours(ctx, { ...input, linerHours });
      if (hours.errors.length) refuse(hours.errors.map((p) => ({ ...p, field: p.field.replace(/^header\./, "") })));
      const [id] = await trx("inspections").insert({
        unit_id: input.unitId,
        liner_id: ctx.liner.id,
        inspected_on: input.inspectedOn,
        engine_hours: input.engineHours,
        liner_hours: linerHours,
        liner_hours_reason: input.linerHoursReason,
        crew: input.crew,
        gauge_temp_c: input.gaugeTempC,
        liner_temp_c: input.linerTempC,
        state: "draft",
        version: 1,
        revision: 1,
        client_token: input.clientToken,
        created_by: actor.id,
        source: "manual",
      });
      await trx("checklist_entries").insert(
        DEFAULT_TALLY_LABELS.map((label, i) => ({ inspection_id: id, item_key: `tally_${i + 1}`, kind: "tally", label, done: false })),
      );
      await writeAudit(
        {
          actor,
          action: "inspection.create",
          entityType: "inspection",
          entityId: id,
          vesselId: ctx.unit.vesselId,
          detail: {
            unitId: input.unitId,
            cylinderNo: ctx.unit.cylinderNo,
            linerSerial: ctx.liner.serial,
            inspectedOn: input.inspectedOn,
            engineHours: input.engineHours,
            linerHours,
            linerHoursReason: input.linerHoursReason,
            warnings: hours.warnings.map((w) => w.message),
          },
        },
        trx,
      );
      return { id, created: true };
      // Idempotent: a run repeated after a lost commit finds its own draft (the unit's open draft, or the token).
    }, { idempotent: true });
  } catch (err) {
    // Two identical requests raced: the loser's insert hits the unique token; answer with the winner's row.
    if (isDuplicateToken(err)) {
      const row = await existing();
      if (row) return { id: row.id, created: false };
    }
    throw err;
  }
}

async function writeDraftRows(trx: Knex.Transaction, id: number, ctx: InspectionContext, draft: InspectionDraft) {
  const stationId = new Map(ctx.profile.stations.map((s) => [s.key, s.id]));
  await Promise.all([
    trx("liner_readings").where({ inspection_id: id }).delete(),
    trx("ring_readings").where({ inspection_id: id }).delete(),
    trx("checklist_entries").where({ inspection_id: id }).delete(),
  ]);
  if (draft.readings.length) {
    await trx("liner_readings").insert(
      draft.readings.map((r) => ({
        inspection_id: id,
        station_id: stationId.get(r.stationKey)!,
        axis_key: r.axisKey,
        diameter_mm: r.diameterMm,
        entered_unit: r.enteredUnit,
        warning_confirmed: r.warningConfirmed,
      })),
    );
  }
  if (draft.rings.length) {
    await trx("ring_readings").insert(
      draft.rings.map((r) => ({
        inspection_id: id,
        ring_position: r.position,
        closed_gap_mm: r.closedGapMm,
        gap_measured_in: r.gapMeasuredIn,
        gap_liner_diameter_mm: r.gapMeasuredIn === "liner_worn" ? (r.gapLinerDiameterMm ?? null) : null,
        groove_clearance_mm: r.grooveClearanceMm,
        renewed: r.renewed,
        condition: r.condition,
      })),
    );
  }
  const c = draft.checklist;
  const rows = [
    ...c.tally.map((t) => ({ item_key: t.key, kind: "tally", label: t.label, count_in: t.countIn, count_out: t.countOut, done: t.countIn != null && t.countIn === t.countOut })),
    {
      item_key: "closing_inspection",
      kind: "signature",
      label: "Closing inspection before the crankcase door is closed",
      signed_name: c.closing.signedName,
      signed_at: c.closing.signedAt ? new Date(c.closing.signedAt) : null,
      done: !!(c.closing.signedName && c.closing.signedAt),
    },
    {
      item_key: "rod_nut_pressure",
      kind: "pressure",
      label: "Piston rod nut tightening pressure",
      value_number: c.rodNutPressureBar,
      value_unit: "bar",
      done: c.rodNutPressureBar != null,
    },
    { item_key: "stuffing_box", kind: "check", label: "Piston rod stuffing box overhauled and checked", done: c.stuffingBox.done, note: c.stuffingBox.note },
    {
      item_key: "cylinder_lubrication",
      kind: "check",
      label: "Cylinder lubrication checked: quills, feed rate, oil",
      done: c.cylinderLubrication.done,
      note: c.cylinderLubrication.note,
    },
  ];
  await trx("checklist_entries").insert(rows.map((r) => ({ inspection_id: id, ...r })));
}

export type SavedDraft = { id: number; revision: number; state: InspectionState };

/**
 * Saves a whole draft in one transaction. The caller sends the `revision` it last had;
 * if another device saved in between, the answer is 409 with the server's copy, and
 * nothing is overwritten. Refuses a station, direction or ring the profile lacks.
 * `saveId` is kept with the new revision (and shown in the 409 copy), so a device whose
 * answer was lost can tell its own earlier save from someone else's.
 */
export async function saveDraft(
  actor: Actor,
  id: number,
  revision: number,
  draft: InspectionDraft,
  db: Knex = defaultDb,
  options: { saveId?: string } = {},
): Promise<SavedDraft> {
  return inTransaction(db, async (trx) => {
    const row = await getInspectionRow(trx, id, true);
    if (!row) throw new RecordError(404, "Inspection not found.");
    if (!EDITABLE.includes(row.state)) await conflict(trx, id, `This inspection is ${row.state} and can no longer be edited as a draft.`);
    if (row.revision !== revision) {
      await conflict(trx, id, "Someone else saved this draft meanwhile (another device or person). Nothing was overwritten: compare and choose.");
    }
    const ctx = await loadInspectionContext(trx, row.unitId, {
      inspection: { id, linerId: row.linerId, supersedesId: row.supersedesId, inspectedOn: draft.header.inspectedOn },
    });
    if (!ctx) throw new RecordError(400, "The liner of this inspection is no longer on record.");
    const structural = structuralErrors(ctx.profile, draft);
    if (structural.length) refuse(structural);
    const updated = await trx("inspections")
      .where({ id, revision })
      .whereIn("state", EDITABLE)
      .update({ ...headerColumns(draft.header), revision: revision + 1, last_save_id: options.saveId ?? null });
    if (updated !== 1) await conflict(trx, id, "This draft changed while saving. Nothing was overwritten: compare and choose.");
    await writeDraftRows(trx, id, ctx, draft);
    void actor; // drafts are saved every few seconds; the audit trail records the workflow steps, not each keystroke batch
    return { id, revision: revision + 1, state: row.state };
  });
}

export type Transition = { id: number; state: InspectionState; revision: number; alreadyDone: boolean };

async function loadForTransition(trx: Knex.Transaction, id: number): Promise<InspectionRow> {
  const row = await getInspectionRow(trx, id, true);
  if (!row) throw new RecordError(404, "Inspection not found.");
  return row;
}

async function completeProblems(trx: Knex.Transaction, row: InspectionRow): Promise<{ problems: Problem[]; ctx: InspectionContext; draft: InspectionDraft }> {
  const dto = (await getInspectionDto(row.id, trx))!;
  const ctx = await loadInspectionContext(trx, row.unitId, {
    inspection: { id: row.id, linerId: row.linerId, supersedesId: row.supersedesId, inspectedOn: dto.draft.header.inspectedOn },
  });
  if (!ctx) throw new RecordError(400, "The liner of this inspection is no longer on record.");
  return { problems: submissionProblems(ctx, dto.draft), ctx, draft: dto.draft };
}

/** Draft or returned → submitted, when the record is complete. A repeated submit answers with the current state. */
export async function submitInspection(actor: Actor, id: number, revision: number | undefined, db: Knex = defaultDb): Promise<Transition> {
  return inTransaction(db, async (trx) => {
    const row = await loadForTransition(trx, id);
    if (row.state === "submitted") return { id, state: row.state, revision: row.revision, alreadyDone: true };
    if (!EDITABLE.includes(row.state)) await conflict(trx, id, `This inspection is ${row.state}; only a draft can be submitted.`);
    if (revision !== undefined && revision !== row.revision) {
      await conflict(trx, id, "The draft on the server is newer than yours. Nothing was submitted: compare and choose first.");
    }
    const { problems, ctx, draft } = await completeProblems(trx, row);
    if (problems.length) refuse(problems);
    const n = await trx("inspections")
      .where({ id })
      .whereIn("state", EDITABLE)
      .update({ state: "submitted", submitted_by: actor.id, submitted_at: new Date(), revision: row.revision + 1 });
    if (n !== 1) await conflict(trx, id, "This inspection changed state meanwhile.");
    await writeAudit({ actor, action: "inspection.submit", entityType: "inspection", entityId: id, vesselId: row.vesselId, detail: { from: row.state, version: row.version } }, trx);
    const analysis = analyseGauging(toWearProfile(ctx.profile), toGauging(id, draft.header, draft.readings), ctx.asFitted);
    await alertInspectionSubmitted(trx, id, { maxWearMm: analysis.maxWear?.wearMm ?? null, revision: row.revision + 1 });
    return { id, state: "submitted", revision: row.revision + 1, alreadyDone: false };
  });
}

/**
 * Submitted → approved, by a chief engineer or the superintendent who neither entered nor
 * submitted it (approval.ts). Approving an amendment marks the version it
 * replaces as superseded (kept, and still visible). The unit's stored analysis is
 * recomputed in the same transaction so the fleet screens show the new readings at once.
 */
export async function approveInspection(actor: Actor, id: number, db: Knex = defaultDb): Promise<Transition> {
  return inTransaction(db, async (trx) => {
    const row = await loadForTransition(trx, id);
    if (row.state === "approved") return { id, state: row.state, revision: row.revision, alreadyDone: true };
    if (row.state !== "submitted") await conflict(trx, id, `This inspection is ${row.state}; only a submitted inspection can be approved.`);
    const parties = await trx("inspections").where({ id }).first("created_by as createdBy", "submitted_by as submittedBy", "import_id as importId");
    // Past records from a file are approved together, with their import (lib/imports/mutations.ts).
    if (parties.importId) throw new RecordError(409, `This record came from import ${parties.importId} of past records; approve that import as a whole.`);
    delete parties.importId;
    const approver = await trx("user").where({ id: actor.id }).first("role");
    const refusal = isRole(approver?.role) ? approvalRefusal({ id: actor.id, role: approver.role }, parties) : "Your role does not approve inspection records.";
    if (refusal) throw new RecordError(403, refusal);
    const { problems, ctx, draft } = await completeProblems(trx, row);
    if (problems.length) refuse(problems);
    const n = await trx("inspections")
      .where({ id, state: "submitted" })
      .update({ state: "approved", approved_by: actor.id, approved_at: new Date(), return_comment: null, revision: row.revision + 1 });
    if (n !== 1) await conflict(trx, id, "This inspection changed state meanwhile.");
    if (row.supersedesId) {
      await trx("inspections").where({ id: row.supersedesId, state: "approved" }).update({ state: "superseded" });
      await writeAudit(
        { actor, action: "inspection.superseded", entityType: "inspection", entityId: row.supersedesId, vesselId: row.vesselId, detail: { by: id, version: row.version } },
        trx,
      );
    }
    await recomputeUnits(trx, { unitIds: [row.unitId] });
    await closePlansForInspection(trx, id, actor);
    const analysis = analyseGauging(toWearProfile(ctx.profile), toGauging(id, draft.header, draft.readings), ctx.asFitted);
    await writeAudit(
      {
        actor,
        action: "inspection.approve",
        entityType: "inspection",
        entityId: id,
        vesselId: row.vesselId,
        detail: {
          version: row.version,
          supersedes: row.supersedesId,
          maxWearMm: analysis.maxWear ? Math.round(analysis.maxWear.wearMm * 1000) / 1000 : null,
          maxWearStation: analysis.maxWear?.stationKey ?? null,
          maxOvalityMm: analysis.maxOvality ? Math.round(analysis.maxOvality.ovalityMm * 1000) / 1000 : null,
        },
      },
      trx,
    );
    await alertInspectionApproved(trx, id, actor, { maxWearMm: analysis.maxWear?.wearMm ?? null, maxOvalityMm: analysis.maxOvality?.ovalityMm ?? null });
    await alertUnitsInsideHorizon(trx, { unitIds: [row.unitId] });
    return { id, state: "approved", revision: row.revision + 1, alreadyDone: false };
  });
}

/** Submitted → returned with the chief engineer's comment; the engineer corrects and submits again. */
export async function returnInspection(actor: Actor, id: number, comment: string, db: Knex = defaultDb): Promise<Transition> {
  return inTransaction(db, async (trx) => {
    const row = await loadForTransition(trx, id);
    if (row.state === "returned") return { id, state: row.state, revision: row.revision, alreadyDone: true };
    if (row.state !== "submitted") await conflict(trx, id, `This inspection is ${row.state}; only a submitted inspection can be returned.`);
    const n = await trx("inspections").where({ id, state: "submitted" }).update({ state: "returned", return_comment: comment, revision: row.revision + 1 });
    if (n !== 1) await conflict(trx, id, "This inspection changed state meanwhile.");
    await writeAudit({ actor, action: "inspection.return", entityType: "inspection", entityId: id, vesselId: row.vesselId, detail: { comment, version: row.version } }, trx);
    await alertInspectionReturned(trx, id, actor, comment, row.revision + 1);
    return { id, state: "returned", revision: row.revision + 1, alreadyDone: false };
  });
}

/**
 * Opens an amendment of an approved inspection: a new draft row (version + 1, with
 * `supersedes_id` and the reason) holding a copy of the readings, rings, checklist and
 * photos. The approved row is not touched until the amendment is approved. One open
 * amendment at a time: asking again returns the open one.
 */
export async function amendInspection(actor: Actor, id: number, reason: string, clientToken: string, db: Knex = defaultDb): Promise<CreatedInspection> {
  const byToken = await db("inspections").where({ client_token: clientToken }).first("id", "supersedes_id");
  if (byToken) {
    if (byToken.supersedes_id !== id) throw new RecordError(409, "This request token was already used for another inspection.");
    return { id: byToken.id, created: false };
  }
  try {
    return await inTransaction(db, async (trx) => {
      const row = await loadForTransition(trx, id);
      if (row.state !== "approved") await conflict(trx, id, `Only an approved inspection can be amended; this one is ${row.state}.`);
      const open = await trx("inspections").where({ supersedes_id: id }).whereIn("state", ["draft", "submitted", "returned"]).first("id");
      if (open) return { id: open.id as number, created: false };
      const src = await trx("inspections")
        .where({ id })
        .first("unit_id", "liner_id", "inspected_on", "engine_hours", "liner_hours", "liner_hours_reason", "crew", "gauge_temp_c", "liner_temp_c", "notes", "version");
      const [newId] = await trx("inspections").insert({
        ...src,
        version: src.version + 1,
        state: "draft",
        supersedes_id: id,
        amendment_reason: reason,
        revision: 1,
        client_token: clientToken,
        created_by: actor.id,
        source: "manual",
      });
      await trx.raw(
        `INSERT INTO liner_readings (inspection_id, station_id, axis_key, diameter_mm, entered_unit, warning_confirmed)
         SELECT ?, station_id, axis_key, diameter_mm, entered_unit, warning_confirmed FROM liner_readings WHERE inspection_id = ?`,
        [newId, id],
      );
      await trx.raw(
        `INSERT INTO ring_readings (inspection_id, ring_position, closed_gap_mm, gap_measured_in, gap_liner_diameter_mm, groove_clearance_mm, renewed, \`condition\`)
         SELECT ?, ring_position, closed_gap_mm, gap_measured_in, gap_liner_diameter_mm, groove_clearance_mm, renewed, \`condition\` FROM ring_readings WHERE inspection_id = ?`,
        [newId, id],
      );
      await trx.raw(
        `INSERT INTO checklist_entries (inspection_id, item_key, kind, label, count_in, count_out, value_number, value_unit, done, signed_name, signed_at, note)
         SELECT ?, item_key, kind, label, count_in, count_out, value_number, value_unit, done, signed_name, signed_at, note FROM checklist_entries WHERE inspection_id = ?`,
        [newId, id],
      );
      // Photos are shared, not copied: the objects are deleted only when no version refers to them.
      await trx.raw(
        `INSERT INTO inspection_photos (inspection_id, file_id, thumbnail_file_id, station_id, ring_position, caption)
         SELECT ?, file_id, thumbnail_file_id, station_id, ring_position, caption FROM inspection_photos WHERE inspection_id = ?`,
        [newId, id],
      );
      await writeAudit({ actor, action: "inspection.amend", entityType: "inspection", entityId: newId, vesselId: row.vesselId, detail: { supersedes: id, version: src.version + 1, reason } }, trx);
      await writeAudit(
        { actor, action: "inspection.amendment_opened", entityType: "inspection", entityId: id, vesselId: row.vesselId, detail: { amendment: newId, reason } },
        trx,
      );
      return { id: newId as number, created: true };
    }, { idempotent: true });
  } catch (err) {
    if (isDuplicateToken(err)) {
      const row = await db("inspections").where({ client_token: clientToken }).first("id");
      if (row) return { id: row.id, created: false };
    }
    throw err;
  }
}

export type DiscardedDraft = { id: number; unitId: number; deletedObjects: number };

/**
 * Discards a draft opened by mistake: only its author may, and only while it is a draft
 * (never submitted; a returned record was seen by the chief engineer and is corrected
 * instead). The row goes, and with it its readings, rings, checklist and photo links; the
 * photos' objects leave the store unless another version of the record still shares them.
 * The audit entry keeps what was discarded, so the trail still explains the gap.
 */
export async function discardDraft(actor: Actor, id: number, db: Knex = defaultDb): Promise<DiscardedDraft> {
  const { keys, unitId } = await inTransaction(db, async (trx) => {
    const row = await getInspectionRow(trx, id, true);
    if (!row) throw new RecordError(404, "Inspection not found.");
    if (row.state !== "draft") {
      await conflict(
        trx,
        id,
        row.state === "returned"
          ? "This record was returned by the chief engineer for correction; correct it and submit it again rather than discarding it."
          : `This inspection is ${row.state}; only a draft can be discarded.`,
      );
    }
    if (row.createdBy !== actor.id) throw new RecordError(403, "Only the person who opened this draft can discard it.");
    const header = await trx("inspections").where({ id }).first("inspected_on", "engine_hours", "liner_hours", "crew", "client_token");
    const [readings, rings, photos] = await Promise.all([
      trx("liner_readings").where({ inspection_id: id }).count({ n: "*" }).first(),
      trx("ring_readings").where({ inspection_id: id }).count({ n: "*" }).first(),
      trx("inspection_photos as p")
        .join("stored_files as f", "f.id", "p.file_id")
        .leftJoin("stored_files as t", "t.id", "p.thumbnail_file_id")
        .where("p.inspection_id", id)
        .select<{ fileId: number; objectKey: string; thumbId: number | null; thumbKey: string | null }[]>("p.file_id as fileId", "f.object_key as objectKey", "t.id as thumbId", "t.object_key as thumbKey"),
    ]);
    await trx("inspections").where({ id, state: "draft" }).delete();
    // Photos an amendment shares with its original stay with the original.
    const keys: string[] = [];
    for (const p of photos) {
      if (await trx("inspection_photos").where({ file_id: p.fileId }).first("id")) continue;
      const ids = [p.fileId, ...(p.thumbId ? [p.thumbId] : [])];
      await trx("stored_files").whereIn("id", ids).update({ status: "deleted" });
      keys.push(p.objectKey, ...(p.thumbKey ? [p.thumbKey] : []));
    }
    await writeAudit(
      {
        actor,
        action: "inspection.discard",
        entityType: "inspection",
        entityId: id,
        vesselId: row.vesselId,
        detail: {
          unitId: row.unitId,
          version: row.version,
          supersedes: row.supersedesId,
          inspectedOn: header?.inspected_on instanceof Date ? header.inspected_on.toISOString().slice(0, 10) : (header?.inspected_on ?? null),
          engineHours: header ? Number(header.engine_hours) : null,
          linerHours: header ? Number(header.liner_hours) : null,
          crew: header?.crew ?? null,
          readings: Number(readings?.n ?? 0),
          rings: Number(rings?.n ?? 0),
          photos: photos.length,
          objectsDeleted: keys.length,
        },
      },
      trx,
    );
    return { keys, unitId: row.unitId };
  });
  // After the commit: a failed object delete leaves an orphan in the store, never a record pointing at nothing.
  for (const k of keys) await removeObject(k).catch((err) => console.error("removing a discarded photo failed", k, err));
  return { id, unitId, deletedObjects: keys.length };
}

/** For the photo steps: the inspection must exist and still be editable; returns its row, locked. */
export async function lockEditableInspection(trx: Conn, id: number): Promise<InspectionRow> {
  const row = await getInspectionRow(trx, id, true);
  if (!row) throw new RecordError(404, "Inspection not found.");
  if (!EDITABLE.includes(row.state)) {
    throw new RecordError(409, `This inspection is ${row.state}; photos can be added or removed only while it is a draft (amend it to change an approved record).`);
  }
  return row;
}
