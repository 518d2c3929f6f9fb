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

// Printing lives in lib/format.ts, the one formatting module; these names stay for existing callers.
export { fixed as formatFixed, length as formatLength, mm as formatMm } from "../format";
