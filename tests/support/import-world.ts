import type { Knex } from "knex";
import { buildScenario } from "@/fixtures/demo/scenario";
import { createImportUpload, previewImport } from "@/lib/imports/mutations";
import { LAYOUT_COLUMNS, type ColumnMapping } from "@/lib/imports/layout";
import { detectOptions } from "@/lib/imports/parse";
import type { CreateImportInput } from "@/lib/imports/schemas";
import type { RoleWorld } from "./role-world";

/*
 * For the importer's tests: on vessel 1 of a role world, an engine of the demo's 640 mm design
 * (its stations, depths and rings, as fixtures/imports/ expects) with six units, each with a
 * liner fitted on 2015-03-01 at 0 engine hours and no record yet. A fresh engine per call, so
 * tests do not see each other's records.
 */

type Actor = { id: string; name: string };

let seq = 0;

export async function p640Engine(db: Knex, world: RoleWorld, tag: string): Promise<{ engineId: number; unitIds: number[]; profileId: number }> {
  const seed = buildScenario().profiles.find((p) => p.key === "p640")!;
  const name = `${seed.name} (import tests)`;
  let profile = await db("engine_profiles").where({ name }).first("id");
  if (!profile) {
    const [id] = await db("engine_profiles").insert({
      name,
      designation: seed.designation,
      bore_mm: seed.boreMm,
      stroke_mm: seed.strokeMm,
      liner_wear_limit_mm: seed.linerWearLimitMm,
      ovality_limit_mm: seed.ovalityLimitMm,
      ring_count: seed.rings.length,
      overhaul_interval_hours: seed.overhaulIntervalHours,
      rod_nut_pressure_bar: seed.rodNutPressureBar,
    });
    await db("profile_stations").insert(seed.stations.map((s) => ({ profile_id: id, position: s.position, station_key: s.key, label: s.label, depth_mm: s.depthMm, role: s.role })));
    await db("profile_rings").insert(
      seed.rings.map((r) => ({
        profile_id: id,
        position: r.position,
        label: r.label,
        gap_new_min_mm: r.gapNewMinMm,
        gap_new_max_mm: r.gapNewMaxMm,
        gap_limit_mm: r.gapLimitMm,
        groove_new_min_mm: r.grooveNewMinMm,
        groove_new_max_mm: r.grooveNewMaxMm,
        groove_limit_mm: r.grooveLimitMm,
      })),
    );
    profile = { id };
  }
  const serial = `T-IMP-${tag}-${Date.now().toString(36)}-${++seq}`;
  const [engineId] = await db("main_engines").insert({ vessel_id: world.vessel1, profile_id: profile.id, serial, cylinder_count: 6 });
  await db("cylinder_units").insert([1, 2, 3, 4, 5, 6].map((n) => ({ engine_id: engineId, cylinder_no: n })));
  const units = await db("cylinder_units").where({ engine_id: engineId }).orderBy("cylinder_no").pluck("id");
  await db("liners").insert(units.map((u: number, i: number) => ({ unit_id: u, serial: `${serial}-L${i + 1}`, installed_on: "2015-03-01", installed_engine_hours: 0, liner_hours_at_install: 0 })));
  return { engineId, unitIds: units, profileId: profile.id };
}

export const LAYOUT_MAPPING: ColumnMapping = Object.fromEntries(LAYOUT_COLUMNS.map((c, i) => [c.field, i]));

/** Uploads bytes the way the browser does (a slot, then a presigned PUT) and returns the file id. */
export async function uploadFile(actor: Actor, vesselId: number, text: string | Buffer, fileName = "readings.csv"): Promise<number> {
  const bytes = typeof text === "string" ? Buffer.from(text, "utf8") : text;
  const slot = await createImportUpload(actor, { vesselId, fileName, sizeBytes: bytes.length });
  const res = await fetch(slot.uploadUrl, { method: "PUT", headers: slot.headers, body: new Uint8Array(bytes) });
  if (!res.ok) throw new Error(`presigned PUT failed: ${res.status} ${await res.text()}`);
  return slot.fileId;
}

/** Uploads a file and previews it into an engine's history with our layout's mapping. */
export async function previewHistory(actor: Actor, vesselId: number, engineId: number, text: string, o: Partial<CreateImportInput> = {}) {
  const fileId = o.fileId ?? (await uploadFile(actor, vesselId, text));
  return previewImport(actor, {
    fileId,
    vesselId,
    destination: "history",
    engineId,
    mapping: LAYOUT_MAPPING,
    options: detectOptions(text),
    excludedLines: [],
    saveMapping: false,
    ...o,
  });
}
