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

/**
 * Bounds past which a value cannot be physically true, so it is an error that no one can
 * confirm (common practice, chosen with margin): a liner bore does not shrink by half a
 * millimetre, nor wear to twice its renewal limit (0.4–0.8 % of the bore, BrightHub
 * Engineering) while still running; a ring gap or groove clearance five times its limit means
 * a broken ring or a typing error, not a reading.
 */
export const HARD_LIMITS = {
  /** Lowest possible diameter: the nominal bore less this. */
  belowNominalMm: 0.5,
  /** Highest possible diameter: the nominal bore plus this many times the wear limit. */
  wearLimitMultiple: 2,
  /** Highest possible ring gap or groove clearance: this many times its limit. */
  ringLimitMultiple: 5,
} as const;

export type CheckLevel = "error" | "warning";

export type FindingCode =
  | "not_a_number"
  | "unknown_cell"
  | "decimal_slip"
  | "wrong_unit"
  | "impossible_diameter"
  | "impossible_ring_value"
  | "below_nominal"
  | "unworn_band_worn"
  | "over_wear_limit"
  | "jump_since_last"
  | "smaller_than_last"
  | "same_value_everywhere"
  | "directions_swapped"
  | "rod_nut_pressure_off";

/**
 * One check's verdict. An `error` is a value that cannot be physically true: it cannot be
 * confirmed and the server refuses to submit or approve a record holding it. A `warning` is
 * unusual but possible: the engineer may confirm it, and the chief sees the confirmation.
 */
export type Finding = { level: CheckLevel; code: FindingCode; message: string };

/** The lowest and highest diameter a liner of this profile can read, in mm at 20 °C. */
export function linerDiameterBounds(profile: Pick<WearProfile, "boreMm" | "linerWearLimitMm">): { minMm: number; maxMm: number } {
  return { minMm: profile.boreMm - HARD_LIMITS.belowNominalMm, maxMm: profile.boreMm + HARD_LIMITS.wearLimitMultiple * profile.linerWearLimitMm };
}

export type LinerDiameterContext = {
  profile: WearProfile;
  stationKey: string;
  axisKey: string;
  /** What the engineer typed, with its unit ("599.70 mm", "23.6100 in"), quoted in the messages. */
  typed?: string;
  /** The multiplier referring the reading to 20 °C (1 when no correction applies). */
  correctionFactor?: number;
  /** The same cell at the previous inspection of this liner, at 20 °C. */
  previousMm?: number | null;
  /** Running hours since that previous inspection, when known. */
  hoursSincePrevious?: number | null;
  /** The same cell as fitted, when the profile measures wear from the as-fitted bore. */
  asFittedMm?: number | null;
};

const near = (ratio: number, target: number) => Math.abs(Math.log(ratio / target)) < Math.log(1.02);

/**
 * The checks on one liner diameter, as read (in mm, before temperature correction), while it
 * is typed and again on the server. Errors: not a number, a station the profile lacks, a
 * diameter outside nominal − 0.5 mm … nominal + 2 × the wear limit (with the likely cause
 * named when it looks like a slipped decimal point or digit, or a value typed in the other
 * unit). Warnings, against the value at 20 °C: under nominal, a worn unworn band, wear at or
 * over the limit, and against the same cell last time a drop beyond 0.05 mm (wear does not go
 * backwards) or a step up of more than 0.15 mm or, when the hours since are known, more than
 * the abnormal rate of 0.1 mm/1000 h would wear in them, whichever is larger (a normal 16,000 h
 * overhaul interval at 0.05 mm/1000 h already adds 0.8 mm). Messages quote what was typed and,
 * when it differs, the value at 20 °C.
 */
