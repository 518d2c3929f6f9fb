/**
 * (d) The importer, end to end, beside a plain insert of the same rows (run from bench.ts):
 *  - a generated history of about 100,000 rows (a 12-cylinder engine of the demo's 640 mm design,
 *    gauged every eight days for ten years) uploaded to the store, previewed (read back, hashed,
 *    parsed, matched, checked), committed (read and checked again, written in one transaction)
 *    and approved (records approved, the affected units' analyses recomputed); beside it a bare
 *    knex.batchInsert of the same inspections and liner readings into the same tables.
 *    Target: within 2× of the bare insert.
 *  - a gauge file of one overhaul of a unit of the 860 mm design (20 diameters, 4 closed gaps,
 *    4 groove clearances and the two temperatures: 30 readings) previewed and imported into a new
 *    draft. Target: each answer well under a second.
 */
import type { Knex } from "knex";
import { engineHistory, largeHistory, layoutRows, LAYOUT_HEADER, csvText } from "../fixtures/imports/generate";
import { approveImport, commitImport, createImportUpload, previewImport } from "../lib/imports/mutations";
import { LAYOUT_COLUMNS, type ColumnMapping } from "../lib/imports/layout";
import { detectOptions } from "../lib/imports/parse";

const LAYOUT: ColumnMapping = Object.fromEntries(LAYOUT_COLUMNS.map((c, i) => [c.field, i]));

async function engineOf(db: Knex, profileName: string, cylinders: number, vesselId: number, fitted: string): Promise<{ engineId: number; units: number[] }> {
  const profile = await db("engine_profiles").where("name", "like", `${profileName}%`).first("id");
  const serial = `BENCH-IMP-${Date.now().toString(36)}-${Math.random().toString(36).slice(2, 6)}`;
  const [engineId] = await db("main_engines").insert({ vessel_id: vesselId, profile_id: profile.id, serial, cylinder_count: cylinders });
  await db("cylinder_units").insert(Array.from({ length: cylinders }, (_, i) => ({ engine_id: engineId, cylinder_no: i + 1 })));
  const units: number[] = await db("cylinder_units").where({ engine_id: engineId }).orderBy("cylinder_no").pluck("id");
  await db("liners").insert(units.map((u, i) => ({ unit_id: u, serial: `${serial}-L${i + 1}`, installed_on: fitted, installed_engine_hours: 0, liner_hours_at_install: 0 })));
  return { engineId, units };
}

async function upload(actor: { id: string; name: string }, vesselId: number, text: string, db: Knex): Promise<number> {
  const bytes = Buffer.from(text, "utf8");
  const slot = await createImportUpload(actor, { vesselId, fileName: "bench.csv", sizeBytes: bytes.length }, db);
  const res = await fetch(slot.uploadUrl, { method: "PUT", headers: slot.headers, body: new Uint8Array(bytes) });
  if (!res.ok) throw new Error(`upload failed: ${res.status}`);
  return slot.fileId;
}

const ms = (t0: number) => performance.now() - t0;

