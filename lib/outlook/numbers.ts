import { quantileRankSorted } from "simple-statistics";
import { predict, type PredictionFit } from "@/lib/stats/regression";
import { studentTCdf, tCritical } from "@/lib/stats/t-quantile";
import { addDays, parseIsoDate, type RunningRate } from "@/lib/wear/calendar";

/*
 * The renewal outlook's arithmetic: next overhauls as dates, the chance a liner passes its wear
 * limit by a given day, the recommendation, spares shortfall with order-by dates, the budget
 * and wear-rate percentile ranks. Pure (no I/O), so the outlook screen, its API, the alerts
 * and the tests all use the same numbers.
 */

const DAY_MS = 86_400_000;

export type SparePart = "liner" | "ring_set";

/** What a unit's projection counts from: its latest approved gauging. */
export type OutlookReference = { date: string; engineHours: number; linerHours: number };

export type NextOverhaul = {
  /** 1 for the next overhaul, 2 for the one after. */
  ordinal: number;
  engineHours: number;
  /** Liner hours the liner will have run by then; null without a reference gauging. */
  linerHours: number | null;
  /** Calendar date from the engine's running-hours rate; null when the rate is unknown. */
  date: string | null;
};

/** Days between two ISO dates (b − a); null when either is no calendar day. */
export function daysBetween(a: string, b: string): number | null {
  const ma = parseIsoDate(a);
  const mb = parseIsoDate(b);
  return ma === null || mb === null ? null : Math.round((mb - ma) / DAY_MS);
}

/**
 * The next `count` piston overhauls: the first at `nextOverhaulEngineHours` (last overhaul plus
 * the profile's interval, as the stored analysis has it), each further one an interval later.
 * Engine hours become liner hours by the hours run since the reference gauging, and a date at
 * the engine's average running rate counted from the gauging's date.
 */
export function nextOverhauls(input: {
  nextOverhaulEngineHours: number | null;
  intervalHours: number | null;
  reference: OutlookReference | null;
  rate: RunningRate;
  count?: number;
}): NextOverhaul[] {
  const { nextOverhaulEngineHours: first, intervalHours, reference, rate } = input;
  if (first === null || !Number.isFinite(first)) return [];
  const out: NextOverhaul[] = [];
  const count = input.count ?? 2;
  for (let i = 0; i < count; i++) {
    if (i > 0 && !(intervalHours !== null && intervalHours > 0)) break;
    const engineHours = first + i * (intervalHours ?? 0);
    const run = reference ? engineHours - reference.engineHours : null;
    out.push({
      ordinal: i + 1,
      engineHours,
      linerHours: reference && run !== null ? reference.linerHours + run : null,
      date: reference && run !== null && rate.kind === "known" ? addDays(reference.date, run / rate.hoursPerDay) : null,
    });
  }
  return out;
}

/** Liner hours on a calendar day, at the engine's average running rate from the reference gauging. */
export function linerHoursOn(reference: OutlookReference | null, rate: RunningRate, date: string): number | null {
  if (!reference || rate.kind !== "known") return null;
  const days = daysBetween(reference.date, date);
  return days === null ? null : reference.linerHours + days * rate.hoursPerDay;
}

export type ExceedProbability =
  | { kind: "probability"; p: number; linerHours: number; df: number }
  | { kind: "not_enough_data"; reason: string };

/** Fewest residual degrees of freedom for which the chance is worth printing. */
export const MIN_DF_FOR_PROBABILITY = 1;

/**
 * The chance that the liner's wear at `linerHours` exceeds `limitMm`, from the regression's
 * prediction distribution for one new observation: the new reading y at x is distributed as
 * ŷ(x) + s·√(1 + leverage(x))·T with T Student t on the fit's residual degrees of freedom
 * (n − 2 with an intercept), so P(y > limit) = 1 − F_t((limit − ŷ)/(s·√(1 + leverage))).
 * The standard error is taken from `predict` (half-width / t), the same band the projection
 * draws. "Not enough data" in words where there is no fit or no degree of freedom.
 */
