import type { Knex } from "knex";
import { db as appDb } from "@/lib/db/knex";
import { randomToken } from "@/lib/inspections/form";
import { approveInspection, createInspection, saveDraft, submitInspection } from "@/lib/inspections/mutations";
import { loadInspectionContext } from "@/lib/inspections/context-queries";
import { completePhoto, createPhotoSlot } from "@/lib/photos/mutations";
import type { InspectionContext } from "@/lib/inspections/context";
import type { InspectionDraft } from "@/lib/inspections/schemas";

/*
 * Small builders for inspection tests: a liner in a unit, a running-hours log, and a
 * complete, plausible draft for a unit's profile. Everything invented; values follow
 * the ranges in the domain notes (wear a few tenths of a millimetre, gaps inside the
 * profile's new range) so no plausibility warning fires unless a test asks for one.
 */

const DAY_MS = 86_400_000;
export const isoDay = (ms: number) => new Date(ms).toISOString().slice(0, 10);
export const daysAgo = (n: number) => isoDay(Date.now() - n * DAY_MS);

/** The unit's liner in service, fitting one when there is none. */
export async function ensureLiner(db: Knex, unitId: number, o: { serial?: string; installedEngineHours?: number; linerHoursAtInstall?: number; installedOn?: string } = {}): Promise<number> {
  const found = await db("liners").where({ unit_id: unitId }).whereNull("removed_on").first("id");
  if (found) return found.id;
  const [id] = await db("liners").insert({
    unit_id: unitId,
    serial: o.serial ?? `TL-${unitId}-${Date.now().toString(36)}`,
    installed_on: o.installedOn ?? daysAgo(900),
    installed_engine_hours: o.installedEngineHours ?? 10_000,
    liner_hours_at_install: o.linerHoursAtInstall ?? 0,
  });
  return id;
}

/**
 * A running-hours log for an engine: one entry every 10 days at `perDay` hours a day,
 * ending today at `nowHours` (entries that exist are left alone).
 */
export async function ensureHoursLog(db: Knex, engineId: number, o: { nowHours?: number; perDay?: number; entries?: number } = {}): Promise<void> {
  const now = o.nowHours ?? 40_000;
  const perDay = o.perDay ?? 20;
  const n = o.entries ?? 12;
  const rows = Array.from({ length: n }, (_, i) => ({ engine_id: engineId, logged_on: daysAgo(i * 10), engine_hours: now - i * 10 * perDay }));
  await db("running_hours_log").insert(rows).onConflict(["engine_id", "logged_on"]).ignore();
}

/** Engine hours on a given number of days ago, on the log ensureHoursLog writes. */
export const hoursOnDay = (daysBack: number, o: { nowHours?: number; perDay?: number } = {}) => (o.nowHours ?? 40_000) - daysBack * (o.perDay ?? 20);

export type DraftOptions = {
  inspectedOn: string;
  engineHours: number;
  /** Wear at the most worn station (ring 1 at TDC), mm; other stations wear less. */
  wearMm?: number;
  withChecklist?: boolean;
  tempC?: number | null;
};

/** A complete draft for the context's profile: every cell, every ring, a matching tally and a signed closing. */
export function completeDraft(ctx: InspectionContext, o: DraftOptions): InspectionDraft {
  const p = ctx.profile;
  const wear = o.wearMm ?? 0.4;
  const linerHours = Math.round((o.engineHours - ctx.liner.installedEngineHours + ctx.liner.linerHoursAtInstall) * 10) / 10;
  const n = p.stations.length;
  const readings = p.stations.flatMap((s, i) => {
    const unworn = s.role === "unworn_top" || s.role === "unworn_bottom";
    const w = unworn ? 0.01 : s.role === "ring_tdc" && i === p.stations.findIndex((x) => x.role === "ring_tdc") ? wear : wear * Math.max(0.2, 1 - i / n);
    return p.axes.map((a, ai) => ({
      stationKey: s.key,
      axisKey: a.key,
      diameterMm: Math.round((p.boreMm + w - ai * Math.min(0.05, w / 4)) * 1000) / 1000,
      enteredUnit: "mm" as const,
      warningConfirmed: null,
    }));
  });
  const rings = p.rings.map((r) => ({
    position: r.position,
    closedGapMm: Math.round(((r.gapNewMinMm + r.gapNewMaxMm) / 2 + 0.2) * 100) / 100,
    gapMeasuredIn: "gauge_ring" as const,
    grooveClearanceMm: Math.round(((r.grooveNewMinMm + r.grooveNewMaxMm) / 2) * 100) / 100,
    renewed: false,
    condition: "Free in groove",
  }));
  const withChecklist = o.withChecklist ?? true;
  return {
    header: {
      inspectedOn: o.inspectedOn,
      engineHours: o.engineHours,
      linerHours,
      linerHoursReason: null,
      crew: "3/E and fitter",
      gaugeTempC: o.tempC === undefined ? 24 : o.tempC,
      linerTempC: o.tempC === undefined ? 31 : o.tempC,
      notes: null,
    },
    readings,
    rings,
    checklist: withChecklist
      ? {
          tally: [
            { key: "tally_1", label: "Spanners and sockets", countIn: 14, countOut: 14 },
            { key: "tally_2", label: "Rags", countIn: 6, countOut: 6 },
          ],
          closing: { signedName: "Test Second Engineer", signedAt: new Date().toISOString() },
          rodNutPressureBar: p.rodNutPressureBar ?? 900,
          stuffingBox: { done: true, note: null },
          cylinderLubrication: { done: true, note: null },
        }
      : {
          tally: [],
          closing: { signedName: null, signedAt: null },
          rodNutPressureBar: null,
          stuffingBox: { done: false, note: null },
          cylinderLubrication: { done: false, note: null },
        },
  };
}

