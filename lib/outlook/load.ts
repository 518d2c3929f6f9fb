import type { Knex } from "knex";
import type { UnitSummary } from "@/lib/analysis/compute";
import { whereVesselInScope, type VesselScope } from "@/lib/auth/scope";
import type { PredictionFit } from "@/lib/stats/regression";
import { BAND_LABELS, type BandKey } from "@/lib/wear/bands";
import { OPEN_PLAN_STATES, type OutlookRow, type PlanState, type PlanSummary, type ScheduleEntry } from "./types";
import {
  budgetByYear,
  DEFAULT_RISK,
  exceedProbability,
  horizonEnd,
  nextOverhauls,
  ratePercentile,
  recommend,
  renewalCost,
  spareShortfall,
  type BudgetLine,
  type ExceedProbability,
  type NextOverhaul,
  type Opportunity,
  type Recommendation,
  type ShortfallLine,
  type SpareDemand,
  type SparePart,
  type StockLine,
} from "./numbers";

/*
 * The renewal outlook, built from the stored per-unit analysis (unit_analysis) plus the ships'
 * schedules, the open plans and the spares: a handful of set-wise reads and pure arithmetic, no
 * recompute from raw readings. No Next.js or server-only imports, so the benchmark and the
 * alert sender load it with their own connection; lib/outlook/queries.ts is the app's door.
 */

export * from "./types";

export type OutlookOptions = { today: string; risk?: number };

const parsed = <T>(v: unknown): T => (typeof v === "string" ? JSON.parse(v) : v) as T;
const num = (v: unknown): number | null => (v === null || v === undefined ? null : Number(v));

/** The schedule entries (port stays and dockings) of the given vessels ending on or after `from`, by date. */
export async function loadSchedule(db: Knex, vesselIds: readonly number[], from: string): Promise<ScheduleEntry[]> {
  if (!vesselIds.length) return [];
  const rows = await db("vessel_schedule")
    .whereIn("vessel_id", vesselIds as number[])
    .where("ends_on", ">=", from)
    .orderBy(["starts_on", "id"])
    .select("id", "vessel_id as vesselId", "kind", "place", "starts_on as startsOn", "ends_on as endsOn", "note", "revision");
  return rows as ScheduleEntry[];
}

/** Open plans of the given units, plus closed and dropped ones when `all`. */
export async function loadPlans(db: Knex, unitIds: readonly number[] | null, today: string, options: { all?: boolean; vesselScope?: VesselScope } = {}): Promise<PlanSummary[]> {
  const q = db("renewal_plans as r")
    .leftJoin("vessel_schedule as s", "s.id", "r.schedule_id")
    .orderBy(["r.planned_on", "r.id"])
    .select(
      "r.id",
      "r.unit_id as unitId",
      "r.part",
      "r.status as state",
      "r.planned_on as plannedOn",
      "r.port_or_yard as opportunity",
      "r.schedule_id as scheduleId",
      "r.spare_id as spareId",
      "r.note",
      "r.revision",
    );
  if (unitIds) q.whereIn("r.unit_id", unitIds.length ? (unitIds as number[]) : [-1]);
  if (options.vesselScope) {
    q.join("cylinder_units as u", "u.id", "r.unit_id").join("main_engines as e", "e.id", "u.engine_id");
    whereVesselInScope(q, options.vesselScope, "e.vessel_id");
  }
  if (!options.all) q.whereIn("r.status", OPEN_PLAN_STATES as PlanState[]);
  const rows = (await q) as Omit<PlanSummary, "missed">[];
  return rows.map((r) => ({ ...r, missed: (OPEN_PLAN_STATES as string[]).includes(r.state) && r.plannedOn < today }));
}

type UnitRow = Pick<OutlookRow, "unitId" | "companyId" | "vesselId" | "vesselName" | "engineId" | "engineSerial" | "profileId" | "profileName" | "cylinderNo" | "linerSerial" | "limitMm" | "limitOn" | "limitOnEarliest" | "limitOnLatest"> & {
  intervalHours: number;
  band: BandKey | null;
  wearRate: number | null;
  outlook: unknown;
};

