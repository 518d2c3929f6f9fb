import { leastSquaresSlope } from "../stats/regression";
import { hoursText as formatRunningHours, mm, rateText } from "../format";

/** New and limit values for one ring position, from the maker's clearance table. */
export type RingPositionSpec = {
  /** 1 is the top ring. */
  position: number;
  gapNewMinMm: number;
  gapNewMaxMm: number;
  gapLimitMm: number;
  grooveNewMinMm: number;
  grooveNewMaxMm: number;
  grooveLimitMm: number;
};

export type GapMeasuredIn = "gauge_ring" | "liner_unworn" | "liner_worn";

/**
 * One ring's readings at an inspection. `renewed` means the ring was renewed at this inspection
 * and the values are those of the new ring, so growth is counted from here.
 */
export type RingReading = {
  position: number;
  closedGapMm: number | null;
  gapMeasuredIn: GapMeasuredIn;
  /** Liner diameter over nominal where the gap was measured; needed when measured in a worn part. */
  linerDiameterIncreaseMm?: number | null;
  grooveClearanceMm: number | null;
  renewed: boolean;
};

export type RingInspection = { inspectionId: string; engineHours: number; readings: RingReading[] };

export type RingState = "below_new_range" | "within_new_range" | "worn" | "at_or_over_limit";

export type RingMeasure = {
  valueMm: number;
  state: RingState;
  limitMm: number;
  /** Least-squares growth since the ring was renewed; null with fewer than two readings. */
  growthMmPer1000h: number | null;
  /** Running hours until the limit at that growth; 0 at or over it, null when not growing. */
  hoursToLimit: number | null;
};

export type GapMeasure = RingMeasure & { measuredMm: number; basis: "gauge_ring" | "as_measured" };

export type RingResult = {
  position: number;
  gap: GapMeasure | null;
  groove: RingMeasure | null;
  overLimit: boolean;
  renew: boolean;
  reasons: string[];
};

export type RingIssue = { kind: "unknown_position" | "duplicate_reading" | "not_measured" | "invalid_value" | "gap_not_normalised"; position: number; message: string };

export type RingAnalysis = { rings: RingResult[]; issues: RingIssue[] };

/** Below this (mm under nominal, after correction to 20 °C) a "worn" diameter is refused; within it, the gauge's resolution, it counts as nominal. */
const UNDER_NOMINAL_TOLERANCE_MM = 0.01;

export type GapLinerIncrease = { kind: "ok"; increaseMm: number } | { kind: "none" } | { kind: "invalid"; message: string };

/**
 * The liner diameter's increase over nominal where a ring gap was read in a worn part of the
 * liner. The diameter is read with the same micrometer at the same temperatures as the bore
 * readings, so it is referred to 20 °C with the same factor (ISO 1; see lib/wear/correction).
 * A worn part cannot be under the nominal bore: a diameter more than the gauge's 0.01 mm under
 * it is refused with a plain reason, because a negative increase would enlarge the gap instead
 * of reducing it. A missing or non-finite diameter gives "none".
 */
export function gapLinerIncrease(boreMm: number, diameterMm: number | null | undefined, correctionFactor = 1): GapLinerIncrease {
  if (diameterMm == null || !Number.isFinite(diameterMm) || !Number.isFinite(correctionFactor)) return { kind: "none" };
  const increaseMm = diameterMm * correctionFactor - boreMm;
  if (increaseMm < -UNDER_NOMINAL_TOLERANCE_MM) {
    return {
      kind: "invalid",
      message: `The liner diameter where the gap was read, ${mm(diameterMm * correctionFactor)} at 20 °C, is under the ${mm(boreMm)} nominal bore; a worn part of the liner cannot be. Check the reading, or record the gap as read in an unworn part.`,
    };
  }
  return { kind: "ok", increaseMm: Math.max(0, increaseMm) };
}

/**
 * The closed gap referred to a gauge ring of nominal bore. A ring in a worn part of the liner
 * opens by the increase in circumference, π × the diameter increase (derived), so that is taken
 * off; the unworn part of the liner is at nominal bore and needs no change. Without the diameter
 * increase the gap is left as measured, which overstates wear (the safe side), and says so.
 */
