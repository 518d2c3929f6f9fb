import { formatMm as mm } from "../units/length";
import type { TemperatureCorrection } from "./correction";
import { temperatureCorrection } from "./correction";
import { checkAgainstNominal } from "./plausibility";
import { checkProfile, isUnwornBand } from "./profile";
import type { Inspection, LinerReading, WearProfile } from "./types";
import { WEAR_RULES } from "./types";

export type CellResult = {
  stationKey: string;
  axisKey: string;
  rawMm: number;
  correctedMm: number;
  wearMm: number;
  /** False for a reading judged a gauge or typing error; it is shown but kept out of maxima and ovality. */
  usable: boolean;
};

export type StationOvality = { stationKey: string; depthMm: number; ovalityMm: number | null };

export type InspectionIssueKind =
  | "invalid_profile"
  | "unknown_cell"
  | "duplicate_reading"
  | "invalid_value"
  | "missing_reading"
  | "below_nominal"
  | "far_above_nominal"
  | "unworn_band_worn"
  | "no_as_fitted_reading"
  | "temperature_not_applied";

export type InspectionIssue = { kind: InspectionIssueKind; message: string; stationKey?: string; axisKey?: string };

export type MaxWear = { wearMm: number; stationKey: string; axisKey: string; depthMm: number };
export type MaxOvality = { ovalityMm: number; stationKey: string; depthMm: number };

export type UnwornBandCheck =
  | { status: "ok" | "suspect"; maxAbsWearMm: number }
  | { status: "not_measured"; maxAbsWearMm: null };

export type InspectionAnalysis = {
  inspectionId: string;
  correction: TemperatureCorrection;
  cells: CellResult[];
  ovality: StationOvality[];
  maxWear: MaxWear | null;
  maxOvality: MaxOvality | null;
  unwornBand: UnwornBandCheck;
  issues: InspectionIssue[];
};

const cellKey = (stationKey: string, axisKey: string) => `${stationKey}\u0000${axisKey}`;

type ProfileLookups = { stations: Map<string, WearProfile["stations"][number]>; axisKeys: Set<string> };
const lookups = new WeakMap<WearProfile, ProfileLookups>();

/** Station and direction look-ups, built once per profile object rather than per inspection. */
function lookupsOf(profile: WearProfile): ProfileLookups {
  let l = lookups.get(profile);
  if (!l) {
    l = { stations: new Map(profile.stations.map((s) => [s.key, s])), axisKeys: new Set(profile.axes.map((a) => a.key)) };
    lookups.set(profile, l);
  }
  return l;
}

const CORRECTION_REASON: Record<Exclude<TemperatureCorrection, { applied: true }>["reason"], string | null> = {
  disabled: null,
  missing_temperature: "Gauge or liner temperature not recorded: readings are used as read, without correction to 20 °C.",
  implausible_temperature: "A recorded temperature is implausible: readings are used as read, without correction to 20 °C.",
  invalid_coefficient: "The profile's expansion coefficients are out of range: readings are used as read, without correction to 20 °C.",
};

/**
 * Wear, ovality and their maxima for one inspection. Each reading is referred to 20 °C when the
 * profile asks for it, and wear is measured from the nominal bore or from the same cell as
 * fitted. Bad input never throws or yields NaN: an unknown cell, a non-finite value, a missing
 * direction or an implausible diameter becomes a typed issue, and implausible readings are kept
 * out of the maxima so one slip of a digit does not condemn a liner.
 * Where an as-fitted reading is missing, wear falls back to the nominal bore, which overstates
 * wear when the liner was fitted large, the safe side for a renewal decision.
 */