/** What unit_analysis.outlook_json holds (migration 20261203200100): the summary's figures the outlook needs, and the fit. */
type OutlookFigures = Pick<UnitSummary, "nextOverhaulEngineHours" | "linerHours" | "lastInspectedOn" | "lastEngineHours" | "maxWearMm" | "runningRate"> & {
  ringsRenew: boolean | boolean[] | null;
  ringsOverLimit: boolean | boolean[] | null;
  fit: PredictionFit | null;
};

const anyTrue = (v: boolean | boolean[] | null | undefined) => (Array.isArray(v) ? v.includes(true) : v === true);

/** Wear rates of every analysed unit of these profiles across the whole fleet, sorted per profile. */
export async function fleetRates(db: Knex, profileIds: number[]): Promise<Map<number, number[]>> {
  const out = new Map<number, number[]>();
  if (!profileIds.length) return out;
  const rows = (await db("unit_analysis as a")
    .join("cylinder_units as u", "u.id", "a.unit_id")
    .join("main_engines as e", "e.id", "u.engine_id")
    .whereIn("e.profile_id", profileIds)
    .whereNotNull("a.wear_rate_mm_per_1000h")
    .select("e.profile_id as profileId", "a.wear_rate_mm_per_1000h as rate")) as { profileId: number; rate: number }[];
  for (const r of rows) {
    const list = out.get(r.profileId) ?? [];
    if (!out.has(r.profileId)) out.set(r.profileId, list);
    if (Number.isFinite(r.rate)) list.push(Number(r.rate));
  }
  for (const list of out.values()) list.sort((a, b) => a - b);
  return out;
}

/**
 * One outlook row per cylinder unit on the vessels in `scope` (archived vessels left out): the
 * stored analysis, the next two overhauls as dates, the chance of passing the wear limit by
 * each, the next opportunity (port stay, docking or overhaul), the recommendation, the rings
 * and the open plans. The wear-rate percentile ranks each unit among every unit of its profile
 * in the fleet, whoever asks (only the rank is shown, never another ship's figures).
 */