export function checkLinerDiameter(valueMm: number | null, context: LinerDiameterContext): Finding[] {
  const { profile } = context;
  if (valueMm == null || !Number.isFinite(valueMm) || valueMm <= 0) {
    return [{ level: "error", code: "not_a_number", message: "Not a diameter. Enter the reading in millimetres, for example 900.42." }];
  }
  const station = profile.stations.find((s) => s.key === context.stationKey);
  if (!station || !profile.axes.some((a) => a.key === context.axisKey)) {
    return [{ level: "error", code: "unknown_cell", message: "This station or direction is not in the engine profile." }];
  }
  const factor = context.correctionFactor ?? 1;
  const d = valueMm * factor;
  const typed = context.typed ?? mm(valueMm);
  const corrected = Math.abs(d - valueMm) >= 0.0005 ? `${typed} (${mm(d)} at 20 °C)` : typed;
  const { minMm, maxMm } = linerDiameterBounds(profile);
  if (d < minMm || d > maxMm) {
    const bounds = `between ${mm(minMm)} and ${mm(maxMm)}`;
    const ratio = d / profile.boreMm;
    if (near(ratio, 1 / MM_PER_INCH_RATIO) || near(ratio, MM_PER_INCH_RATIO)) {
      return [
        {
          level: "error",
          code: "wrong_unit",
          message: `${corrected} cannot be a diameter of this ${mm(profile.boreMm)} bore, but it would be in the other unit (25.4 mm to the inch). Check the mm/inch switch and retype it.`,
        },
      ];
    }
    const decade = Math.round(Math.log10(ratio));
    if (decade !== 0 && Math.abs(Math.log10(ratio) - decade) < 0.05) {
      return [
        {
          level: "error",
          code: "decimal_slip",
          message: `${corrected} is about ${decade > 0 ? `${10 ** decade} times` : `a ${10 ** -decade === 10 ? "tenth" : `${10 ** -decade}th`} of`} the ${mm(profile.boreMm)} bore: a digit or the decimal point has slipped. Retype it; a liner reads ${bounds}.`,
        },
      ];
    }
    return [
      {
        level: "error",
        code: "impossible_diameter",
        message: `${corrected} cannot be right: a liner of this ${mm(profile.boreMm)} bore reads ${bounds} (no more than 0.5 mm under nominal, no more than twice the ${mm(profile.linerWearLimitMm)} wear limit over it). Retype it.`,
      },
    ];
  }
  const out: Finding[] = [];
  if (d - profile.boreMm < -WEAR_RULES.belowNominalMarginMm) {
    out.push({
      level: "warning",
      code: "below_nominal",
      message: `${corrected} is ${mm(profile.boreMm - d)} under the ${mm(profile.boreMm)} nominal bore. A liner does not shrink: check the gauge setting and the reading.`,
    });
  } else {
    const asFitted = profile.wearReference === "as_fitted" && context.asFittedMm != null && Number.isFinite(context.asFittedMm) ? context.asFittedMm : null;
    const wear = d - (asFitted ?? profile.boreMm);
    if (isUnwornBand(station.role) && Math.abs(wear) > WEAR_RULES.unwornBandToleranceMm) {
      out.push({
        level: "warning",
        code: "unworn_band_worn",
        message: `This station is in an unworn band, yet ${corrected} is ${mm(wear)} from the reference bore. Check the gauge against its setting, and the nominal bore in the profile.`,
      });
    }
    if (wear >= profile.linerWearLimitMm) {
      out.push({
        level: "warning",
        code: "over_wear_limit",
        message: `${corrected} means wear of ${mm(wear)}, at or over the ${mm(profile.linerWearLimitMm)} limit. Check the reading; if it is right, the liner is over its limit.`,
      });
    }
  }
  const prev = context.previousMm;
  if (prev != null && Number.isFinite(prev)) {
    const change = d - prev;
    const hours = context.hoursSincePrevious != null && Number.isFinite(context.hoursSincePrevious) ? Math.max(0, context.hoursSincePrevious) : 0;
    const jump = Math.max(WEAR_RULES.jumpSinceLastMm, (WEAR_RULES.abnormalRateMmPer1000h * hours) / 1000);
    if (change > jump) {
      out.push({
        level: "warning",
        code: "jump_since_last",
        message: `${corrected} is ${mm(change)} larger than last time's ${mm(prev)} at this point, more than wear makes in that time even at an abnormal rate. Check the reading.`,
      });
    } else if (change < -WEAR_RULES.decreaseSinceLastMm) {
      out.push({
        level: "warning",
        code: "smaller_than_last",
        message: `${corrected} is ${mm(-change)} smaller than last time's ${mm(prev)} at this point. Wear does not go backwards: check the reading, the gauge and the temperatures.`,
      });
    }
  }
  return out;
}

const MM_PER_INCH_RATIO = 25.4;

export type RingValueContext = {
  /** "closed gap" or "groove clearance", as the message names it. */
  what: string;
  /** The ring's limit for this value, in mm. */
  limitMm: number;
  /** What was typed, with its unit. */
  typed?: string;
};

/**
 * A ring's closed gap or groove clearance against what is physically possible: 0 up to five
 * times its limit. Beyond that it is an error, never a confirmable warning.
 */
