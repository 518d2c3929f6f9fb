import type { Knex } from "knex";
import { computeUnitAnalysis, earliestLimit, unitDetail, type UnitInput } from "./compute";
import { loadProfiles, type ProfileRow } from "@/lib/profiles/queries";
import { loadUnitInputs } from "./load";

/*
 * Keeps `unit_analysis` current. Every mutation that changes an approved inspection, a
 * liner, a profile or the running-hours log calls `recomputeUnits` in its transaction,
 * so the fleet screens read one small row per unit instead of recomputing.
 */

type NextOverhaulChange = { unitId: number; engineHours: number | null };

function toRow(input: UnitInput, changes?: NextOverhaulChange[]) {
  const analysis = computeUnitAnalysis(input);
  const { summary } = analysis;
  const next = summary.nextOverhaulEngineHours;
  const stored = input.nextOverhaulEngineHours;
  if (changes && (next === null ? stored !== null : stored === null || Math.abs(next - stored) >= 0.05)) {
    changes.push({ unitId: input.unitId, engineHours: next });
  }
  const limit = earliestLimit(summary);
  const wearAt = summary.wear.kind === "projected" ? summary.wear.atLinerHours : null;
  return {
    unit_id: input.unitId,
    liner_id: input.linerId,
    band: summary.band.band,
    max_wear_mm: round(summary.maxWearMm, 3),
    max_ovality_mm: round(summary.maxOvalityMm, 3),
    wear_rate_mm_per_1000h: summary.trend?.slopeMmPer1000h ?? summary.lastIntervalRate ?? null,
    liner_hours: round(summary.linerHours, 1),
    limit_at_liner_hours: wearAt !== null && Math.abs(wearAt) < 1e8 ? round(wearAt, 1) : null,
    limit_on: limit?.on ?? null,
    limit_on_earliest: limit?.earliest ?? null,
    limit_on_latest: limit?.latest ?? null,
    last_inspected_on: summary.lastInspectedOn,
    summary: JSON.stringify(roundForStorage(summary)),
    detail: JSON.stringify(roundForStorage(unitDetail(analysis))),
    computed_at: new Date(),
  };
}

/**
 * A copy with every fraction cut to ten significant digits (running hours keep their 0.1 h, so a
 * screen reading the stored figure rounds the same number as one reading the record); full float
 * noise only bloats the row. A plain walk, because a JSON.stringify replacer is called for
 * every key and was most of the cost of storing a summary.
 */
function roundForStorage(value: unknown): unknown {
  if (typeof value === "number") return Number.isInteger(value) || !Number.isFinite(value) ? value : Number(value.toPrecision(10));
  if (value === null || typeof value !== "object") return value;
  if (Array.isArray(value)) {
    const out = new Array(value.length);
    for (let i = 0; i < value.length; i++) out[i] = roundForStorage(value[i]);
    return out;
  }
  const out: Record<string, unknown> = {};
  for (const key in value) out[key] = roundForStorage((value as Record<string, unknown>)[key]);
  return out;
}

function round(v: number | null, dp: number): number | null {
  if (v === null || !Number.isFinite(v)) return null;
  const f = 10 ** dp;
  return Math.round(v * f) / f;
}

async function upsert(db: Knex | Knex.Transaction, rows: ReturnType<typeof toRow>[]) {
  for (let i = 0; i < rows.length; i += 1000) {
    const chunk = rows.slice(i, i + 1000);
    await db("unit_analysis")
      .insert(chunk)
      .onConflict("unit_id")
      .merge([
        "liner_id",
        "band",
        "max_wear_mm",
        "max_ovality_mm",
        "wear_rate_mm_per_1000h",
        "liner_hours",
        "limit_at_liner_hours",
        "limit_on",
        "limit_on_earliest",
        "limit_on_latest",
        "last_inspected_on",
        "summary",
        "detail",
        "computed_at",
      ]);
  }
}

/**
 * Keeps the unit's planned next overhaul (read by the unit chooser and the engine screens) equal
 * to the one the analysis derives from the last approved overhaul. Only units whose figure moved
 * are written, so a fleet recompute with nothing new writes nothing here.
 */
async function storeNextOverhauls(db: Knex | Knex.Transaction, changes: NextOverhaulChange[]) {
  for (const c of changes) await db("cylinder_units").where({ id: c.unitId }).update({ next_overhaul_engine_hours: c.engineHours });
}

/** Recomputes and stores the analysis of the given units (or all units of the given engines). */
export async function recomputeUnits(db: Knex | Knex.Transaction, filter: { unitIds?: number[]; engineIds?: number[] }): Promise<number> {
  const { units } = await loadUnitInputs(db, filter);
  const changes: NextOverhaulChange[] = [];
  await upsert(db, units.map((u) => toRow(u, changes)));
  await storeNextOverhauls(db, changes);
  return units.length;
}

/**
 * Recomputes every unit of the fleet, engine batch by engine batch, so memory stays
 * bounded on a large fleet. Returns the number of units. `store: false` computes without
 * writing (the benchmark times the computation and the storing apart).
 */
export async function recomputeAllUnits(db: Knex, options: { enginesPerBatch?: number; store?: boolean } = {}): Promise<number> {
  const store = options.store ?? true;
  const batch = options.enginesPerBatch ?? 40;
  const profiles: Map<number, ProfileRow> = await loadProfiles(db);
  const engineIds = (await db("main_engines").orderBy("id").select("id")).map((r) => r.id as number);
  const load = (i: number) => loadUnitInputs(db, { engineIds: engineIds.slice(i, i + batch) }, profiles);
  let n = 0;
  // Read the next batch while this one is computed and written, so the database and the
  // computation work side by side instead of taking turns.
  // One write stays in flight too, bounded to one batch.
  let next = engineIds.length ? load(0) : null;
  let writing: Promise<void> = Promise.resolve();
  for (let i = 0; next; i += batch) {
    const { units } = await next;
    next = i + batch < engineIds.length ? load(i + batch) : null;
    const changes: NextOverhaulChange[] = [];
    const rows = units.map((u) => toRow(u, changes));
    await writing;
    if (store) writing = upsert(db, rows).then(() => storeNextOverhauls(db, changes));
    n += units.length;
  }
  await writing;
  return n;
}
