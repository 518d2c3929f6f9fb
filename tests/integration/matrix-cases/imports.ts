import { readFileSync } from "node:fs";
import { db } from "@/lib/db/knex";
import { commitImport } from "@/lib/imports/mutations";
import { detectOptions } from "@/lib/imports/parse";
import type { RoleWorld } from "../../support/role-world";
import { p640Engine, previewHistory, uploadFile, LAYOUT_MAPPING } from "../../support/import-world";
import { request, type Caller, type RouteCase } from "../../support/matrix";

// Cases for the import routes, each on vessel 1 of the role world. Whoever calls uploads and
// previews as themselves (an import is committed by its importer); refused callers never get that far.

const engineerOf = (w: RoleWorld) => ({ id: w.users.engineer.id, name: w.users.engineer.name });
const importerFor = (w: RoleWorld, c: Caller) => (c.user && ["engineer", "chief_engineer"].includes(c.user.role) ? { id: c.user.id, name: c.user.name } : engineerOf(w));
const p = (importId: number) => ({ importId: String(importId) });
let n = 0;
/** A history file no earlier case imported (the gauge serial differs), so it is never a duplicate. */
const freshHistory = () => readFileSync("fixtures/imports/clean.csv", "utf8").replaceAll("MG-0417", `MX-${Date.now().toString(36)}-${++n}`);

async function previewed(w: RoleWorld, c: Caller) {
  const { engineId } = await p640Engine(db, w, "mx");
  return previewHistory(importerFor(w, c), w.vessel1, engineId, freshHistory());
}

export const routeCases: Record<string, RouteCase> = {
  "POST /api/imports/uploads": async (w) => ({ request: request("POST", "/api/imports/uploads", { vesselId: w.vessel1, fileName: "gauge.csv", sizeBytes: 1234 }) }),
  "POST /api/imports": async (w, c) => {
    const { engineId } = await p640Engine(db, w, "mx");
    const text = freshHistory();
    const fileId = await uploadFile(importerFor(w, c), w.vessel1, text);
    return { request: request("POST", "/api/imports", { fileId, vesselId: w.vessel1, destination: "history", engineId, mapping: LAYOUT_MAPPING, options: detectOptions(text), excludedLines: [] }) };
  },
  "GET /api/imports": async (w) => ({ request: request("GET", `/api/imports?vesselId=${w.vessel1}`) }),
  "GET /api/imports/[importId]": async (w, c) => {
    const i = await previewed(w, c);
    return { request: request("GET", `/api/imports/${i.id}`), params: p(i.id) };
  },
  "GET /api/imports/[importId]/file": async (w, c) => {
    const i = await previewed(w, c);
    return { request: request("GET", `/api/imports/${i.id}/file`), params: p(i.id) };
  },
  "POST /api/imports/[importId]/commit": async (w, c) => {
    const i = await previewed(w, c);
    return { request: request("POST", `/api/imports/${i.id}/commit`, { confirmWarnings: true }), params: p(i.id) };
  },
  "POST /api/imports/[importId]/approve": async (w) => {
    const i = await previewed(w, { label: "engineer", user: w.users.engineer });
    await commitImport(engineerOf(w), i.id, {});
    return { request: request("POST", `/api/imports/${i.id}/approve`, {}), params: p(i.id) };
  },
};
