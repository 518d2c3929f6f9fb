import type { WearProfile } from "./types";

/** Reference temperature for geometrical product specification and verification (ISO 1). */
export const REFERENCE_TEMPERATURE_C = 20;

/** Temperatures outside this range are taken as typing errors, not engine-room conditions. */
const PLAUSIBLE_TEMPERATURE_C = { min: -30, max: 150 } as const;

export type TemperatureCorrection =
  | { applied: true; factor: number }
  | { applied: false; factor: 1; reason: "disabled" | "missing_temperature" | "implausible_temperature" | "invalid_coefficient" };

/**
 * The diameter the liner would have at 20 °C, from a reading R taken with a gauge at Tg on a
 * liner at Tl: D20 = R·(1 + αg·(Tg − 20)) / (1 + αl·(Tl − 20)). The gauge's own expansion
 * makes it read small, the liner's makes the bore large; both are referred to 20 °C (ISO 1).
 * Derived from linear thermal expansion of gauge and liner.
 */
export function correctTo20C(readingMm: number, alphaGaugePerK: number, gaugeTempC: number, alphaLinerPerK: number, linerTempC: number): number {
  return (
    (readingMm * (1 + alphaGaugePerK * (gaugeTempC - REFERENCE_TEMPERATURE_C))) /
    (1 + alphaLinerPerK * (linerTempC - REFERENCE_TEMPERATURE_C))
  );
}

const plausible = (t: number) => Number.isFinite(t) && t >= PLAUSIBLE_TEMPERATURE_C.min && t <= PLAUSIBLE_TEMPERATURE_C.max;
// Engineering metals expand by about 1e-5 per kelvin; anything near 1e-3 is a units slip.
const alphaOk = (a: number) => Number.isFinite(a) && a >= 0 && a < 1e-4;

/**
 * The multiplier that refers this inspection's readings to 20 °C, or a reason it is not applied
 * (correction switched off in the profile, a temperature not recorded or implausible, or an
 * expansion coefficient out of range).
 * An uncorrected reading is still usable, so this never fails; the reason becomes an issue.
 */
export function temperatureCorrection(
  profile: Pick<WearProfile, "temperatureCorrection" | "alphaGaugePerK" | "alphaLinerPerK">,
  gaugeTempC: number | null,
  linerTempC: number | null,
): TemperatureCorrection {
  if (!profile.temperatureCorrection) return { applied: false, factor: 1, reason: "disabled" };
  if (gaugeTempC == null || linerTempC == null) return { applied: false, factor: 1, reason: "missing_temperature" };
  if (!plausible(gaugeTempC) || !plausible(linerTempC)) return { applied: false, factor: 1, reason: "implausible_temperature" };
  if (!alphaOk(profile.alphaGaugePerK) || !alphaOk(profile.alphaLinerPerK)) return { applied: false, factor: 1, reason: "invalid_coefficient" };
  return { applied: true, factor: correctTo20C(1, profile.alphaGaugePerK, gaugeTempC, profile.alphaLinerPerK, linerTempC) };
}
