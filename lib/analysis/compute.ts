import { analyseRings, type RingAnalysis, type RingInspection, type RingPositionSpec } from "@/lib/rings/rings";
import { runningHoursPerDay, projectDate, type DateProjection, type RunningHoursEntry, type RunningRate } from "@/lib/wear/calendar";
import { unitBand, type UnitBand } from "@/lib/wear/bands";
import { analyseLiner, type LinerAnalysis, type LinerIssue, type Projection } from "@/lib/wear/liner";
import type { CellResult } from "@/lib/wear/inspection";
import type { PredictionFit } from "@/lib/stats/regression";
import type { Inspection, LinerReading, WearProfile } from "@/lib/wear/types";

/** Everything the analysis of one unit needs, as loaded from the database. */
export type UnitInput = {
  unitId: number;
  linerId: number | null;
  profile: WearProfile;
  /** Approved inspections of the current liner. */
  inspections: Inspection[];
  /** Ring readings of those inspections. */
  ringInspections: RingInspection[];
  /** As-fitted readings (the liner's first inspection) when the profile measures wear from them. */
  asFittedReadings?: LinerReading[];
  hoursLog: RunningHoursEntry[];
  /** The planned next overhaul as stored on the unit; used only until the unit has an approved overhaul. */
  nextOverhaulEngineHours: number | null;
  /** The profile's piston overhaul interval in running hours. */
  overhaulIntervalHours?: number | null;
};

export type ProjectionSummary = Projection & { dates: DateProjection | null };

/** The per-unit result the fleet screens read; stored as JSON in unit_analysis.summary. */
export type UnitSummary = {
  band: UnitBand;
  /** Engine hours of the last approved overhaul plus the profile's interval (the stored plan before any). */
  nextOverhaulEngineHours: number | null;
  linerHours: number | null;
  lastInspectedOn: string | null;
  lastEngineHours: number | null;
  maxWearMm: number | null;
  maxWearStation: string | null;
  maxOvalityMm: number | null;
  lastIntervalRate: number | null;
  trend: { slopeMmPer1000h: number; slopeSdMmPer1000h: number; rSquared: number; residualSdMm: number; n: number } | null;
  wear: ProjectionSummary;
  ovality: ProjectionSummary;
  runningRate: RunningRate;
  rings: { position: number; renew: boolean; overLimit: boolean; gapMm: number | null; grooveMm: number | null; reasons: string[] }[];
  issues: string[];
};

export type UnitAnalysis = { summary: UnitSummary; liner: LinerAnalysis; rings: RingAnalysis | null };

/** A point of the stored wear trend. */
export type TrendPointDetail = {
  inspectionId: string;
  date: string;
  linerHours: number;
  engineHours: number;
  maxWearMm: number | null;
  maxOvalityMm: number | null;
  steady: boolean;
  wearOutlier: boolean;
  /** The largest reading was judged impossible and left out; the point shows the next-largest. */
  maxWearExcluded: boolean;
  excluded: { stationKey: string; axisKey: string; correctedMm: number }[];
};

/**
 * What the unit screen and its API draw beyond the summary, stored beside it in
 * unit_analysis.detail: the trend's points and fit, the liner profile of each gauging (the
 * larger usable wear of the two directions per station), the latest gauging's cells, the rings.
 */
export type UnitDetail = {
  points: TrendPointDetail[];
  fit: PredictionFit | null;
  profileSeries: { inspectionId: string; date: string; stations: { stationKey: string; wearMm: number }[] }[];
  latest: {
    inspectionId: string;
    date: string;
    cells: Pick<CellResult, "stationKey" | "axisKey" | "rawMm" | "correctedMm" | "wearMm" | "usable">[];
    ovality: { stationKey: string; ovalityMm: number | null }[];
  } | null;
  rings: RingAnalysis | null;
  linerIssues: LinerIssue[];
};

/** The stored detail of a computed unit analysis. */
export function unitDetail(analysis: UnitAnalysis): UnitDetail {
  const { liner } = analysis;
  const fit = liner.wear.trend?.fit ?? null;
  const dateOf = new Map(liner.points.map((p) => [p.inspectionId, p.date]));
  const last = liner.inspections.at(-1);
  return {
    points: liner.points.map((p) => ({
      inspectionId: p.inspectionId,
      date: p.date,
      linerHours: p.linerHours,
      engineHours: p.engineHours,
      maxWearMm: p.maxWearMm,
      maxOvalityMm: p.maxOvalityMm,
      steady: p.steady,
      wearOutlier: p.wearOutlier,
      maxWearExcluded: p.maxWearExcluded,
      excluded: p.excludedReadings.map((e) => ({ stationKey: e.stationKey, axisKey: e.axisKey, correctedMm: e.correctedMm })),
    })),
    fit: fit
      ? { model: fit.model, n: fit.n, df: fit.df, intercept: fit.intercept, slope: fit.slope, mse: fit.mse, xMean: fit.xMean, sxx: fit.sxx, sumX2: fit.sumX2 }
      : null,
    profileSeries: liner.inspections
      .filter((ia) => dateOf.has(ia.inspectionId))
      .map((ia) => {
        const worst = new Map<string, number>();
        for (const c of ia.cells) if (c.usable && !(c.wearMm <= (worst.get(c.stationKey) ?? -Infinity))) worst.set(c.stationKey, c.wearMm);
        return { inspectionId: ia.inspectionId, date: dateOf.get(ia.inspectionId)!, stations: [...worst].map(([stationKey, wearMm]) => ({ stationKey, wearMm })) };
      }),
    latest:
      last && dateOf.has(last.inspectionId)
        ? {
            inspectionId: last.inspectionId,
            date: dateOf.get(last.inspectionId)!,
            cells: last.cells.map((c) => ({ stationKey: c.stationKey, axisKey: c.axisKey, rawMm: c.rawMm, correctedMm: c.correctedMm, wearMm: c.wearMm, usable: c.usable })),
            ovality: last.ovality.map((o) => ({ stationKey: o.stationKey, ovalityMm: o.ovalityMm })),
          }
        : null,
    rings: analysis.rings,
    linerIssues: liner.issues,
  };
}

