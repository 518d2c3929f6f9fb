import type { LinearFit } from "../stats/regression";
import { fitLine, inversePredict, outlierCriticalValue } from "../stats/regression";
import { fixed as formatFixed, hoursText } from "../format";
import { parseIsoDate } from "./calendar";
import type { InspectionAnalysis, MaxWear } from "./inspection";
import { analyseInspection } from "./inspection";
import { checkProfile, minPointsForProjection } from "./profile";
import type { Inspection, LinerReading, WearProfile } from "./types";
import { WEAR_RULES } from "./types";

export type LinerPoint = {
  inspectionId: string;
  date: string;
  engineHours: number;
  linerHours: number;
  maxWearMm: number | null;
  maxWearAt: Omit<MaxWear, "wearMm"> | null;
  maxOvalityMm: number | null;
  /** Past running-in, so part of the steady-state fits. */
  steady: boolean;
  /**
   * Readings of this gauging judged impossible (typing or gauge errors) and left out of its
   * maxima, largest first. When the largest reading is among them, the point shows the
   * next-largest usable cell, and the trend must say so.
   */
  excludedReadings: { stationKey: string; axisKey: string; correctedMm: number; wearMm: number }[];
  /** True when an excluded reading would have been this gauging's maximum wear. */
  maxWearExcluded: boolean;
  /** Externally studentized (deleted) residual from the steady wear fit. */
  wearResidual: number | null;
  wearOutlier: boolean;
  ovalityResidual: number | null;
  ovalityOutlier: boolean;
};

export type Trend = {
  slopeMmPer1000h: number;
  slopeSdMmPer1000h: number;
  interceptMm: number;
  rSquared: number;
  residualSdMm: number;
  n: number;
  fit: LinearFit;
};

export type Projection =
  | {
      kind: "projected";
      limitMm: number;
      atLinerHours: number;
      /** Earliest liner hours the limit may be reached (upper prediction band); null if unbounded. */
      lowerHours: number | null;
      /** Latest liner hours (lower prediction band); null when that band never reaches the limit. */
      upperHours: number | null;
      /** Liner hours left from the latest inspection; negative when the line is already past the limit. */
      hoursRemaining: number;
      confidence: number;
    }
  | { kind: "insufficient_data"; needed: number; have: number }
  | { kind: "not_wearing"; slopeMmPer1000h: number }
  | { kind: "already_over"; limitMm: number; valueMm: number; inspectionId: string; linerHours: number };

export type MetricAnalysis = { trend: Trend | null; projection: Projection; outlierInspectionIds: string[] };

export type LinerIssueKind = "invalid_profile" | "invalid_date" | "invalid_hours" | "hours_not_increasing" | "no_usable_readings" | "outlier";

export type LinerIssue = { kind: LinerIssueKind; message: string; inspectionId?: string };

export type LinerAnalysis = {
  /** Every inspection considered, in date order, with its own issues. */
  inspections: InspectionAnalysis[];
  /** Inspections with valid hours and at least one usable reading, in date order. */
  points: LinerPoint[];
  latest: LinerPoint | null;
  /** Between the last two inspections; `steady` when both are past running-in. */
  lastIntervalRate: { mmPer1000h: number; fromInspectionId: string; toInspectionId: string; steady: boolean } | null;
  wear: MetricAnalysis;
  ovality: MetricAnalysis;
  issues: LinerIssue[];
};

/** A century of running: more liner hours than this is a typing error. */
const MAX_PLAUSIBLE_HOURS = 1_000_000;

type Metric = "wear" | "ovality";
const valueOf = (p: LinerPoint, metric: Metric) => (metric === "wear" ? p.maxWearMm : p.maxOvalityMm);

/**
 * The wear history of one liner: maximum wear and ovality against liner hours, the rate over the
 * last interval, a least-squares trend over the steady part (liner hours at or past the
 * profile's running-in hours, because wear runs fast while a liner beds in and only then settles
 * to a roughly straight line), and projections of the liner hours at which wear and ovality reach
 * their limits, each with a 95 % interval by inverse prediction.
 * A point whose externally studentized (deleted) residual exceeds the Bonferroni critical value
 * t(1 − α/(2n), n − 3) is flagged as an outlier and reported, but kept in the fit: a surprising
 * reading is a question for the engineer, not a reason to quietly change the answer. The residual
 * standard deviation is floored at the gauge resolution, so neither a perfect fit nor a gauging
 * inside the gauge's step claims more certainty than the micrometer has. A gauging at 0 liner
 * hours (the liner gauged as fitted) belongs to the history. Dates that do not parse, negative
 * (or absurdly large) hours, and liner hours that fall while dates advance are typed issues.
 * `asOf` (yyyy-mm-dd) restricts the history to inspections on or before that date.
 */
