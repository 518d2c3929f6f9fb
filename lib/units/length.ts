/** Exactly 25.4 mm to the inch, by the international yard and pound agreement of 1959. */
export const MM_PER_INCH = 25.4;

export type LengthUnit = "mm" | "in";

/** Decimals shown by default: 0.01 mm is the gauge resolution, and 0.0005 in is about the same step. */
export const DEFAULT_DECIMALS: Record<LengthUnit, number> = { mm: 2, in: 4 };

/**
 * Millimetres to inches. Readings are stored in SI millimetres and inches are only a display
 * and import choice, so a non-finite input gives null rather than letting NaN into a record.
 */
export function mmToInch(mm: number): number | null {
  return Number.isFinite(mm) ? mm / MM_PER_INCH : null;
}

/** Inches to millimetres, for gauge files and hand entry in inches; null for a non-finite input. */
export function inchToMm(inch: number): number | null {
  return Number.isFinite(inch) ? inch * MM_PER_INCH : null;
}

/**
 * A number with a fixed count of decimals, for tabular figures aligned on the decimal point.
 * A missing or non-finite value prints as an em dash so a table never shows "NaN"; a value that
 * rounds to zero prints without a minus sign, because "-0.00 mm" of wear reads as a defect.
 */
export function formatFixed(value: number | null | undefined, decimals: number): string {
  if (value == null || !Number.isFinite(value)) return "—";
  const places = Math.min(Math.max(Math.trunc(decimals), 0), 10);
  const text = value.toFixed(places);
  return /^-0(\.0*)?$/.test(text) ? text.slice(1) : text;
}

/** Millimetres with the unit, to 0.01 mm by default: the form used in warnings and reasons. */
export function formatMm(mm: number | null | undefined, decimals = DEFAULT_DECIMALS.mm): string {
  return formatLength(mm, "mm", decimals);
}

/**
 * A length held in millimetres, printed in the chosen unit with the unit beside it
 * ("0.42 mm", "0.0165 in"), because a bare number on a wear sheet is ambiguous.
 */
export function formatLength(mm: number | null | undefined, unit: LengthUnit = "mm", decimals = DEFAULT_DECIMALS[unit]): string {
  const value = mm == null ? null : unit === "mm" ? mm : mmToInch(mm);
  const text = formatFixed(value, decimals);
  return text === "—" ? text : `${text} ${unit}`;
}
