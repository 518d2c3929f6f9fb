/**
 * Benchmarks on the 50× fleet (run through scripts/bench.sh):
 *  (a) recomputing every unit's analysis from raw readings, beside a baseline that only
 *      reads the same rows — target: within 1.5× of the bare read; storing the results is
 *      timed as well and printed beside it;
 *  (b) the whole-fleet summary the screens read (stored per-unit results) — target: under
 *      100 ms for every unit of the fleet.
 */
import knex from "knex";
import config from "../knexfile";
import { loadUnitInputs } from "../lib/analysis/load";
import { loadProfiles } from "../lib/profiles/queries";
import { recomputeAllUnits } from "../lib/analysis/recompute";
import { benchImport } from "./bench-import";
import { loadOutlook, loadOutlookRows } from "../lib/outlook/load";
import { filterOutlook } from "../lib/outlook/present";

// BENCH_ONLY=import runs only (d), the importer; BENCH_ONLY=outlook only (e), the renewal
// outlook on analyses already stored.
const only = process.env.BENCH_ONLY ?? "";

const db = knex({ ...config, pool: { min: 1, max: 4 } });

async function time<T>(label: string, fn: () => Promise<T>): Promise<{ ms: number; value: T }> {
  (globalThis as { gc?: () => void }).gc?.();
  const t0 = performance.now();
  const value = await fn();
  const ms = performance.now() - t0;
  return { ms, value };
}

