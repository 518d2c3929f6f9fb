import { temperatureCorrection } from "./correction";
import type { Inspection, LinerReading, WearProfile } from "./types";

/*
 * The one rule for a liner's as-fitted bore, where the profile measures wear from it: the
 * liner's earliest approved gauging (earliest date, then fewest liner hours, then the lowest
 * id), its readings referred to 20 °C like every other reading. The gauging being analysed
 * takes part: when it is itself the earliest (a liner gauged as fitted), it is its own
 * reference and reads zero wear, as it will once approved.
 */

type Ordered = Pick<Inspection, "id" | "date" | "linerHours">;

/** True when gauging `a` comes before `b` in the as-fitted order. */
export function gaugedBefore(a: Ordered, b: Ordered): boolean {
  if (a.date !== b.date) return a.date < b.date;
  if (a.linerHours !== b.linerHours) return a.linerHours < b.linerHours;
  return compareIds(a.id, b.id) < 0;
}

function compareIds(a: string, b: string): number {
  const na = Number(a);
  const nb = Number(b);
  return Number.isFinite(na) && Number.isFinite(nb) ? na - nb : a < b ? -1 : a > b ? 1 : 0;
}

/** The as-fitted gauging among a liner's gaugings (approved ones, and the one being analysed), or null. */
export function asFittedGauging<T extends Ordered>(gaugings: readonly (T | null | undefined)[]): T | null {
  let first: T | null = null;
  for (const g of gaugings) if (g && (first === null || gaugedBefore(g, first))) first = g;
  return first;
}

/**
 * The as-fitted gauging's readings referred to 20 °C with its own temperatures, so wear is the
 * difference of two corrected diameters. Where the correction cannot be applied (switched off,
 * a temperature missing), the readings are used as read, as that gauging's own analysis does.
 */
export function correctedAsFittedReadings(
  profile: Pick<WearProfile, "temperatureCorrection" | "alphaGaugePerK" | "alphaLinerPerK">,
  gauging: Pick<Inspection, "gaugeTempC" | "linerTempC" | "readings">,
): LinerReading[] {
  const { factor } = temperatureCorrection(profile, gauging.gaugeTempC, gauging.linerTempC);
  return gauging.readings.map((r) => ({ stationKey: r.stationKey, axisKey: r.axisKey, diameterMm: r.diameterMm * factor }));
}
