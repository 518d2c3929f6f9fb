import { mm } from "../format";
import { isUnwornBand } from "./profile";
import type { WearProfile } from "./types";
import { WEAR_RULES } from "./types";

export type NominalCheck = "ok" | "below_nominal" | "far_above_nominal";

/**
 * Where a diameter sits against the nominal bore: a liner does not shrink, so more than
 * 0.2 mm under nominal is a gauge or typing error; more than 2 % of the bore over nominal is far
 * past any wear limit (0.4–0.8 % of the bore) and so a typing error too. Shared by the entry
 * form and the inspection analysis so both judge a reading the same way.
 */
export function checkAgainstNominal(boreMm: number, diameterMm: number): NominalCheck {
  const excess = diameterMm - boreMm;
  if (excess < -WEAR_RULES.belowNominalMarginMm) return "below_nominal";
  if (excess > WEAR_RULES.aboveNominalFractionOfBore * boreMm) return "far_above_nominal";
  return "ok";
}

export type ReadingWarningKind =
  | "not_a_number"
  | "unknown_cell"
  | "below_nominal"
  | "far_above_nominal"
  | "unworn_band_worn"
  | "over_wear_limit"
  | "jump_since_last"
  | "smaller_than_last";

export type ReadingWarning = { kind: ReadingWarningKind; message: string };

export type ReadingCheckInput = {
  stationKey: string;
  axisKey: string;
  /** As typed; null or NaN when the field does not parse. */
  diameterMm: number | null;
  /** The same cell at the previous inspection of this liner, on the same temperature basis. */
  previousDiameterMm?: number | null;
  /** Running hours since that previous inspection, when known. */
  hoursSincePrevious?: number | null;
  /** The same cell as fitted, when the profile measures wear from the as-fitted bore. */
  asFittedMm?: number | null;
};

/**
 * Warnings for one reading while it is typed, in plain English, so a slip of a digit is caught
 * at the piston stand rather than in the office. Compares against the nominal bore and against
 * the same cell last time: a drop beyond 0.05 mm (wear does not go backwards) is worth a second
 * look, and so is a step up of more than 0.15 mm or, when the hours since last time are known,
 * more than the abnormal rate of 0.1 mm/1000 h would wear in them, whichever is larger (a normal
 * 16,000 h overhaul interval at 0.05 mm/1000 h already adds 0.8 mm). Warnings never block entry; the engineer may confirm.
 * Pass diameters on the same temperature basis (both raw or both corrected).
 */
export function checkReading(profile: WearProfile, input: ReadingCheckInput): ReadingWarning[] {
  const { diameterMm: d, previousDiameterMm: prev } = input;
  if (d == null || !Number.isFinite(d) || d <= 0) {
    return [{ kind: "not_a_number", message: "Not a diameter. Enter the reading in millimetres, for example 900.42." }];
  }
  const station = profile.stations.find((s) => s.key === input.stationKey);
  if (!station || !profile.axes.some((a) => a.key === input.axisKey)) {
    return [{ kind: "unknown_cell", message: "This station or direction is not in the engine profile." }];
  }
  const warnings: ReadingWarning[] = [];
  const nominal = checkAgainstNominal(profile.boreMm, d);
  if (nominal === "below_nominal") {
    warnings.push({
      kind: "below_nominal",
      message: `${mm(d)} is ${mm(profile.boreMm - d)} under the ${mm(profile.boreMm)} nominal bore. A liner does not shrink: check the gauge setting and the reading.`,
    });
  } else if (nominal === "far_above_nominal") {
    warnings.push({
      kind: "far_above_nominal",
      message: `${mm(d)} is ${mm(d - profile.boreMm)} over the nominal bore, far more than a liner wears. Check for a typing error.`,
    });
  } else {
    const asFitted = profile.wearReference === "as_fitted" && input.asFittedMm != null && Number.isFinite(input.asFittedMm) ? input.asFittedMm : null;
    const wear = d - (asFitted ?? profile.boreMm);
    if (isUnwornBand(station.role) && Math.abs(wear) > WEAR_RULES.unwornBandToleranceMm) {
      warnings.push({
        kind: "unworn_band_worn",
        message: `This station is in an unworn band, yet it reads ${mm(wear)} from the reference bore. Check the gauge against its setting, and the nominal bore in the profile.`,
      });
    }
    if (wear >= profile.linerWearLimitMm) {
      warnings.push({
        kind: "over_wear_limit",
        message: `Wear here would be ${mm(wear)}, at or over the ${mm(profile.linerWearLimitMm)} limit. Check the reading; if it is right, the liner is over its limit.`,
      });
    }
  }
  if (prev != null && Number.isFinite(prev)) {
    const change = d - prev;
    const hours = input.hoursSincePrevious != null && Number.isFinite(input.hoursSincePrevious) ? Math.max(0, input.hoursSincePrevious) : 0;
    const jump = Math.max(WEAR_RULES.jumpSinceLastMm, (WEAR_RULES.abnormalRateMmPer1000h * hours) / 1000);
    if (change > jump) {
      warnings.push({
        kind: "jump_since_last",
        message: `${mm(change)} larger than last time at this point, more than wear makes in that time even at an abnormal rate. Check the reading.`,
      });
    } else if (change < -WEAR_RULES.decreaseSinceLastMm) {
      warnings.push({
        kind: "smaller_than_last",
        message: `${mm(-change)} smaller than last time at this point. Wear does not go backwards: check the reading, the gauge and the temperatures.`,
      });
    }
  }
  return warnings;
}
