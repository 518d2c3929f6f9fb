import { createHash } from "node:crypto";
import { readFileSync } from "node:fs";
import { beforeAll, describe, expect, it, vi } from "vitest";
import { asCaller, mockedCookies, mockedHeaders } from "../support/next-mocks";

vi.mock("next/headers", () => ({ headers: async () => mockedHeaders(), cookies: async () => mockedCookies() }));
vi.mock("next/cache", () => ({ revalidatePath: vi.fn(), revalidateTag: vi.fn(), updateTag: vi.fn(), refresh: vi.fn() }));

import { GET as logRoute } from "@/app/api/imports/route";
import { db } from "@/lib/db/knex";
import { approveImport, commitImport, previewImport } from "@/lib/imports/mutations";
import { getImportDto, listSavedMappings } from "@/lib/imports/queries";
import { detectOptions } from "@/lib/imports/parse";
import { approveInspection } from "@/lib/inspections/mutations";
import { readObject } from "@/lib/photos/storage";
import { p640Engine, previewHistory, uploadFile, LAYOUT_MAPPING } from "../support/import-world";
import { request } from "../support/matrix";
import { buildRoleWorld, WORLD_PASSWORD, type RoleWorld } from "../support/role-world";
import { signInCookie } from "../support/sessions";

/*
 * The importer against the real database and the S3 fake: files of our own making
 * (fixtures/imports/), an engine of the demo's 640 mm design with six liners fitted in 2015.
 */

const fixture = (name: string) => readFileSync(`fixtures/imports/${name}`, "utf8");
/** Sets the diameter of the first ring-1-at-TDC row at or after `from` (0-based) and returns its line number. */
function alterDiameter(lines: string[], from: number, value: string): number {
  const i = lines.findIndex((l, k) => k >= from && /,R1,,(fa|ath),/.test(l));
  lines[i] = lines[i].replace(/,(fa|ath),[\d.]+,/, `,$1,${value},`);
  return i + 1;
}
const sha = (s: string) => createHash("sha256").update(Buffer.from(s, "utf8")).digest("hex");

let world: RoleWorld;
const engineer = () => ({ id: world.users.engineer.id, name: world.users.engineer.name });
const chief = () => ({ id: world.users.chief.id, name: world.users.chief.name });
const supt = () => ({ id: world.users.supt.id, name: world.users.supt.name });

beforeAll(async () => {
  world = await buildRoleWorld(db, "imp");
}, 60_000);

async function counts(importId: number) {
  const ids = await db("inspections").where({ import_id: importId }).pluck("id");
  const readings = ids.length ? Number((await db("liner_readings").whereIn("inspection_id", ids).count({ n: "*" }).first())!.n) : 0;
  const audit = Number((await db("audit_log").where({ entity_type: "import", entity_id: String(importId) }).count({ n: "*" }).first())!.n);
  return { inspections: ids.length, readings, audit };
}

describe("ten years of past records into an engine's history", () => {
  it("previews, commits in one go, waits for approval by someone else, then enters the trend", async () => {
    const { engineId, unitIds } = await p640Engine(db, world, "hist");
    const text = fixture("history-10-years.csv");
    const preview = await previewHistory(engineer(), world.vessel1, engineId, text);
    expect(preview.status).toBe("previewed");
    expect(preview.errorCount).toBe(0);
    expect(preview.groupCount).toBe(60);
    expect(await counts(preview.id)).toMatchObject({ inspections: 0 });

    const done = await commitImport(engineer(), preview.id, { confirmWarnings: false });
    expect(done.status).toBe("committed");
    expect(done.inspectionIds).toHaveLength(60);
    expect(await counts(preview.id)).toEqual({ inspections: 60, readings: 60 * 18, audit: 1 });
    const rec = await db("inspections").where({ id: done.inspectionIds[0] }).first("state", "source", "created_by", "notes", "gauge_serial");
    expect(rec).toMatchObject({ state: "submitted", source: "import", created_by: engineer().id, gauge_serial: "MG-0417" });
    expect(rec.notes).toContain("Imported from past records (readings.csv)");
    // The source file is in the store, with the SHA-256 of its bytes.
    const file = await db("stored_files").where({ id: done.fileId }).first("object_key", "sha256", "status", "kind");
    expect(file).toMatchObject({ sha256: sha(text), status: "stored", kind: "gauge_import" });
    expect((await readObject(file.object_key)).toString("utf8")).toBe(text);

    // Not in the analysis until approved; one record cannot be approved on its own.
    expect(await db("unit_analysis").where({ unit_id: unitIds[2] }).first("unit_id")).toBeUndefined();
    await expect(approveInspection(chief(), done.inspectionIds[0])).rejects.toThrow(/approve that import as a whole/);

    const approved = await approveImport(chief(), preview.id);
    expect(approved.status).toBe("approved");
    expect(approved.approvedBy?.id).toBe(chief().id);
    expect(await db("inspections").where({ import_id: preview.id, state: "approved" }).count({ n: "*" }).first()).toEqual({ n: 60 });
    const analysis = await db("unit_analysis").where({ unit_id: unitIds[2] }).first("max_wear_mm", "wear_rate_mm_per_1000h", "limit_at_liner_hours");
    // Normal slow-speed wear, 0.025–0.05 mm / 1000 h (BrightHub Engineering), and a projection to the limit.
    expect(analysis.wear_rate_mm_per_1000h).toBeGreaterThan(0.025);
    expect(analysis.wear_rate_mm_per_1000h).toBeLessThan(0.05);
    expect(Number(analysis.limit_at_liner_hours)).toBeGreaterThan(60_000);
    const trail = await db("audit_log").where({ entity_type: "inspection", entity_id: String(done.inspectionIds[0]) }).orderBy("id").pluck("action");
    expect(trail).toEqual(["inspection.import", "inspection.approve"]);
  }, 60_000);

  it("the importer cannot approve their own import, a chief included: the superintendent approves", async () => {
    const { engineId } = await p640Engine(db, world, "own");
    const text = fixture("history-10-years.csv").replaceAll("MG-0417", "MG-0418");
    const p = await previewHistory(chief(), world.vessel1, engineId, text);
    await commitImport(chief(), p.id, {});
    await expect(approveImport(chief(), p.id)).rejects.toThrow(/You imported this import|someone else checks it/);
    await expect(approveImport(engineer(), p.id)).rejects.toThrow(/does not approve/);
    expect((await approveImport(supt(), p.id)).status).toBe("approved");
  }, 60_000);
});

