import { mm } from "../format";
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

type ProfileLookups = {
  /** Station key → its index in `profile.stations`. */
  stationIndex: Map<string, number>;
  /** Direction key → 0 or 1, its index in `profile.axes`. */
  axisIndex: Map<string, number>;
};
const lookups = new WeakMap<WearProfile, ProfileLookups>();

/** Station and direction look-ups, built once per profile object rather than per inspection. */
function lookupsOf(profile: WearProfile): ProfileLookups {
  let l = lookups.get(profile);
  if (!l) {
    l = {
      stationIndex: new Map(profile.stations.map((s, i) => [s.key, i])),
      axisIndex: new Map(profile.axes.map((a, i) => [a.key, i])),
    };
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
  const profileProblems = checkProfile(profile);
  if (profileProblems.length > 0) {
    for (const message of profileProblems) issues.push({ kind: "invalid_profile", message });
    return {
      inspectionId: inspection.id,
      correction,
      cells: [],
      ovality: [],
      maxWear: null,
      maxOvality: null,
      unwornBand: { status: "not_measured", maxAbsWearMm: null },
      issues,
    };
  }
  if (!correction.applied && CORRECTION_REASON[correction.reason]) {
    issues.push({ kind: "temperature_not_applied", message: CORRECTION_REASON[correction.reason]! });
  }

  // Cells are addressed by station index × 2 + direction index: a fleet recompute runs
  // this for every reading, and string-keyed maps were most of its cost.
  const { stationIndex, axisIndex } = lookupsOf(profile);
  const stationList = profile.stations;
  const nCells = stationList.length * 2;
  const useAsFitted = profile.wearReference === "as_fitted";
  const asFitted: (number | undefined)[] = new Array(nCells);
  let asFittedCount = 0;
  if (useAsFitted && asFittedReadings) {
    for (const r of asFittedReadings) {
      const si = stationIndex.get(r.stationKey);
      const ai = axisIndex.get(r.axisKey);
      if (si === undefined || ai === undefined || !Number.isFinite(r.diameterMm) || r.diameterMm <= 0) continue;
      const k = si * 2 + ai;
      if (asFitted[k] === undefined) asFittedCount++;
      asFitted[k] = r.diameterMm;
    }
  }
  if (useAsFitted && asFittedCount === 0) {
    issues.push({ kind: "no_as_fitted_reading", message: "No as-fitted readings for this liner: wear is measured from the nominal bore." });
  }

  const byCell: (CellResult | undefined)[] = new Array(nCells);
  const cells: CellResult[] = [];
  const factor = correction.factor;
  const boreMm = profile.boreMm;
  for (const r of inspection.readings) {
    const si = stationIndex.get(r.stationKey);
    const ai = axisIndex.get(r.axisKey);
    if (si === undefined || ai === undefined) {
      issues.push({ kind: "unknown_cell", message: "A reading names a station or direction that is not in the profile.", stationKey: r.stationKey, axisKey: r.axisKey });
      continue;
    }
    const station = stationList[si];
    const k = si * 2 + ai;
    if (byCell[k] !== undefined) {
      issues.push({ kind: "duplicate_reading", message: `Two readings for ${station.label}; the first is used.`, stationKey: r.stationKey, axisKey: r.axisKey });
      continue;
    }
    if (!Number.isFinite(r.diameterMm) || r.diameterMm <= 0) {
      issues.push({ kind: "invalid_value", message: `The reading at ${station.label} is not a valid diameter.`, stationKey: r.stationKey, axisKey: r.axisKey });
      continue;
    }
    const correctedMm = r.diameterMm * factor;
    const fitted = useAsFitted ? asFitted[k] : undefined;
    if (useAsFitted && asFittedCount > 0 && fitted === undefined) {
      issues.push({
        kind: "no_as_fitted_reading",
        message: `No as-fitted reading at ${station.label}: wear there is measured from the nominal bore.`,
        stationKey: r.stationKey,
        axisKey: r.axisKey,
      });
    }
    const wearMm = correctedMm - (fitted ?? boreMm);
    const nominal = checkAgainstNominal(boreMm, correctedMm);
    if (nominal === "below_nominal") {
      issues.push({
        kind: "below_nominal",
        message: `${station.label}: ${mm(correctedMm)} is more than ${mm(WEAR_RULES.belowNominalMarginMm)} under the nominal bore; left out of the maxima.`,
        stationKey: r.stationKey,
        axisKey: r.axisKey,
      });
    } else if (nominal === "far_above_nominal") {
      issues.push({
        kind: "far_above_nominal",
        message: `${station.label}: ${mm(correctedMm)} is far over the nominal bore, likely a typing error; left out of the maxima.`,
        stationKey: r.stationKey,
        axisKey: r.axisKey,
      });
    }
    const cell: CellResult = { stationKey: r.stationKey, axisKey: r.axisKey, rawMm: r.diameterMm, correctedMm, wearMm, usable: nominal === "ok" };
    byCell[k] = cell;
    cells.push(cell);
  }

  const ovality: StationOvality[] = [];
  let maxWear: MaxWear | null = null;
  let maxOvality: MaxOvality | null = null;
  let unwornMax: number | null = null;
  let unwornSuspect = false;
  for (let si = 0; si < stationList.length; si++) {
    const station = stationList[si];
    const unworn = isUnwornBand(station.role);
    let a: CellResult | undefined;
    let b: CellResult | undefined;
    for (let ai = 0; ai < 2; ai++) {
      const found = byCell[si * 2 + ai];
      if (!found) {
        const axis = profile.axes[ai];
        issues.push({ kind: "missing_reading", message: `No ${axis.label.toLowerCase()} reading at ${station.label}.`, stationKey: station.key, axisKey: axis.key });
      }
      const cell = found?.usable ? found : undefined;
      if (ai === 0) a = cell;
      else b = cell;
      if (!cell) continue;
      if (!maxWear || cell.wearMm > maxWear.wearMm) {
        maxWear = { wearMm: cell.wearMm, stationKey: station.key, axisKey: cell.axisKey, depthMm: station.depthMm };
      }
      if (unworn) {
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
    const ovalityMm = a && b ? Math.abs(a.correctedMm - b.correctedMm) : null;
    ovality.push({ stationKey: station.key, depthMm: station.depthMm, ovalityMm });
    if (ovalityMm !== null && (!maxOvality || ovalityMm > maxOvality.ovalityMm)) {
      maxOvality = { ovalityMm, stationKey: station.key, depthMm: station.depthMm };
    }
  }

  return {
    inspectionId: inspection.id,
    correction,
    cells,
    ovality,
    maxWear,
    maxOvality,
    unwornBand: unwornMax === null ? { status: "not_measured", maxAbsWearMm: null } : { status: unwornSuspect ? "suspect" : "ok", maxAbsWearMm: unwornMax },
    issues,
  };
}