function median(xs: number[]) {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

const counts = {
  vessels: Number((await db("vessels").count({ n: "*" }))[0].n),
  units: Number((await db("cylinder_units").count({ n: "*" }))[0].n),
  inspections: Number((await db("inspections").count({ n: "*" }))[0].n),
  readings: Number((await db("liner_readings").count({ n: "*" }))[0].n),
};
console.log(`fleet: ${counts.vessels} vessels, ${counts.units} units, ${counts.inspections} inspections, ${counts.readings} liner readings`);

if (only === "import") {
  await benchImport(db);
  await db.destroy();
  process.exit(0);
}

if (only !== "outlook") {
const engineIds = (await db("main_engines").orderBy("id").select("id")).map((r) => r.id as number);
const BATCH = 40;

async function bareRead() {
  const profiles = await loadProfiles(db);
  let units = 0;
  for (let i = 0; i < engineIds.length; i += BATCH) {
    units += (await loadUnitInputs(db, { engineIds: engineIds.slice(i, i + BATCH) }, profiles)).units.length;
  }
  return units;
}

// Warm the buffer pool and the JIT once, then take the median of five runs of each.
await bareRead();
await recomputeAllUnits(db);
const reads: number[] = [];
const computed: number[] = [];
const full: number[] = [];
let peakHeap = 0;
for (let i = 0; i < 5; i++) {
  reads.push((await time("read", bareRead)).ms);
  computed.push((await time("compute", () => recomputeAllUnits(db, { store: false }))).ms);
  const r = await time("recompute", () => recomputeAllUnits(db));
  full.push(r.ms);
  peakHeap = Math.max(peakHeap, process.memoryUsage().heapUsed);
}
const readMs = median(reads);
const computeMs = median(computed);
const fullMs = median(full);
const ratio = computeMs / readMs;

// (b) the fleet summary: every unit's stored result, as the fleet and outlook screens read it.
const summaryQuery = () =>
  db("unit_analysis as a")
    .join("cylinder_units as u", "u.id", "a.unit_id")
    .join("main_engines as e", "e.id", "u.engine_id")
    .join("vessels as v", "v.id", "e.vessel_id")
    .select("v.id as vesselId", "v.name", "u.id", "u.cylinder_no", "a.band", "a.max_wear_mm", "a.wear_rate_mm_per_1000h", "a.limit_on", "a.limit_on_earliest", "a.limit_on_latest");
await summaryQuery();
const sums: number[] = [];
let rows = 0;
for (let i = 0; i < 7; i++) {
  const r = await time("summary", summaryQuery);
  sums.push(r.ms);
  rows = r.value.length;
}
const summaryMs = median(sums);

const ok = (b: boolean) => (b ? "PASS" : "MISS");
console.log("");
console.log(`(a) bare read of every unit's rows     ${readMs.toFixed(0).padStart(7)} ms (median of 5)`);
console.log(`    full recompute of every unit       ${computeMs.toFixed(0).padStart(7)} ms   ratio ${ratio.toFixed(2)}×   target ≤ 1.50×   ${ok(ratio <= 1.5)}`);
console.log(`    … and storing it in unit_analysis  ${fullMs.toFixed(0).padStart(7)} ms   ratio ${(fullMs / readMs).toFixed(2)}× (no target; for the record)`);
console.log(`    peak JS heap during recompute      ${(peakHeap / 1048576).toFixed(0).padStart(7)} MB`);
console.log(`(b) whole-fleet summary (${rows} units)  ${summaryMs.toFixed(1).padStart(7)} ms (median of 7)   target < 100 ms   ${ok(summaryMs < 100)}`);
}

// (e) the renewal outlook of the whole fleet as a superintendent of every ship asks for it
// (stored analysis, schedules, open plans, fleet-wide rate percentiles, the t-distribution
// chances and recommendations), beside the bare read of the same unit_analysis rows; and the
// JSON answer for the demo fleet's five ships (the first five of this fleet are the demo's).
if (!(await db("unit_analysis").first("unit_id"))) await recomputeAllUnits(db);
const today = new Date().toISOString().slice(0, 10);
const vesselIds = (await db("vessels").orderBy("id").select("id")).map((r) => r.id as number);
const demoIds = vesselIds.slice(0, 5);
const outlookRead = () =>
  db("unit_analysis").select("unit_id", "liner_id", "band", "max_wear_mm", "wear_rate_mm_per_1000h", "liner_hours", "limit_on", "limit_on_earliest", "limit_on_latest", "last_inspected_on", "summary");
const outlookBuild = () => loadOutlookRows(db, { vessels: vesselIds }, { today });
const demoAnswer = async () => {
  const b = await loadOutlook(db, { vessels: demoIds }, { today, horizonMonths: 12 });
  return JSON.stringify({ rows: filterOutlook(b.rows, {}, today), schedule: b.schedule, shortfall: b.shortfall, demands: b.demands, budget: b.budget }).length;
};
await outlookRead();
await outlookBuild();
await demoAnswer();
const oRead: number[] = [];
const oBuild: number[] = [];
const oDemo: number[] = [];
let outlookRows = 0;
for (let i = 0; i < 7; i++) {
  oRead.push((await time("outlook read", outlookRead)).ms);
  const b = await time("outlook", outlookBuild);
  oBuild.push(b.ms);
  outlookRows = b.value.length;
  oDemo.push((await time("demo json", demoAnswer)).ms);
}
const oReadMs = median(oRead);
const oBuildMs = median(oBuild);
const oDemoMs = median(oDemo);
const pass = (b: boolean) => (b ? "PASS" : "MISS");
console.log(`(e) bare read of unit_analysis (${outlookRows} units) ${oReadMs.toFixed(0).padStart(7)} ms (median of 7)`);
console.log(`    renewal outlook of the whole fleet   ${oBuildMs.toFixed(0).padStart(7)} ms   ratio ${(oBuildMs / oReadMs).toFixed(2)}×   target ≤ 1.50×   ${pass(oBuildMs / oReadMs <= 1.5)}`);
console.log(`    demo fleet's JSON answer (5 ships)  ${oDemoMs.toFixed(1).padStart(7)} ms (median of 7)   target < 100 ms   ${pass(oDemoMs < 100)}`);

// (d) the importer, last: it adds an engine to the fleet.
if (only !== "outlook") await benchImport(db);
await db.destroy();
