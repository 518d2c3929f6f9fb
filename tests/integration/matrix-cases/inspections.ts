import { randomToken } from "@/lib/inspections/form";
import type { RoleWorld } from "../../support/role-world";
import { approvedOn, draftOn, makeImage, photoOn, readyUnit, submittedOn, uploadToSlot } from "../../support/inspection-builders";
import { firstUnitOf, request, type Caller, type RouteCase } from "../../support/matrix";

// Cases for the inspection entry, workflow and photo routes. Each builds a fresh record on
// vessel 1 (through the real mutations, as the vessel-1 engineer) so an allowed caller succeeds.

const engineerOf = (w: RoleWorld) => ({ id: w.users.engineer.id, name: w.users.engineer.name });
const chiefOf = (w: RoleWorld) => ({ id: w.users.chief.id, name: w.users.chief.name });
/** Whoever makes the call completes their own upload; refused callers never get that far. */
const uploaderFor = (w: RoleWorld, c: Caller) => (c.user && ["engineer", "chief_engineer"].includes(c.user.role) ? { id: c.user.id, name: c.user.name } : engineerOf(w));
const unitOf = (w: RoleWorld) => firstUnitOf(w.engine1);
const p = (inspectionId: number, extra: Record<string, string> = {}) => ({ inspectionId: String(inspectionId), ...extra });

export const routeCases: Record<string, RouteCase> = {
  "POST /api/inspections": async (w) => {
    const unitId = await unitOf(w);
    const ctx = await readyUnit(unitId);
    const engineHours = Math.max(39_000, ctx.previous?.engineHours ?? 0);
    const body = { unitId, clientToken: randomToken(24), inspectedOn: new Date().toISOString().slice(0, 10), engineHours, linerHours: engineHours - 10_000, linerHoursReason: null, crew: null, gaugeTempC: null, linerTempC: null };
    return { request: request("POST", "/api/inspections", body) };
  },
  "GET /api/inspections/[inspectionId]": async (w) => {
    const d = await draftOn(await unitOf(w), engineerOf(w), { complete: false });
    return { request: request("GET", `/api/inspections/${d.id}`), params: p(d.id) };
  },
  "PUT /api/inspections/[inspectionId]": async (w) => {
    const d = await draftOn(await unitOf(w), engineerOf(w), { complete: false });
    return { request: request("PUT", `/api/inspections/${d.id}`, { revision: d.revision, draft: d.draft }), params: p(d.id) };
  },
  "DELETE /api/inspections/[inspectionId]": async (w, caller) => {
    // Only a draft's author may discard it: an allowed caller discards a draft of their own.
    const d = await draftOn(await unitOf(w), uploaderFor(w, caller), { complete: false });
    return { request: request("DELETE", `/api/inspections/${d.id}`), params: p(d.id) };
  },
  "POST /api/inspections/[inspectionId]/submit": async (w) => {
    const d = await draftOn(await unitOf(w), engineerOf(w));
    return { request: request("POST", `/api/inspections/${d.id}/submit`, { revision: d.revision }), params: p(d.id) };
  },
  "POST /api/inspections/[inspectionId]/approve": async (w) => {
    const s = await submittedOn(await unitOf(w), engineerOf(w));
    return { request: request("POST", `/api/inspections/${s.id}/approve`, {}), params: p(s.id) };
  },
  "POST /api/inspections/[inspectionId]/return": async (w) => {
    const s = await submittedOn(await unitOf(w), engineerOf(w));
    return { request: request("POST", `/api/inspections/${s.id}/return`, { comment: "Re-gauge station s2, please." }), params: p(s.id) };
  },
  "POST /api/inspections/[inspectionId]/amend": async (w) => {
    const a = await approvedOn(await unitOf(w), engineerOf(w), chiefOf(w));
    return { request: request("POST", `/api/inspections/${a.id}/amend`, { reason: "Typing error at station s3.", clientToken: randomToken(24) }), params: p(a.id) };
  },
  "POST /api/inspections/[inspectionId]/photos": async (w) => {
    const d = await draftOn(await unitOf(w), engineerOf(w), { complete: false });
    return { request: request("POST", `/api/inspections/${d.id}/photos`, { fileName: "a.png", contentType: "image/png", sizeBytes: 1234 }), params: p(d.id) };
  },
  "POST /api/inspections/[inspectionId]/photos/complete": async (w, caller) => {
    const d = await draftOn(await unitOf(w), engineerOf(w), { complete: false });
    const slot = await uploadToSlot(d.id, uploaderFor(w, caller), await makeImage("png"));
    return { request: request("POST", `/api/inspections/${d.id}/photos/complete`, { fileId: slot.fileId, caption: null, stationKey: null, ringPosition: null }), params: p(d.id) };
  },
  "GET /api/inspections/[inspectionId]/photos/[photoId]": async (w) => {
    const d = await draftOn(await unitOf(w), engineerOf(w), { complete: false });
    const photo = await photoOn(d.id, engineerOf(w));
    return { request: request("GET", `/api/inspections/${d.id}/photos/${photo.id}?variant=thumb`), params: p(d.id, { photoId: String(photo.id) }) };
  },
  "DELETE /api/inspections/[inspectionId]/photos/[photoId]": async (w) => {
    const d = await draftOn(await unitOf(w), engineerOf(w), { complete: false });
    const photo = await photoOn(d.id, engineerOf(w));
    return { request: request("DELETE", `/api/inspections/${d.id}/photos/${photo.id}`), params: p(d.id, { photoId: String(photo.id) }) };
  },
};