export function analyseLiner(
  profile: WearProfile,
  inspections: readonly Inspection[],
  options: { asOf?: string; asFittedReadings?: readonly LinerReading[] } = {},
): LinerAnalysis {
  const issues: LinerIssue[] = [];
  const needed = minPointsForProjection(profile);
  const nothing: MetricAnalysis = { trend: null, projection: { kind: "insufficient_data", needed, have: 0 }, outlierInspectionIds: [] };
  const result: LinerAnalysis = { inspections: [], points: [], latest: null, lastIntervalRate: null, wear: nothing, ovality: nothing, issues };

  const problems = checkProfile(profile);
  if (problems.length > 0) {
    issues.push(...problems.map((message) => ({ kind: "invalid_profile" as const, message })));
    return result;
  }

  const asOf = options.asOf === undefined ? null : parseIsoDate(options.asOf);
  const dated: { inspection: Inspection; ms: number }[] = [];
  for (const inspection of inspections) {
    const ms = parseIsoDate(inspection.date);
    if (ms === null) {
      issues.push({ kind: "invalid_date", inspectionId: inspection.id, message: `Inspection ${inspection.id} has no valid date and is left out.` });
    } else if (asOf === null || ms <= asOf) {
      dated.push({ inspection, ms });
    }
  }
  dated.sort((a, b) => a.ms - b.ms || a.inspection.linerHours - b.inspection.linerHours);

  let highest: number | null = null;
  for (const { inspection } of dated) {
    const analysis = analyseInspection(profile, inspection, options.asFittedReadings);
    result.inspections.push(analysis);
    const hours = inspection.linerHours;
    if (!Number.isFinite(hours) || hours < 0 || hours > MAX_PLAUSIBLE_HOURS || !Number.isFinite(inspection.engineHours)) {
      issues.push({ kind: "invalid_hours", inspectionId: inspection.id, message: `Inspection of ${inspection.date} has no valid liner hours and is left out of the trend.` });
      continue;
    }
    if (highest !== null && hours < highest) {
      issues.push({
        kind: "hours_not_increasing",
        inspectionId: inspection.id,
        message: `Inspection of ${inspection.date} shows ${hoursText(hours)} on the liner, fewer than the ${hoursText(highest)} of an earlier inspection. Check the running hours.`,
      });
    }
    highest = Math.max(highest ?? hours, hours);
    if (!analysis.maxWear && !analysis.maxOvality) {
      issues.push({ kind: "no_usable_readings", inspectionId: inspection.id, message: `Inspection of ${inspection.date} has no usable liner readings.` });
      continue;
    }
    const excluded = analysis.cells
      .filter((c) => !c.usable)
      .map((c) => ({ stationKey: c.stationKey, axisKey: c.axisKey, correctedMm: c.correctedMm, wearMm: c.wearMm }))
      .sort((a, b) => b.wearMm - a.wearMm);
    result.points.push({
      inspectionId: inspection.id,
      date: inspection.date,
      engineHours: inspection.engineHours,
      linerHours: hours,
      maxWearMm: analysis.maxWear?.wearMm ?? null,
      maxWearAt: analysis.maxWear ? { stationKey: analysis.maxWear.stationKey, axisKey: analysis.maxWear.axisKey, depthMm: analysis.maxWear.depthMm } : null,
      maxOvalityMm: analysis.maxOvality?.ovalityMm ?? null,
      steady: hours >= profile.runningInHours,
      excludedReadings: excluded,
      maxWearExcluded: excluded.length > 0 && (!analysis.maxWear || excluded[0].wearMm > analysis.maxWear.wearMm),
      wearResidual: null,
      wearOutlier: false,
      ovalityResidual: null,
      ovalityOutlier: false,
    });
  }

  const points = result.points;
  result.latest = points.at(-1) ?? null;
  const withWear = points.filter((p) => p.maxWearMm !== null);
  const [prev, last] = withWear.slice(-2);
  const rate = prev && last ? intervalRate(prev.maxWearMm!, prev.linerHours, last.maxWearMm!, last.linerHours) : null;
  if (prev && last && rate !== null) {
    result.lastIntervalRate = {
      mmPer1000h: rate,
      fromInspectionId: prev.inspectionId,
      toInspectionId: last.inspectionId,
      steady: prev.steady && last.steady,
    };
  }
  const resolution = gaugeResolution(profile);
  result.wear = analyseMetric(points, "wear", profile.linerWearLimitMm, needed, resolution, issues);
  result.ovality = analyseMetric(points, "ovality", profile.ovalityLimitMm, needed, resolution, issues);
  return result;
}