export function analyseInspection(profile: WearProfile, inspection: Inspection, asFittedReadings?: readonly LinerReading[]): InspectionAnalysis {
  const issues: InspectionIssue[] = [];
  const correction = temperatureCorrection(profile, inspection.gaugeTempC, inspection.linerTempC);
  const empty: InspectionAnalysis = {
    inspectionId: inspection.id,
    correction,
    cells: [],
    ovality: [],
    maxWear: null,
    maxOvality: null,
    unwornBand: { status: "not_measured", maxAbsWearMm: null },
    issues,
  };
  const profileProblems = checkProfile(profile);
  if (profileProblems.length > 0) {
    issues.push(...profileProblems.map((message) => ({ kind: "invalid_profile" as const, message })));
    return empty;
  }
  if (!correction.applied && CORRECTION_REASON[correction.reason]) {
    issues.push({ kind: "temperature_not_applied", message: CORRECTION_REASON[correction.reason]! });
  }

  const { stations, axisKeys } = lookupsOf(profile);
  const asFitted = new Map<string, number>();
  for (const r of asFittedReadings ?? []) {
    if (Number.isFinite(r.diameterMm) && r.diameterMm > 0) asFitted.set(cellKey(r.stationKey, r.axisKey), r.diameterMm);
  }
  const useAsFitted = profile.wearReference === "as_fitted";
  if (useAsFitted && asFitted.size === 0) {
    issues.push({ kind: "no_as_fitted_reading", message: "No as-fitted readings for this liner: wear is measured from the nominal bore." });
  }

  const cells = new Map<string, CellResult>();
  for (const r of inspection.readings) {
    const where = { stationKey: r.stationKey, axisKey: r.axisKey };
    const station = stations.get(r.stationKey);
    if (!station || !axisKeys.has(r.axisKey)) {
      issues.push({ kind: "unknown_cell", message: "A reading names a station or direction that is not in the profile.", ...where });
      continue;
    }
    const key = cellKey(r.stationKey, r.axisKey);
    if (cells.has(key)) {
      issues.push({ kind: "duplicate_reading", message: `Two readings for ${station.label}; the first is used.`, ...where });
      continue;
    }
    if (!Number.isFinite(r.diameterMm) || r.diameterMm <= 0) {
      issues.push({ kind: "invalid_value", message: `The reading at ${station.label} is not a valid diameter.`, ...where });
      continue;
    }
    const correctedMm = r.diameterMm * correction.factor;
    const fitted = useAsFitted ? asFitted.get(key) : undefined;
    if (useAsFitted && asFitted.size > 0 && fitted === undefined) {
      issues.push({ kind: "no_as_fitted_reading", message: `No as-fitted reading at ${station.label}: wear there is measured from the nominal bore.`, ...where });
    }
    const wearMm = correctedMm - (fitted ?? profile.boreMm);
    const nominal = checkAgainstNominal(profile.boreMm, correctedMm);
    if (nominal === "below_nominal") {
      issues.push({ kind: "below_nominal", message: `${station.label}: ${mm(correctedMm)} is more than ${mm(WEAR_RULES.belowNominalMarginMm)} under the nominal bore; left out of the maxima.`, ...where });
    } else if (nominal === "far_above_nominal") {
      issues.push({ kind: "far_above_nominal", message: `${station.label}: ${mm(correctedMm)} is far over the nominal bore, likely a typing error; left out of the maxima.`, ...where });
    }
    cells.set(key, { stationKey: r.stationKey, axisKey: r.axisKey, rawMm: r.diameterMm, correctedMm, wearMm, usable: nominal === "ok" });
  }

  const ovality: StationOvality[] = [];
  let maxWear: MaxWear | null = null;
  let maxOvality: MaxOvality | null = null;
  let unwornMax: number | null = null;
  let unwornSuspect = false;
  for (const station of profile.stations) {
    const pair = profile.axes.map((axis) => {
      const cell = cells.get(cellKey(station.key, axis.key));
      if (!cell) {
        issues.push({ kind: "missing_reading", message: `No ${axis.label.toLowerCase()} reading at ${station.label}.`, stationKey: station.key, axisKey: axis.key });
      }
      return cell?.usable ? cell : undefined;
    });
    for (const cell of pair) {
      if (!cell) continue;
      if (!maxWear || cell.wearMm > maxWear.wearMm) {
        maxWear = { wearMm: cell.wearMm, stationKey: station.key, axisKey: cell.axisKey, depthMm: station.depthMm };
      }
      if (isUnwornBand(station.role)) {
        const abs = Math.abs(cell.wearMm);
        unwornMax = Math.max(unwornMax ?? 0, abs);
        if (abs > WEAR_RULES.unwornBandToleranceMm) {
          unwornSuspect = true;
          issues.push({
            kind: "unworn_band_worn",
            message: `${station.label} is an unworn band but reads ${mm(cell.wearMm)} from the reference bore: check the gauge setting or the profile's nominal bore.`,
            stationKey: station.key,
            axisKey: cell.axisKey,
          });
        }
      }
    }
    const [a, b] = pair;
    const ovalityMm = a && b ? Math.abs(a.correctedMm - b.correctedMm) : null;
    ovality.push({ stationKey: station.key, depthMm: station.depthMm, ovalityMm });
    if (ovalityMm !== null && (!maxOvality || ovalityMm > maxOvality.ovalityMm)) {
      maxOvality = { ovalityMm, stationKey: station.key, depthMm: station.depthMm };
    }
  }

  return {
    ...empty,
    cells: [...cells.values()],
    ovality,
    maxWear,
    maxOvality,
    unwornBand: unwornMax === null ? { status: "not_measured", maxAbsWearMm: null } : { status: unwornSuspect ? "suspect" : "ok", maxAbsWearMm: unwornMax },
  };
}