export async function benchImport(db: Knex): Promise<void> {
  const vessel = await db("vessels").orderBy("id").first("id");
  const crew = await db("user as u").join("user_vessels as uv", "uv.user_id", "u.id").where("uv.vessel_id", vessel.id).select("u.id", "u.name", "u.role");
  const engineer = crew.find((c) => c.role === "engineer")!;
  const chief = crew.find((c) => c.role === "chief_engineer")!;

  // A comment line of its own per run: the benchmark's database is kept, and the same file twice is refused.
  const stamp = `# benchmark run ${new Date().toISOString()}\n`;
  const text = stamp + largeHistory();
  const gaugings = engineHistory({ cylinders: 12, perCylinder: 463, startDate: "2014-01-01", endDate: "2024-12-31", seed: 5, rings: false });
  const rowCount = layoutRows(gaugings).length; // the file has a header and a comment line besides

  // The plain insert: the same inspections and readings, into the same tables, of an engine of its own.
  const plain = await engineOf(db, "Long-stroke 640", 12, vessel.id, "2014-01-01");
  const stations = new Map<string, number>((await db("profile_stations as s").join("main_engines as e", "e.profile_id", "s.profile_id").where("e.id", plain.engineId).select("s.station_key", "s.id")).map((s) => [s.station_key, s.id]));
  const liners = new Map<number, number>((await db("liners").whereIn("unit_id", plain.units).select("unit_id", "id")).map((l) => [l.unit_id, l.id]));
  let t0 = performance.now();
  await db.transaction(async (trx) => {
    const tag = `bp${plain.engineId}-`;
    await trx.batchInsert(
      "inspections",
      gaugings.map((g, i) => ({ unit_id: plain.units[g.cylinder - 1], liner_id: liners.get(plain.units[g.cylinder - 1]), inspected_on: g.date, engine_hours: g.engineHours, liner_hours: g.linerHours, state: "approved", created_by: engineer.id, source: "import", client_token: `${tag}${i}` })),
      2000,
    );
    const ids = new Map<string, number>((await trx("inspections").where("client_token", "like", `${tag}%`).select("id", "client_token")).map((r) => [r.client_token, r.id]));
    await trx.batchInsert(
      "liner_readings",
      gaugings.flatMap((g, i) => g.cells.map((c) => ({ inspection_id: ids.get(`${tag}${i}`), station_id: stations.get(c.station), axis_key: c.axis, diameter_mm: c.diameterMm, entered_unit: "mm" }))),
      2000,
    );
  });
  const plainMs = ms(t0);

  // The importer, end to end.
  const target = await engineOf(db, "Long-stroke 640", 12, vessel.id, "2014-01-01");
  t0 = performance.now();
  const fileId = await upload(engineer, vessel.id, text, db);
  const uploadMs = ms(t0);
  t0 = performance.now();
  const preview = await previewImport(engineer, { fileId, vesselId: vessel.id, destination: "history", engineId: target.engineId, mapping: LAYOUT, options: detectOptions(text), excludedLines: [], saveMapping: false }, db);
  const previewMs = ms(t0);
  if (preview.errorCount) throw new Error(`the generated history has ${preview.errorCount} errors: ${preview.preview?.issues[0]?.message}`);
  t0 = performance.now();
  await commitImport(engineer, preview.id, { confirmWarnings: true }, db);
  const commitMs = ms(t0);
  t0 = performance.now();
  await approveImport(chief, preview.id, db);
  const approveMs = ms(t0);
  const importMs = previewMs + commitMs + approveMs;

  // A gauge file of one overhaul into a new draft, as the import screen sends it.
  const gauge = await engineOf(db, "Long-stroke 860", 1, vessel.id, "2023-01-01");
  const st860 = await db("profile_stations as s").join("main_engines as e", "e.profile_id", "s.profile_id").where("e.id", gauge.engineId).orderBy("s.position").select("s.station_key", "s.role");
  const rows: string[][] = [];
  for (const s of st860) for (const axis of ["fa", "ath"]) rows.push(["1", "2024-06-03", "11800", "", s.station_key, "", axis, (860 + (s.role.startsWith("unworn") ? 0 : 0.31)).toFixed(3), "31", "24", "MG-0417", "", "", "", ""]);
  for (let r = 1; r <= 4; r++) rows.push(["1", "2024-06-03", "11800", "", "", "", "", "", "31", "24", "MG-0417", String(r), "4.10", r === 1 ? "0.62" : "0.58", ""]);
  const gaugeText = stamp + csvText(LAYOUT_HEADER, rows);
  const gaugeFile = await upload(engineer, vessel.id, gaugeText, db);
  t0 = performance.now();
  const gp = await previewImport(engineer, { fileId: gaugeFile, vesselId: vessel.id, destination: "draft", unitId: gauge.units[0], newDraft: { inspectedOn: "2024-06-03", engineHours: 11800 }, mapping: LAYOUT, options: detectOptions(gaugeText), excludedLines: [], saveMapping: false }, db);
  const gaugePreviewMs = ms(t0);
  t0 = performance.now();
  await commitImport(engineer, gp.id, { confirmWarnings: true }, db);
  const gaugeCommitMs = ms(t0);

  const ok = (b: boolean) => (b ? "PASS" : "MISS");
  const ratio = importMs / plainMs;
  console.log(`(d) plain batchInsert of ${gaugings.length} inspections, ${rowCount} readings ${plainMs.toFixed(0).padStart(7)} ms`);
  console.log(`    import of the same ${rowCount}-row file (${(text.length / 1048576).toFixed(1)} MB)   ${importMs.toFixed(0).padStart(7)} ms   ratio ${ratio.toFixed(2)}×   target ≤ 2.00×   ${ok(ratio <= 2)}`);
  console.log(`      preview (read back, SHA-256, parse, match, check)   ${previewMs.toFixed(0).padStart(7)} ms`);
  console.log(`      commit (read and check again, write, audit)         ${commitMs.toFixed(0).padStart(7)} ms`);
  console.log(`      approve (approve, recompute ${target.units.length} units)            ${approveMs.toFixed(0).padStart(7)} ms`);
  console.log(`      (upload to the store, not counted: ${uploadMs.toFixed(0)} ms)`);
  console.log(`    gauge file of 30 readings: preview ${gaugePreviewMs.toFixed(0)} ms, import into a new draft ${gaugeCommitMs.toFixed(0)} ms   target < 1000 ms each   ${ok(gaugePreviewMs < 1000 && gaugeCommitMs < 1000)}`);
}