export async function loadOutlookRows(db: Knex, scope: VesselScope, options: OutlookOptions): Promise<OutlookRow[]> {
  const { today } = options;
  const units = (await whereVesselInScope(
    db("cylinder_units as u")
      .join("main_engines as e", "e.id", "u.engine_id")
      .join("vessels as v", "v.id", "e.vessel_id")
      .join("engine_profiles as p", "p.id", "e.profile_id")
      .leftJoin("unit_analysis as a", "a.unit_id", "u.id")
      .leftJoin("liners as l", "l.id", "a.liner_id")
      .whereNull("v.archived_at")
      .orderBy(["v.name", "e.id", "u.cylinder_no"])
      .select(
        "u.id as unitId",
        "v.company_id as companyId",
        "v.id as vesselId",
        "v.name as vesselName",
        "e.id as engineId",
        "e.serial as engineSerial",
        "p.id as profileId",
        "p.name as profileName",
        "u.cylinder_no as cylinderNo",
        "l.serial as linerSerial",
        "p.liner_wear_limit_mm as limitMm",
        "p.overhaul_interval_hours as intervalHours",
        "a.band",
        "a.wear_rate_mm_per_1000h as wearRate",
        "a.limit_on as limitOn",
        "a.limit_on_earliest as limitOnEarliest",
        "a.limit_on_latest as limitOnLatest",
        "a.outlook_json as outlook",
      ),
    scope,
    "v.id",
  )) as UnitRow[];
  if (!units.length) return [];
  const vesselIds = [...new Set(units.map((u) => u.vesselId))];
  const [schedule, plans, rates] = await Promise.all([
    loadSchedule(db, vesselIds, today),
    loadPlans(db, null, today, { vesselScope: scope }),
    fleetRates(db, [...new Set(units.map((u) => u.profileId))]),
  ]);
  const scheduleOf = new Map<number, Opportunity[]>();
  for (const s of schedule) {
    const list = scheduleOf.get(s.vesselId) ?? [];
    if (!scheduleOf.has(s.vesselId)) scheduleOf.set(s.vesselId, list);
    list.push({ kind: s.kind, date: s.startsOn < today ? today : s.startsOn, label: `${s.kind === "docking" ? "the docking" : "the port stay"} at ${s.place}`, scheduleId: s.id });
  }
  const plansOf = new Map<number, PlanSummary[]>();
  for (const p of plans) {
    const list = plansOf.get(p.unitId) ?? [];
    if (!plansOf.has(p.unitId)) plansOf.set(p.unitId, list);
    list.push(p);
  }

  return units.map((u): OutlookRow => {
    const summary = u.outlook ? parsed<OutlookFigures>(u.outlook) : null;
    const fit = summary?.fit ?? null;
    const limitMm = Number(u.limitMm);
    const reference =
      summary && summary.lastInspectedOn && summary.lastEngineHours !== null && summary.linerHours !== null
        ? { date: summary.lastInspectedOn, engineHours: summary.lastEngineHours, linerHours: summary.linerHours }
        : null;
    const rate = summary?.runningRate ?? { kind: "unknown" as const, reason: "too_few_entries" as const };
    const overhauls = nextOverhauls({ nextOverhaulEngineHours: summary?.nextOverhaulEngineHours ?? null, intervalHours: num(u.intervalHours), reference, rate });
    const band: BandKey = u.band ?? "unknown";
    const ringsDue = anyTrue(summary?.ringsRenew) || anyTrue(summary?.ringsOverLimit);
    const opportunities = scheduleOf.get(u.vesselId) ?? [];
    const overhaulOpps: Opportunity[] = overhauls
      .filter((o): o is NextOverhaul & { date: string } => o.date !== null && o.date >= today)
      .map((o) => ({ kind: "overhaul", date: o.date, label: `piston overhaul ${o.ordinal}`, scheduleId: null }));
    const nextOpportunity = [...opportunities, ...overhaulOpps].sort((a, b) => a.date.localeCompare(b.date))[0] ?? null;
    const recommendation = recommend({
      today,
      mustRenew: band === "over_limit",
      fit,
      limitMm,
      reference,
      rate,
      overhauls,
      schedule: opportunities,
      risk: options.risk,
    });
    const wearRate = num(u.wearRate);
    return {
      unitId: u.unitId,
      companyId: u.companyId,
      vesselId: u.vesselId,
      vesselName: u.vesselName,
      engineId: u.engineId,
      engineSerial: u.engineSerial,
      profileId: u.profileId,
      profileName: u.profileName,
      cylinderNo: u.cylinderNo,
      linerSerial: u.linerSerial,
      band,
      bandLabel: BAND_LABELS[band],
      linerHours: summary?.linerHours ?? null,
      lastInspectedOn: summary?.lastInspectedOn ?? null,
      maxWearMm: summary?.maxWearMm ?? null,
      limitMm,
      wearRateMmPer1000h: wearRate,
      ratePercentile: ratePercentile(rates.get(u.profileId) ?? [], wearRate),
      limitOn: u.limitOn,
      limitOnEarliest: u.limitOnEarliest,
      limitOnLatest: u.limitOnLatest,
      overhauls,
      exceed: overhauls.map((o) => exceedProbability(fit, limitMm, o.linerHours)),
      nextOpportunity,
      recommendation,
      ringsDue,
      plans: plansOf.get(u.unitId) ?? [],
    };
  });
}

/** Stock lines of the companies that own the given vessels: on board those vessels, and each company's store. */
export async function loadStock(db: Knex, vesselIds: readonly number[]): Promise<(StockLine & { companyId: number; profileName: string; vesselName: string | null; revision: number })[]> {
  if (!vesselIds.length) return [];
  const companies = db("vessels").whereIn("id", vesselIds as number[]).distinct("company_id");
  const rows = await db("spares_stock as s")
    .join("engine_profiles as p", "p.id", "s.profile_id")
    .leftJoin("vessels as v", "v.id", "s.vessel_id")
    .whereIn("s.company_id", companies)
    .where((q) => q.whereNull("s.vessel_id").orWhereIn("s.vessel_id", vesselIds as number[]))
    .orderBy(["p.name", "s.part", "v.name", "s.id"])
    .select(
      "s.id",
      "s.company_id as companyId",
      "s.profile_id as profileId",
      "p.name as profileName",
      "s.part",
      "s.vessel_id as vesselId",
      "v.name as vesselName",
      "s.on_hand as onHand",
      "s.on_order as onOrder",
      "s.on_order_due as onOrderDue",
      "s.lead_time_days as leadTimeDays",
      "s.unit_cost as unitCost",
      "s.job_cost as jobCost",
      "s.revision",
    );
  return rows.map((r: Record<string, unknown>) => ({ ...r, unitCost: num(r.unitCost), jobCost: num(r.jobCost) })) as never;
}