export function normaliseClosedGap(
  measuredMm: number,
  measuredIn: GapMeasuredIn,
  linerDiameterIncreaseMm?: number | null,
): { gapMm: number; basis: "gauge_ring" | "as_measured" } {
  if (measuredIn !== "liner_worn") return { gapMm: measuredMm, basis: "gauge_ring" };
  // A negative increase is refused (gapLinerIncrease): it would open the gap rather than close it.
  if (linerDiameterIncreaseMm == null || !Number.isFinite(linerDiameterIncreaseMm) || linerDiameterIncreaseMm < 0) return { gapMm: measuredMm, basis: "as_measured" };
  return { gapMm: measuredMm - Math.PI * linerDiameterIncreaseMm, basis: "gauge_ring" };
}

/** Where a gap or groove clearance sits against the new range and the limit. */
export function ringState(valueMm: number, newMinMm: number, newMaxMm: number, limitMm: number): RingState {
  if (valueMm >= limitMm) return "at_or_over_limit";
  if (valueMm < newMinMm) return "below_new_range";
  if (valueMm <= newMaxMm) return "within_new_range";
  return "worn";
}

function readingAt(inspection: RingInspection, position: number): RingReading | undefined {
  for (const r of inspection.readings) if (r.position === position) return r;
  return undefined;
}

const validMm = (v: number | null | undefined): v is number => v != null && Number.isFinite(v) && v >= 0;

function measure(valueMm: number, newMin: number, newMax: number, limit: number, series: { x: number; y: number }[]): RingMeasure {
  const slope = leastSquaresSlope(series);
  const growthMmPer1000h = slope === null ? null : slope * 1000;
  const state = ringState(valueMm, newMin, newMax, limit);
  const hoursToLimit = state === "at_or_over_limit" ? 0 : slope !== null && slope > 0 ? (limit - valueMm) / slope : null;
  return { valueMm, state, limitMm: limit, growthMmPer1000h, hoursToLimit };
}

/**
 * Closed gap and groove clearance of each ring against its new range and limit, their growth
 * per 1000 running hours across the history of the same ring (the series restarts at the last
 * renewal), the hours left to each limit, and a renew flag with plain reasons: at or over a limit
 * now, or expected to reach one before the next overhaul when `hoursToNextOverhaul` is given.
 * History entries later than the current inspection are ignored.
 */