export function exceedProbability(fit: PredictionFit | null, limitMm: number, linerHours: number | null): ExceedProbability {
  if (!fit) return { kind: "not_enough_data", reason: "Not enough gaugings after running-in for a trend." };
  if (!(fit.df >= MIN_DF_FOR_PROBABILITY)) return { kind: "not_enough_data", reason: "Too few gaugings to judge the scatter." };
  if (linerHours === null || !Number.isFinite(linerHours) || !Number.isFinite(limitMm)) {
    return { kind: "not_enough_data", reason: "The running-hours rate or the last gauging is missing." };
  }
  const band = predict(fit, linerHours);
  if (!band || !(band.t > 0)) return { kind: "not_enough_data", reason: "The trend cannot be extended that far." };
  const se = band.halfWidth / band.t;
  if (!(se > 0)) return { kind: "probability", p: band.yHat >= limitMm ? 1 : 0, linerHours, df: fit.df };
  const cdf = studentTCdf((limitMm - band.yHat) / se, fit.df);
  if (cdf === null) return { kind: "not_enough_data", reason: "The trend cannot be extended that far." };
  return { kind: "probability", p: Math.min(1, Math.max(0, 1 - cdf)), linerHours, df: fit.df };
}

/**
 * Whether the chance of being over the limit at `linerHours` reaches `risk`, without working out
 * the chance: P(over) ≥ risk exactly when (limit − ŷ)/se ≤ t(1 − risk, df), and that quantile is
 * cached per df (tCritical at confidence 1 − 2·risk), so a recommendation that weighs a dozen
 * opportunities per unit costs no incomplete-beta evaluations. Null where exceedProbability says
 * "not enough data".
 */
export function reachesRisk(fit: PredictionFit | null, limitMm: number, linerHours: number | null, risk: number): boolean | null {
  if (!fit || !(fit.df >= MIN_DF_FOR_PROBABILITY) || linerHours === null || !Number.isFinite(linerHours) || !Number.isFinite(limitMm)) return null;
  const band = predict(fit, linerHours);
  if (!band || !(band.t > 0)) return null;
  const se = band.halfWidth / band.t;
  if (!(se > 0)) return band.yHat >= limitMm ? true : risk <= 0;
  const q = tCritical(1 - 2 * risk, fit.df);
  if (q === null) return null;
  return (limitMm - band.yHat) / se <= q;
}

/** A chance as a percentage in words for tables and the CSV: "12 %", "< 1 %", "> 99 %". */
export function probabilityText(e: ExceedProbability): string {
  if (e.kind !== "probability") return "not enough data";
  if (e.p < 0.005) return "< 1 %";
  if (e.p > 0.995) return "> 99 %";
  return `${Math.round(e.p * 100)} %`;
}

export type OpportunityKind = "port_stay" | "docking" | "overhaul";

/** A chance to renew: a planned port stay or docking of the ship, or a piston overhaul. */
export type Opportunity = { kind: OpportunityKind; date: string; label: string; scheduleId: number | null };

export type RecommendationKind = "run_on" | "renew_at" | "renew_now";

export type Recommendation = { kind: RecommendationKind; text: string; opportunity: Opportunity | null };

/** Below this chance of passing the limit a liner is run on; common practice is a small risk, here 5 %. */
export const DEFAULT_RISK = 0.05;

export const RECOMMENDATION_LABELS: Record<RecommendationKind, string> = {
  run_on: "Run on",
  renew_at: "Renew at",
  renew_now: "Renew now",
};

/**
 * What to do with the liner, in plain words. Renew now when it is past its limit (or the band
 * says renew, or today's chance of being over already reaches `risk`). Otherwise, when the chance
 * by the overhaul after next stays below `risk`, run on. Otherwise renew at the last opportunity
 * (port stay, docking or overhaul, from today on) by whose date the chance is still below `risk`
 * — the longest the liner can safely run; renew now when there is none. Without a trend, the band
 * decides, and the words say a projection needs more gaugings.
 */