export type DemandDetail = SpareDemand & { unitId: number; vesselName: string; cylinderNo: number; cost: number | null; planId: number | null };

/**
 * The renewals within the horizon that take a spare: every open plan, and every unit whose
 * recommendation says renew (now, or at an opportunity before the horizon ends) with no open
 * plan for its liner; ring sets due at the next overhaul likewise. A plan's day stands for
 * its renewal; a recommendation's opportunity date, or today for "renew now".
 */
export function demandsOf(rows: readonly OutlookRow[], today: string, until: string): Omit<DemandDetail, "cost">[] {
  const out: Omit<DemandDetail, "cost">[] = [];
  for (const r of rows) {
    const base = { vesselId: r.vesselId, profileId: r.profileId, unitId: r.unitId, vesselName: r.vesselName, cylinderNo: r.cylinderNo };
    const planned = new Set<SparePart>();
    for (const p of r.plans) {
      planned.add(p.part);
      if (p.plannedOn <= until) out.push({ ...base, key: `plan:${p.id}`, part: p.part, neededOn: p.plannedOn < today ? today : p.plannedOn, source: "plan", planId: p.id });
    }
    if (!planned.has("liner")) {
      const rec = r.recommendation;
      const on = rec.kind === "renew_now" ? today : rec.kind === "renew_at" ? rec.opportunity!.date : null;
      if (on !== null && on <= until) out.push({ ...base, key: `unit:${r.unitId}:liner`, part: "liner", neededOn: on, source: "projected", planId: null });
    }
    if (r.ringsDue && !planned.has("ring_set")) {
      const on = r.overhauls[0]?.date && r.overhauls[0].date > today ? r.overhauls[0].date : today;
      if (on <= until) out.push({ ...base, key: `unit:${r.unitId}:ring_set`, part: "ring_set", neededOn: on, source: "projected", planId: null });
    }
  }
  return out;
}

export type OutlookBundle = {
  today: string;
  horizonMonths: number;
  until: string;
  rows: OutlookRow[];
  schedule: ScheduleEntry[];
  stock: Awaited<ReturnType<typeof loadStock>>;
  demands: DemandDetail[];
  shortfall: ShortfallLine[];
  budget: (BudgetLine & { vesselName: string })[];
};

/**
 * The whole outlook for a scope and horizon: the per-unit rows, the schedule, the stock, the
 * renewals that take spares, the shortfall with order-by dates and the budget per year and
 * vessel. The cost of a renewal is the unit and job cost of the line that serves it (the store's
 * line, or any line of the profile and part, when it is short).
 */
export async function loadOutlook(db: Knex, scope: VesselScope, options: OutlookOptions & { horizonMonths: number }): Promise<OutlookBundle> {
  const { today, horizonMonths } = options;
  const until = horizonEnd(today, horizonMonths);
  const rows = await loadOutlookRows(db, scope, options);
  const vesselIds = [...new Set(rows.map((r) => r.vesselId))];
  const [schedule, stock] = await Promise.all([loadSchedule(db, vesselIds, today), loadStock(db, vesselIds)]);
  const raw = demandsOf(rows, today, until);
  const { lines, sources } = spareShortfall(raw, stock, today);
  const costLine = (d: (typeof raw)[number]) => {
    const src = sources.get(d.key);
    const candidates = stock.filter((s) => s.profileId === d.profileId && s.part === d.part);
    const own = src === "ship" ? candidates.find((s) => s.vesselId === d.vesselId) : candidates.find((s) => s.vesselId === null);
    return own ?? candidates.find((s) => renewalCost(s) !== null);
  };
  const demands = raw.map((d) => ({ ...d, cost: renewalCost(costLine(d)) }));
  const names = new Map(rows.map((r) => [r.vesselId, r.vesselName]));
  const budget = budgetByYear(demands.map((d) => ({ vesselId: d.vesselId, date: d.neededOn, cost: d.cost }))).map((b) => ({ ...b, vesselName: names.get(b.vesselId) ?? "" }));
  return { today, horizonMonths, until, rows, schedule, stock, demands, shortfall: lines, budget };
}

export { DEFAULT_RISK };