/** Wear rate between two gaugings, in mm per 1000 liner hours; null unless the liner hours rose. */
export function intervalRate(fromWearMm: number, fromLinerHours: number, toWearMm: number, toLinerHours: number): number | null {
  // Under one running hour apart there is no rate to speak of (and a vanishing interval would divide to infinity).
  if (!(toLinerHours - fromLinerHours >= 1)) return null;
  const rate = ((toWearMm - fromWearMm) * 1000) / (toLinerHours - fromLinerHours);
  return Number.isFinite(rate) ? rate : null;
}

/** The profile's gauge resolution, or 0.01 mm when it gives none (or an unusable one). */
export function gaugeResolution(profile: Pick<WearProfile, "gaugeResolutionMm">): number {
  const r = profile.gaugeResolutionMm;
  return r !== undefined && Number.isFinite(r) && r > 0 && r < 1 ? r : WEAR_RULES.gaugeResolutionMm;
}

function analyseMetric(points: LinerPoint[], metric: Metric, limitMm: number, needed: number, resolutionMm: number, issues: LinerIssue[]): MetricAnalysis {
  const measured = points.filter((p) => valueOf(p, metric) !== null);
  const steady = measured.filter((p) => p.steady);
  const fitted = fitLine(
    steady.map((p) => ({ x: p.linerHours, y: valueOf(p, metric)! })),
    { minResidualSd: resolutionMm },
  );
  let trend: Trend | null = null;
  const outlierInspectionIds: string[] = [];
  if (fitted.kind === "fit") {
    const fit = fitted.fit;
    trend = {
      slopeMmPer1000h: fit.slope * 1000,
      slopeSdMmPer1000h: fit.slopeSd * 1000,
      interceptMm: fit.intercept,
      rSquared: fit.rSquared,
      residualSdMm: fit.residualSd,
      n: fit.n,
      fit,
    };
    const critical = outlierCriticalValue(fit.n, { alpha: WEAR_RULES.outlierFamilyAlpha });
    steady.forEach((p, i) => {
      const r = fit.deletedResiduals[i];
      const outlier = r !== null && critical !== null && Math.abs(r) > critical;
      if (metric === "wear") Object.assign(p, { wearResidual: r, wearOutlier: outlier });
      else Object.assign(p, { ovalityResidual: r, ovalityOutlier: outlier });
      if (!outlier) return;
      outlierInspectionIds.push(p.inspectionId);
      issues.push({
        kind: "outlier",
        inspectionId: p.inspectionId,
        message: `The ${metric} at ${hoursText(p.linerHours)} (${p.date}) lies far off the line through the other readings (studentized deleted residual ${formatFixed(Math.abs(r!), 1)}, over the ${formatFixed(critical!, 1)} that ${fit.n} points allow). It is kept in the fit; check the reading.`,
      });
    });
  }

  const latest = measured.at(-1);
  const latestValue = latest ? valueOf(latest, metric)! : null;
  let projection: Projection;
  if (latest && latestValue !== null && latestValue >= limitMm) {
    projection = { kind: "already_over", limitMm, valueMm: latestValue, inspectionId: latest.inspectionId, linerHours: latest.linerHours };
  } else if (steady.length < needed || fitted.kind !== "fit") {
    const have = fitted.kind === "degenerate" ? new Set(steady.map((p) => p.linerHours)).size : steady.length;
    projection = { kind: "insufficient_data", needed, have };
  } else if (!(fitted.fit.slope > 0)) {
    projection = { kind: "not_wearing", slopeMmPer1000h: fitted.fit.slope * 1000 };
  } else {
    // The slope is positive here, so a null or slope_not_positive answer cannot arise in practice.
    const inverse = inversePredict(fitted.fit, limitMm, WEAR_RULES.confidence);
    if (inverse === null || inverse.kind === "slope_not_positive") {
      projection = { kind: "insufficient_data", needed, have: steady.length };
    } else {
      projection = {
        kind: "projected",
        limitMm,
        atLinerHours: inverse.x,
        lowerHours: inverse.lower,
        upperHours: inverse.upper,
        hoursRemaining: inverse.x - latest!.linerHours,
        confidence: inverse.confidence,
      };
    }
  }
  return { trend, projection, outlierInspectionIds };
}