export function recommend(input: {
  today: string;
  mustRenew: boolean;
  fit: PredictionFit | null;
  limitMm: number;
  reference: OutlookReference | null;
  rate: RunningRate;
  overhauls: NextOverhaul[];
  schedule: Opportunity[];
  risk?: number;
}): Recommendation {
  const risk = input.risk ?? DEFAULT_RISK;
  const pct = `${Math.round(risk * 100)} %`;
  if (input.mustRenew) return { kind: "renew_now", text: "Renew now: the liner or a ring is at or past its limit.", opportunity: null };
  const riskyOn = (date: string) => reachesRisk(input.fit, input.limitMm, linerHoursOn(input.reference, input.rate, date), risk);
  const now = riskyOn(input.today);
  if (now === null) {
    return { kind: "run_on", text: "Run on: not enough data for a projection yet; gauge again at the next overhaul.", opportunity: null };
  }
  if (now) return { kind: "renew_now", text: `Renew now: the chance it is already past the limit is ${pct} or more.`, opportunity: null };
  const last = input.overhauls.at(-1);
  if (last && reachesRisk(input.fit, input.limitMm, last.linerHours, risk) === false) {
    return { kind: "run_on", text: `Run on: under ${pct} chance of passing the limit by overhaul ${last.ordinal}${last.date ? ` (about ${last.date})` : ""}.`, opportunity: null };
  }
  const candidates: Opportunity[] = [
    ...input.schedule.filter((o) => o.date >= input.today),
    ...input.overhauls
      .filter((o): o is NextOverhaul & { date: string } => o.date !== null && o.date >= input.today)
      .map((o) => ({ kind: "overhaul" as const, date: o.date, label: `piston overhaul ${o.ordinal} (about ${o.date})`, scheduleId: null })),
  ].sort((a, b) => a.date.localeCompare(b.date));
  let chosen: Opportunity | null = null;
  for (const c of candidates) {
    if (riskyOn(c.date) !== false) break;
    chosen = c;
  }
  if (!chosen) return { kind: "renew_now", text: `Renew now: no planned opportunity comes before the chance of passing the limit reaches ${pct}.`, opportunity: null };
  return { kind: "renew_at", text: `Renew at ${chosen.label} (${chosen.date}): the last chance before the risk reaches ${pct}.`, opportunity: chosen };
}

// ───────────────────────────── spares ─────────────────────────────

/** One stock line: a part of one engine profile at one location (a ship, or the company store when vesselId is null). */
export type StockLine = {
  id: number;
  profileId: number;
  part: SparePart;
  vesselId: number | null;
  onHand: number;
  onOrder: number;
  onOrderDue: string | null;
  leadTimeDays: number;
  unitCost: number | null;
  jobCost: number | null;
};

/** A renewal that takes one spare on a given day: a plan, or a recommendation without a plan yet. */
export type SpareDemand = { key: string; vesselId: number; profileId: number; part: SparePart; neededOn: string; source: "plan" | "projected" };

export type SpareSource = "ship" | "store" | "on_order" | null;

export type ShortfallLine = {
  profileId: number;
  part: SparePart;
  needed: number;
  available: number;
  short: number;
  /** The first day a renewal finds no spare. */
  firstShortOn: string | null;
  /** firstShortOn minus the longest lead time of the profile's lines for the part (the store's when kept). */
  orderBy: string | null;
  leadTimeDays: number | null;
  /** The order-by date is already past. */
  late: boolean;
};

/**
 * Which spare each renewal takes and what is short. Renewals are served in date order: first
 * from their own ship's stock, then from the company store, then from what is on order and due
 * by that day (the ship's, then the store's); a renewal left without is short. Each profile and
 * part gets one line: how many are needed and available, how many short, the first day short
 * and the order-by date — that day less the lead time (the store's line, where the company keeps
 * one, since orders are placed for the store; else the longest of the ships' lines).
 */