describe("all or nothing", () => {
  it("an error on a row in the middle of the file writes nothing, and names the line", async () => {
    const { engineId } = await p640Engine(db, world, "err");
    const lines = fixture("history-10-years.csv").split("\n");
    const line = alterDiameter(lines, 660, "6405.300");
    const text = lines.join("\n");
    const p = await previewHistory(engineer(), world.vessel1, engineId, text);
    expect(p.errorCount).toBe(1);
    expect(p.preview!.issues[0]).toMatchObject({ line, level: "error" });
    await expect(commitImport(engineer(), p.id, { confirmWarnings: true })).rejects.toThrow(new RegExp(`1 error remains; nothing was imported. Line ${line}: `));
    expect(await counts(p.id)).toEqual({ inspections: 0, readings: 0, audit: 0 });
  }, 60_000);

  it("a failure while writing, half-way through the rows, leaves nothing behind", async () => {
    const { engineId } = await p640Engine(db, world, "mid");
    const lines = fixture("history-10-years.csv").split("\n");
    alterDiameter(lines, 700, "641.777");
    const text = lines.join("\n");
    const p = await previewHistory(engineer(), world.vessel1, engineId, text);
    expect(p.errorCount).toBe(0);
    // The database itself refuses that one reading, after the rows before it were written.
    await db.raw("DROP TRIGGER IF EXISTS import_test_refuse");
    await db.raw("CREATE TRIGGER import_test_refuse BEFORE INSERT ON liner_readings FOR EACH ROW BEGIN IF NEW.diameter_mm = 641.777 THEN SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'refused by test'; END IF; END");
    try {
      await expect(commitImport(engineer(), p.id, { confirmWarnings: true })).rejects.toThrow(/refused by test/);
    } finally {
      await db.raw("DROP TRIGGER IF EXISTS import_test_refuse");
    }
    expect(await counts(p.id)).toEqual({ inspections: 0, readings: 0, audit: 0 });
    expect((await getImportDto(p.id))!.status).toBe("previewed");
    // With the obstacle gone the same import goes through whole.
    expect((await commitImport(engineer(), p.id, { confirmWarnings: true })).inspectionIds).toHaveLength(60);
  }, 60_000);
});

describe("the same file twice", () => {
  it("is refused, naming the earlier import; as a replacement the earlier one is superseded, not deleted", async () => {
    const { engineId, unitIds } = await p640Engine(db, world, "dup");
    const text = fixture("history-10-years.csv").replaceAll("MG-0417", "MG-0419");
    const first = await commitImport(engineer(), (await previewHistory(engineer(), world.vessel1, engineId, text)).id, {});
    await approveImport(chief(), first.id);

    const again = previewHistory(engineer(), world.vessel1, engineId, text);
    await expect(again).rejects.toMatchObject({ status: 409, details: { duplicateOf: first.id } });
    await expect(previewHistory(engineer(), world.vessel1, engineId, text)).rejects.toThrow(/already imported on .* \(import \d+\)/);

    const replacement = await previewHistory(engineer(), world.vessel1, engineId, text, { replacesImportId: first.id });
    expect(replacement.errorCount).toBe(0); // its days are not "already on record": they belong to the import it replaces
    const second = await commitImport(engineer(), replacement.id, {});
    const old = await getImportDto(first.id);
    expect(old).toMatchObject({ status: "superseded", supersededById: second.id });
    expect(await db("inspections").where({ import_id: first.id }).distinct("state").pluck("state")).toEqual(["superseded"]);
    expect(await db("inspections").where({ import_id: first.id }).count({ n: "*" }).first()).toEqual({ n: 60 });
    // Until the replacement is approved its unit shows no imported gauging.
    expect(await db("inspections").where({ unit_id: unitIds[0], state: "approved" }).count({ n: "*" }).first()).toEqual({ n: 0 });
    await approveImport(chief(), second.id);
    expect(await db("inspections").where({ unit_id: unitIds[0], state: "approved" }).count({ n: "*" }).first()).toEqual({ n: 10 });
  }, 90_000);
});