/** A small real image made on the spot (so the thumbnailer and the sniffer see a true file). */
export async function makeImage(format: "png" | "jpeg", size = 16): Promise<Buffer> {
  const sharp = (await import("sharp")).default;
  const img = sharp({ create: { width: size, height: size, channels: 3, background: { r: 90, g: 110, b: 130 } } });
  return format === "png" ? img.png().toBuffer() : img.jpeg().toBuffer();
}

// ── workflow builders (through the real mutations) ───────────────────────────────


type Actor = { id: string; name: string };

/** Makes a unit ready for gauging: a liner fitted at 10,000 h and a running-hours log ending today at 40,000 h. */
export async function readyUnit(unitId: number): Promise<InspectionContext> {
  await ensureLiner(appDb, unitId);
  const unit = await appDb("cylinder_units").where({ id: unitId }).first("engine_id");
  await ensureHoursLog(appDb, unit.engine_id);
  return (await loadInspectionContext(appDb, unitId, { inspectedOn: daysAgo(0) }))!;
}

/** A draft of today on a unit, complete (every cell, ring and checklist item) unless asked otherwise. */
export async function draftOn(unitId: number, actor: Actor, o: { complete?: boolean; engineHours?: number; wearMm?: number } = {}) {
  const ctx = await readyUnit(unitId);
  const engineHours = o.engineHours ?? Math.max(39_000, ctx.previous?.engineHours ?? 0);
  const draft = completeDraft(ctx, { inspectedOn: daysAgo(0), engineHours, wearMm: o.wearMm });
  // A unit holds one open draft, and a new inspection request answers it: clear what an
  // earlier test left open so this one gets a draft of its own.
  await clearOpenDrafts(unitId);
  const { id } = await createInspection(actor, { unitId, clientToken: randomToken(24), ...draft.header });
  if (o.complete === false) return { id, revision: 1, ctx, draft };
  const saved = await saveDraft(actor, id, 1, draft);
  return { id, revision: saved.revision, ctx, draft };
}

/** Test set-up only: removes a unit's open drafts and returned records (not amendments), rows and all. */
export async function clearOpenDrafts(unitId: number): Promise<void> {
  await appDb("inspections").where({ unit_id: unitId }).whereIn("state", ["draft", "returned"]).whereNull("supersedes_id").delete();
}

export async function submittedOn(unitId: number, actor: Actor, o: { wearMm?: number } = {}) {
  const d = await draftOn(unitId, actor, o);
  const t = await submitInspection(actor, d.id, d.revision);
  return { ...d, revision: t.revision };
}

export async function approvedOn(unitId: number, engineer: Actor, chief: Actor, o: { wearMm?: number } = {}) {
  const s = await submittedOn(unitId, engineer, o);
  const t = await approveInspection(chief, s.id);
  return { ...s, revision: t.revision };
}

/** Reserves a photo slot as `actor` and uploads `bytes` to it the way a browser does (presigned PUT). */
export async function uploadToSlot(inspectionId: number, actor: Actor, bytes: Buffer, o: { contentType?: string; fileName?: string } = {}) {
  const contentType = o.contentType ?? "image/png";
  const slot = await createPhotoSlot(actor, inspectionId, { fileName: o.fileName ?? "test.png", contentType, sizeBytes: bytes.length });
  const res = await fetch(slot.uploadUrl, { method: "PUT", headers: slot.headers, body: new Uint8Array(bytes) });
  if (!res.ok) throw new Error(`presigned PUT failed: ${res.status} ${await res.text()}`);
  return slot;
}

/** A stored photo on a draft (uploaded and completed). */
export async function photoOn(inspectionId: number, actor: Actor) {
  const slot = await uploadToSlot(inspectionId, actor, await makeImage("png"));
  return completePhoto(actor, inspectionId, { fileId: slot.fileId, caption: "Test photo", stationKey: null, ringPosition: null });
}