function withDates(p: Projection, latest: { linerHours: number; date: string } | null, rate: RunningRate): ProjectionSummary {
  if (p.kind !== "projected" || !latest) return { ...p, dates: null };
  return {
    ...p,
    dates: projectDate({ atLinerHours: p.atLinerHours, lowerHours: p.lowerHours, upperHours: p.upperHours }, latest, rate),
  };
}

/**
 * Runs the pure wear and ring computations for one unit and condenses them to what the
 * screens and the fleet outlook need. No I/O: the caller loads and stores.
 */
export function computeUnitAnalysis(input: UnitInput): UnitAnalysis {
  const liner = analyseLiner(input.profile, input.inspections, { asFittedReadings: input.asFittedReadings });
  const latest = liner.latest;
  const rate = rateOf(input.hoursLog);
  const ringCurrent = latestRingInspection(input.ringInspections);
  const nextOverhaul = nextOverhaulEngineHours(input);
  const hoursToNext = nextOverhaul !== null && latest ? nextOverhaul - latest.engineHours : null;
  const rings = ringCurrent
    ? analyseRings(input.profile.rings as RingPositionSpec[], ringCurrent, input.ringInspections, { hoursToNextOverhaul: hoursToNext })
    : null;
  const band = unitBand({
    profile: input.profile,
    liner,
    rings,
    nextOverhaul: nextOverhaul !== null ? { engineHours: nextOverhaul } : null,
  });
  const ref = latest ? { linerHours: latest.linerHours, date: latest.date } : null;
  const trend = liner.wear.trend;
  const summary: UnitSummary = {
    band,
    nextOverhaulEngineHours: nextOverhaul,
    linerHours: latest?.linerHours ?? null,
    lastInspectedOn: latest?.date ?? null,
    lastEngineHours: latest?.engineHours ?? null,
    maxWearMm: latest?.maxWearMm ?? null,
    maxWearStation: latest?.maxWearAt?.stationKey ?? null,
    maxOvalityMm: latest?.maxOvalityMm ?? null,
    lastIntervalRate: liner.lastIntervalRate?.mmPer1000h ?? null,
    trend: trend
      ? {
          slopeMmPer1000h: trend.slopeMmPer1000h,
          slopeSdMmPer1000h: trend.slopeSdMmPer1000h,
          rSquared: trend.rSquared,
          residualSdMm: trend.residualSdMm,
          n: trend.n,
        }
      : null,
    wear: withDates(liner.wear.projection, ref, rate),
    ovality: withDates(liner.ovality.projection, ref, rate),
    runningRate: rate,
    rings: (rings?.rings ?? []).map((r) => ({
      position: r.position,
      renew: r.renew,
      overLimit: r.overLimit,
      gapMm: r.gap?.valueMm ?? null,
      grooveMm: r.groove?.valueMm ?? null,
      reasons: r.reasons,
    })),
    issues: liner.issues.map((i) => i.message),
  };
  return { summary, liner, rings };
}

/**
 * The next piston overhaul in engine hours: the last approved overhaul of the unit (every
 * gauging is taken with the piston out, whatever liner was in) plus the profile's overhaul
 * interval. Before the unit has any approved overhaul, the plan stored on the unit stands.
 */
export function nextOverhaulEngineHours(input: Pick<UnitInput, "ringInspections" | "overhaulIntervalHours" | "nextOverhaulEngineHours">): number | null {
  const interval = input.overhaulIntervalHours;
  let last: number | null = null;
  for (const i of input.ringInspections) if (Number.isFinite(i.engineHours) && (last === null || i.engineHours > last)) last = i.engineHours;
  if (last === null || interval == null || !Number.isFinite(interval) || interval <= 0) return input.nextOverhaulEngineHours;
  // Hours are kept to 0.1 h; the sum is rounded to that so it compares equal to the stored figure.
  return Math.round((last + interval) * 10) / 10;
}

// Units of one engine share one log array; its running rate is worked out once.
const rateCache = new WeakMap<readonly RunningHoursEntry[], RunningRate>();
function rateOf(log: readonly RunningHoursEntry[]): RunningRate {
  let rate = rateCache.get(log);
  if (!rate) rateCache.set(log, (rate = runningHoursPerDay(log)));
  return rate;
}

function latestRingInspection(list: RingInspection[]): RingInspection | null {
  let best: RingInspection | null = null;
  for (const r of list) if (r.readings.length && (!best || r.engineHours > best.engineHours)) best = r;
  return best;
}

/** The earliest date among the wear and ovality projections, with its interval. */
export function earliestLimit(summary: UnitSummary): { on: string; earliest: string | null; latest: string | null } | null {
  const candidates = [summary.wear, summary.ovality]
    .map((p) => p.dates)
    .filter((d): d is Extract<DateProjection, { kind: "dated" }> => d?.kind === "dated");
  if (!candidates.length) return null;
  candidates.sort((a, b) => a.date.localeCompare(b.date));
  return { on: candidates[0].date, earliest: candidates[0].lower, latest: candidates[0].upper };
}