export function checkRingValue(valueMm: number | null, context: RingValueContext): Finding[] {
  if (valueMm == null) return [];
  const typed = context.typed ?? mm(valueMm);
  const max = HARD_LIMITS.ringLimitMultiple * context.limitMm;
  if (!Number.isFinite(valueMm) || valueMm < 0 || (context.limitMm > 0 && valueMm > max)) {
    return [
      {
        level: "error",
        code: "impossible_ring_value",
        message: `A ${context.what} of ${typed} cannot be right: it lies between 0 and ${mm(max)} (five times the ${mm(context.limitMm)} limit). Check for a slipped decimal point and retype it.`,
      },
    ];
  }
  return [];
}

/** A reading on the same basis as the others it is compared with (mm at 20 °C). */
export type GaugedCell = { stationKey: string; axisKey: string; diameterMm: number };

/** Fewest cells for "every cell holds the same value" to mean anything. */
const SAME_VALUE_MIN_CELLS = 4;
/** Fewest stations read in both directions, now and last time, to judge swapped directions. */
const SWAP_MIN_STATIONS = 3;
/** Swapped directions must fit at least this many times better (in squared difference). */
const SWAP_BETTER_FACTOR = 4;
/** ... and the straight fit must be off by more than gauge scatter (rms, mm; common practice). */
const SWAP_MIN_MISFIT_MM = 0.05;

/**
 * Checks of a whole gauging rather than one cell. "Every cell holds the same value" (a paste or a
 * stuck gauge) once, instead of one warning per cell; and "the directions look swapped" when the
 * difference between the two directions at each station (the ovality, which the wear since last
 * time barely changes) matches last time's far better with its sign reversed. Both are warnings:
 * a new liner can read its nominal bore everywhere, and a liner can change its shape.
 */
export function checkGauging(profile: Pick<WearProfile, "axes" | "stations">, cells: readonly GaugedCell[], previous: readonly GaugedCell[] | null): Finding[] {
  const out: Finding[] = [];
  const values = cells.map((c) => Math.round(c.diameterMm * 1000));
  if (cells.length >= SAME_VALUE_MIN_CELLS && values.every((v) => v === values[0])) {
    out.push({
      level: "warning",
      code: "same_value_everywhere",
      message: `Every cell holds the same value, ${mm(cells[0].diameterMm)}. A pasted value or a stuck gauge? Check the readings; confirm only if the liner truly reads the same everywhere.`,
    });
  }
  const swap = swappedDirections(profile, cells, previous);
  if (swap) {
    const [a, b] = profile.axes;
    out.push({
      level: "warning",
      code: "directions_swapped",
      message: `These readings fit the previous gauging far better with ${a.label.toLowerCase()} and ${b.label.toLowerCase()} exchanged (difference ${mm(swap.swappedRmsMm)} instead of ${mm(swap.straightRmsMm)} on average at ${swap.stations} stations). Were the two directions entered the other way round?`,
    });
  }
  return out;
}

/** How well a gauging's direction differences match last time's, straight and exchanged; null unless exchanged fits far better. */
export function swappedDirections(
  profile: Pick<WearProfile, "axes" | "stations">,
  cells: readonly GaugedCell[],
  previous: readonly GaugedCell[] | null,
): { straightRmsMm: number; swappedRmsMm: number; stations: number } | null {
  if (!previous?.length) return null;
  const [a, b] = profile.axes;
  const at = (list: readonly GaugedCell[]) => new Map(list.map((c) => [`${c.stationKey}|${c.axisKey}`, c.diameterMm]));
  const now = at(cells);
  const then = at(previous);
  let straight = 0;
  let swapped = 0;
  let n = 0;
  for (const s of profile.stations) {
    const na = now.get(`${s.key}|${a.key}`);
    const nb = now.get(`${s.key}|${b.key}`);
    const pa = then.get(`${s.key}|${a.key}`);
    const pb = then.get(`${s.key}|${b.key}`);
    if (na === undefined || nb === undefined || pa === undefined || pb === undefined) continue;
    const oNow = na - nb;
    const oThen = pa - pb;
    straight += (oNow - oThen) ** 2;
    swapped += (oNow + oThen) ** 2;
    n += 1;
  }
  if (n < SWAP_MIN_STATIONS) return null;
  const straightRmsMm = Math.sqrt(straight / n);
  const swappedRmsMm = Math.sqrt(swapped / n);
  if (straightRmsMm <= SWAP_MIN_MISFIT_MM || swapped * SWAP_BETTER_FACTOR >= straight) return null;
  return { straightRmsMm, swappedRmsMm, stations: n };
}