export function spareShortfall(demands: readonly SpareDemand[], stock: readonly StockLine[], today: string): { lines: ShortfallLine[]; sources: Map<string, SpareSource> } {
  const left = new Map(stock.map((s) => [s.id, { onHand: Math.max(0, s.onHand), onOrder: Math.max(0, s.onOrder) }]));
  const groupKey = (profileId: number, part: SparePart) => `${profileId}|${part}`;
  const groups = new Map<string, { profileId: number; part: SparePart; demands: SpareDemand[]; lines: StockLine[] }>();
  const groupOf = (profileId: number, part: SparePart) => {
    const k = groupKey(profileId, part);
    let g = groups.get(k);
    if (!g) groups.set(k, (g = { profileId, part, demands: [], lines: [] }));
    return g;
  };
  for (const s of stock) groupOf(s.profileId, s.part).lines.push(s);
  for (const d of demands) groupOf(d.profileId, d.part).demands.push(d);

  const sources = new Map<string, SpareSource>();
  const lines: ShortfallLine[] = [];
  for (const g of groups.values()) {
    const ship = (vesselId: number) => g.lines.filter((l) => l.vesselId === vesselId);
    const store = g.lines.filter((l) => l.vesselId === null);
    const sorted = [...g.demands].sort((a, b) => a.neededOn.localeCompare(b.neededOn) || a.key.localeCompare(b.key));
    let short = 0;
    let firstShortOn: string | null = null;
    for (const d of sorted) {
      const take = (from: StockLine[], what: "onHand" | "onOrder") => {
        for (const l of from) {
          const rest = left.get(l.id)!;
          if (what === "onOrder" && (l.onOrderDue === null || l.onOrderDue > d.neededOn)) continue;
          if (rest[what] > 0) {
            rest[what]--;
            return true;
          }
        }
        return false;
      };
      const source: SpareSource = take(ship(d.vesselId), "onHand")
        ? "ship"
        : take(store, "onHand")
          ? "store"
          : take(ship(d.vesselId), "onOrder") || take(store, "onOrder")
            ? "on_order"
            : null;
      sources.set(d.key, source);
      if (source === null) {
        short++;
        firstShortOn ??= d.neededOn;
      }
    }
    const lead = store.length ? Math.max(...store.map((l) => l.leadTimeDays)) : g.lines.length ? Math.max(...g.lines.map((l) => l.leadTimeDays)) : null;
    const orderBy = firstShortOn !== null && lead !== null ? addDays(firstShortOn, -lead) : null;
    lines.push({
      profileId: g.profileId,
      part: g.part,
      needed: g.demands.length,
      available: g.lines.reduce((s, l) => s + Math.max(0, l.onHand) + Math.max(0, l.onOrder), 0),
      short,
      firstShortOn,
      orderBy,
      leadTimeDays: lead,
      late: orderBy !== null && orderBy < today,
    });
  }
  lines.sort((a, b) => a.profileId - b.profileId || a.part.localeCompare(b.part));
  return { lines, sources };
}

/** The cost of one renewal from a stock line: the spare's unit cost plus the job's; null when neither is known. */
export function renewalCost(line: Pick<StockLine, "unitCost" | "jobCost"> | null | undefined): number | null {
  if (!line || (line.unitCost === null && line.jobCost === null)) return null;
  return (line.unitCost ?? 0) + (line.jobCost ?? 0);
}

export type BudgetItem = { vesselId: number; date: string; cost: number | null };
export type BudgetLine = { year: number; vesselId: number; renewals: number; total: number; unpriced: number };

/**
 * Renewals per calendar year and vessel with their summed cost. A renewal with no cost known is
 * counted in `unpriced` and adds nothing to the total, so a missing price shows rather than
 * silently lowering the sum. Sums are kept in cents to avoid binary-fraction drift.
 */
export function budgetByYear(items: readonly BudgetItem[]): BudgetLine[] {
  const byKey = new Map<string, BudgetLine & { cents: number }>();
  for (const it of items) {
    const year = Number(it.date.slice(0, 4));
    if (!Number.isInteger(year)) continue;
    const k = `${year}|${it.vesselId}`;
    let line = byKey.get(k);
    if (!line) byKey.set(k, (line = { year, vesselId: it.vesselId, renewals: 0, total: 0, unpriced: 0, cents: 0 }));
    line.renewals++;
    if (it.cost === null || !Number.isFinite(it.cost)) line.unpriced++;
    else line.cents += Math.round(it.cost * 100);
  }
  return [...byKey.values()]
    .map(({ cents, ...l }) => ({ ...l, total: cents / 100 }))
    .sort((a, b) => a.year - b.year || a.vesselId - b.vesselId);
}

/**
 * The share of the rates at or below `value` (0–1): simple-statistics' quantileRank, which
 * counts the values ≤ value over n (ties share the middle of their run). Null for a
 * non-finite value or fewer than three rates, where a rank says nothing.
 */
export function ratePercentile(sortedRates: readonly number[], value: number | null): number | null {
  if (value === null || !Number.isFinite(value) || sortedRates.length < 3) return null;
  return quantileRankSorted(sortedRates as number[], value);
}

/** The last day of a horizon of `months` calendar months from `today` (same day of the month, clamped to its end). */
export function horizonEnd(today: string, months: number): string {
  const ms = parseIsoDate(today);
  if (ms === null) throw new Error(`not a calendar day: ${today}`);
  const d = new Date(ms);
  const y = d.getUTCFullYear();
  const m = d.getUTCMonth() + months;
  const last = new Date(Date.UTC(y, m + 1, 0)).getUTCDate();
  return new Date(Date.UTC(y, m, Math.min(d.getUTCDate(), last))).toISOString().slice(0, 10);
}