describe("a gauge file into a draft", () => {
  it("opens a draft with the file's readings; a second file asks before changing typed readings", async () => {
    const { engineId, unitIds } = await p640Engine(db, world, "draft");
    void engineId;
    const text = fixture("clean.csv");
    const fileId = await uploadFile(engineer(), world.vessel1, text, "gauge.csv");
    const p = await previewImport(engineer(), {
      fileId,
      vesselId: world.vessel1,
      destination: "draft",
      unitId: unitIds[0],
      newDraft: { inspectedOn: "2024-05-30", engineHours: 16720 },
      mapping: LAYOUT_MAPPING,
      options: detectOptions(text),
      excludedLines: [],
      saveMapping: true,
    });
    expect(p.errorCount).toBe(0);
    const done = await commitImport(engineer(), p.id, {});
    const draftId = done.inspectionId!;
    expect(await db("inspections").where({ id: draftId }).first("state", "gauge_serial")).toEqual({ state: "draft", gauge_serial: "MG-0417" });
    expect(await db("liner_readings").where({ inspection_id: draftId }).count({ n: "*" }).first()).toEqual({ n: 18 });
    expect(await db("ring_readings").where({ inspection_id: draftId }).count({ n: "*" }).first()).toEqual({ n: 4 });

    // The mapping is kept for this vessel and file shape.
    const saved = await listSavedMappings(world.vessel1);
    expect(Object.values(saved).some((m) => m.mapping.diameter === 7)).toBe(true);

    // A second file with one different reading, into the same draft.
    const changed = text.replace("640.530", "640.560");
    const p2 = await previewImport(engineer(), {
      fileId: await uploadFile(engineer(), world.vessel1, changed, "gauge2.csv"),
      vesselId: world.vessel1,
      destination: "draft",
      unitId: unitIds[0],
      inspectionId: draftId,
      mapping: LAYOUT_MAPPING,
      options: detectOptions(changed),
      excludedLines: [],
      saveMapping: false,
    });
    expect(p2.preview!.overwrites).toEqual([{ what: "Ring 1 at TDC fa", typed: "640.530 mm", file: "640.560 mm", line: 4 }]);
    await expect(commitImport(engineer(), p2.id, {})).rejects.toMatchObject({ status: 409, details: { field: "typedReadings" } });
    expect(Number((await db("liner_readings as r").join("profile_stations as s", "s.id", "r.station_id").where({ "r.inspection_id": draftId, "s.station_key": "R1", "r.axis_key": "fa" }).first("r.diameter_mm")).diameter_mm)).toBe(640.53);
    await commitImport(engineer(), p2.id, { typedReadings: "replace" });
    expect(Number((await db("liner_readings as r").join("profile_stations as s", "s.id", "r.station_id").where({ "r.inspection_id": draftId, "s.station_key": "R1", "r.axis_key": "fa" }).first("r.diameter_mm")).diameter_mm)).toBe(640.56);
  }, 60_000);
});

describe("the import log", () => {
  it("lists who imported what, and its spreadsheet copy never holds a formula", async () => {
    const { engineId } = await p640Engine(db, world, "log");
    const text = fixture("history-10-years.csv").replaceAll("MG-0417", "MG-0420");
    const fileId = await uploadFile(engineer(), world.vessel1, text, "=cmd|' /C calc'!A0.csv");
    await commitImport(engineer(), (await previewHistory(engineer(), world.vessel1, engineId, text, { fileId })).id, {});
    asCaller(await signInCookie(world.users.chief.email, WORLD_PASSWORD));
    const res = await logRoute(request("GET", `/api/imports?vesselId=${world.vessel1}&format=csv`));
    expect(res.status).toBe(200);
    const csv = await res.text();
    expect(csv).toContain(",'=cmd|' /C calc'!A0.csv,");
    expect(csv).not.toMatch(/(^|,)=cmd/m);
    const json = await (await logRoute(request("GET", `/api/imports?vesselId=${world.vessel1}`))).json();
    expect(json.imports[0]).toMatchObject({ fileName: "=cmd|' /C calc'!A0.csv", createdBy: { name: "Eli Engineer" }, status: "committed" });
  }, 60_000);
});