export function analyseRings(
  specs: readonly RingPositionSpec[],
  current: RingInspection,
  history: readonly RingInspection[] = [],
  options: { hoursToNextOverhaul?: number | null } = {},
): RingAnalysis {
  const issues: RingIssue[] = [];
  const specByPosition = new Map(specs.map((s) => [s.position, s]));
  const readings = new Map<number, RingReading>();
  for (const r of current.readings) {
    if (!specByPosition.has(r.position)) {
      issues.push({ kind: "unknown_position", position: r.position, message: `Ring ${r.position} is not in the engine profile.` });
    } else if (readings.has(r.position)) {
      issues.push({ kind: "duplicate_reading", position: r.position, message: `Two readings for ring ${r.position}; the first is used.` });
    } else {
      readings.set(r.position, r);
    }
  }

  const earlier = history
    .filter((h) => h.inspectionId !== current.inspectionId && Number.isFinite(h.engineHours) && h.engineHours <= current.engineHours)
    .sort((a, b) => a.engineHours - b.engineHours);
  const nextOverhaul = options.hoursToNextOverhaul != null && Number.isFinite(options.hoursToNextOverhaul) ? options.hoursToNextOverhaul : null;

  const rings = [...specs]
    .sort((a, b) => a.position - b.position)
    .map((spec): RingResult => {
      const reading = readings.get(spec.position);
      const result: RingResult = { position: spec.position, gap: null, groove: null, overLimit: false, renew: false, reasons: [] };
      if (!reading) {
        issues.push({ kind: "not_measured", position: spec.position, message: `Ring ${spec.position} was not measured.` });
        return result;
      }
      // The same ring set: from the last renewal up to this inspection (built by hand: this
      // runs for every ring of every unit in a fleet recompute).
      const since: { hours: number; r: RingReading }[] = [];
      for (const h of earlier) {
        const r = readingAt(h, spec.position);
        if (!r) continue;
        if (r.renewed) since.length = 0;
        since.push({ hours: h.engineHours, r });
      }
      if (reading.renewed) since.length = 0;
      since.push({ hours: current.engineHours, r: reading });

      if (reading.closedGapMm != null) {
        if (!validMm(reading.closedGapMm) || (reading.linerDiameterIncreaseMm != null && !Number.isFinite(reading.linerDiameterIncreaseMm))) {
          issues.push({ kind: "invalid_value", position: spec.position, message: `Ring ${spec.position}: the closed gap is not a valid length.` });
        } else {
          const { gapMm, basis } = normaliseClosedGap(reading.closedGapMm, reading.gapMeasuredIn, reading.linerDiameterIncreaseMm);
          if (basis === "as_measured" && reading.linerDiameterIncreaseMm != null && reading.linerDiameterIncreaseMm < 0) {
            issues.push({
              kind: "invalid_value",
              position: spec.position,
              message: `Ring ${spec.position}: the liner diameter where the gap was read is under the nominal bore, which a worn part cannot be; the gap is used as measured.`,
            });
          } else if (basis === "as_measured") {
            issues.push({
              kind: "gap_not_normalised",
              position: spec.position,
              message: `Ring ${spec.position}: gap measured in a worn part of the liner without the liner diameter there, so it is used as measured and overstates wear.`,
            });
          }
          const series: { x: number; y: number }[] = [];
          for (const c of since) {
            if (validMm(c.r.closedGapMm)) series.push({ x: c.hours, y: normaliseClosedGap(c.r.closedGapMm, c.r.gapMeasuredIn, c.r.linerDiameterIncreaseMm).gapMm });
          }
          const m = measure(gapMm, spec.gapNewMinMm, spec.gapNewMaxMm, spec.gapLimitMm, series);
          result.gap = { valueMm: m.valueMm, state: m.state, limitMm: m.limitMm, growthMmPer1000h: m.growthMmPer1000h, hoursToLimit: m.hoursToLimit, measuredMm: reading.closedGapMm, basis };
        }
      }
      if (reading.grooveClearanceMm != null) {
        if (!validMm(reading.grooveClearanceMm)) {
          issues.push({ kind: "invalid_value", position: spec.position, message: `Ring ${spec.position}: the groove clearance is not a valid length.` });
        } else {
          const series: { x: number; y: number }[] = [];
          for (const c of since) if (validMm(c.r.grooveClearanceMm)) series.push({ x: c.hours, y: c.r.grooveClearanceMm });
          result.groove = measure(reading.grooveClearanceMm, spec.grooveNewMinMm, spec.grooveNewMaxMm, spec.grooveLimitMm, series);
        }
      }

      for (const [name, m] of [["closed gap", result.gap], ["groove clearance", result.groove]] as const) {
        if (!m) continue;
        if (m.state === "at_or_over_limit") {
          result.overLimit = true;
          result.renew = true;
          result.reasons.push(`Ring ${spec.position} ${name} ${mm(m.valueMm)} is at or over its ${mm(m.limitMm)} limit.`);
        } else if (nextOverhaul !== null && m.hoursToLimit !== null && m.hoursToLimit < nextOverhaul) {
          result.renew = true;
          result.reasons.push(
            `Ring ${spec.position} ${name} is growing ${rateText(m.growthMmPer1000h)} and would reach its ${mm(m.limitMm)} limit in about ${formatRunningHours(m.hoursToLimit)}, before the next overhaul.`,
          );
        }
      }
      if (result.gap?.state === "below_new_range") {
        result.reasons.push(`Ring ${spec.position} closed gap ${mm(result.gap.valueMm)} is under the new range: check the measurement; a gap too small can close up when hot.`);
      }
      return result;
    });

  return { rings, issues };
}
