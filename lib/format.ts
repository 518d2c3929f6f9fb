import { DEFAULT_DECIMALS, MM_PER_INCH, type LengthUnit } from "./units/length";

// Dates are formatted here by hand (a fixed English month list): date-fns would ride in the
// first load of every screen that shows a day.
const MONTHS = ["Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec"];

/** "2027-03-04…" → [2027, 3, 4], or null when it is no calendar day. */
function ymd(iso: string): [number, number, number] | null {
  const m = /^(\d{4})-(\d{2})-(\d{2})/.exec(iso);
  if (!m) return null;
  const [y, mo, d] = [Number(m[1]), Number(m[2]), Number(m[3])];
  const t = new Date(Date.UTC(y, mo - 1, d));
  return t.getUTCFullYear() === y && t.getUTCMonth() === mo - 1 && t.getUTCDate() === d ? [y, mo, d] : null;
}

/*
 * The one formatting module: every figure a screen, a warning or a reason prints is rounded
 * here, once, from the unrounded value, so the same number reads the same everywhere.
 * One style: thousands grouped with a comma (92,123), the unit after a space ("92,123 h",
 * "0.42 mm"), an en dash for no value, and never a minus sign on a figure that rounds to zero.
 * Pure (no server or browser imports), so lib/wear and lib/rings use it too.
 */

/** Printed where there is no value. */
export const NO_VALUE = "–";

const valid = (v: number | null | undefined): v is number => v !== null && v !== undefined && Number.isFinite(v);

/** "-0.00" reads as a defect; a figure that rounds to zero prints without the sign. */
function unsignedZero(text: string): string {
  return /^-0(\.0*)?$/.test(text) ? text.slice(1) : text;
}

/** Groups the integer part in threes with commas: 150612.4 → "150,612.4". */
function group(text: string): string {
  const [int, frac] = text.split(".");
  const grouped = int.replace(/\B(?=(\d{3})+(?!\d))/g, ",");
  return frac === undefined ? grouped : `${grouped}.${frac}`;
}

/** A figure with a fixed count of decimals (2 by default), for tables aligned on the decimal point. */
export function fixed(value: number | null | undefined, decimals = 2): string {
  if (!valid(value)) return NO_VALUE;
  const places = Math.min(Math.max(Math.trunc(decimals), 0), 10);
  return unsignedZero(value.toFixed(places));
}

/** A figure with thousands grouped and a fixed count of decimals (none by default): 150,612. */
export function grouped(value: number | null | undefined, decimals = 0): string {
  const text = fixed(value, decimals);
  return text === NO_VALUE ? text : group(text);
}

/** Running hours as a bare figure, rounded to the hour: "92,123". */
export function hours(value: number | null | undefined): string {
  return grouped(value, 0);
}

/** Running hours with the unit: "92,123 h". The unit is always "h"; the label or sentence says whose hours. */
export function hoursText(value: number | null | undefined): string {
  const text = hours(value);
  return text === NO_VALUE ? text : `${text} h`;
}

/** A length held in millimetres, in the chosen unit with the unit beside it ("0.42 mm", "0.0165 in"). */
export function length(mm: number | null | undefined, unit: LengthUnit = "mm", decimals = DEFAULT_DECIMALS[unit]): string {
  const value = !valid(mm) ? null : unit === "mm" ? mm : mm / MM_PER_INCH;
  const text = grouped(value, decimals);
  return text === NO_VALUE ? text : `${text} ${unit}`;
}

/** Millimetres with the unit, to 0.01 mm by default. */
export function mm(value: number | null | undefined, decimals?: number): string {
  return length(value, "mm", decimals ?? DEFAULT_DECIMALS.mm);
}

/**
 * An uncertainty beside a figure: at least `decimals` places, more when the value is so small
 * that they would print it as zero (0.00078 rather than 0.000), so a tight fit never reads as
 * no uncertainty at all.
 */
export function spread(value: number | null | undefined, decimals = 3): string {
  if (!valid(value)) return NO_VALUE;
  const a = Math.abs(value);
  if (a === 0 || a >= 10 ** -decimals) return fixed(value, decimals);
  return fixed(value, Math.min(10, Math.ceil(-Math.log10(a)) + 1));
}

/**
 * A wear rate below this (mm per 1000 h) is "about level": under 0.01 mm, the gauge's
 * resolution, in 10,000 running hours. Common practice; no published source sets it.
 */
export const LEVEL_RATE_MM_PER_1000H = 0.001;

/**
 * A wear rate figure in mm per 1000 h: three decimals, or two significant digits when three
 * decimals would print a non-zero rate as 0.000 (0.00042).
 */
export function rate(value: number | null | undefined): string {
  if (!valid(value)) return NO_VALUE;
  const a = Math.abs(value);
  if (a === 0 || a >= 0.0005) return fixed(value, 3);
  return fixed(value, Math.min(10, Math.ceil(-Math.log10(a)) + 1));
}

/** A wear rate with its unit: "0.035 mm/1000 h". */
export function rateText(value: number | null | undefined): string {
  const text = rate(value);
  return text === NO_VALUE ? text : `${text} mm/1000 h`;
}

/** A trend in words: "rising 0.035 mm/1000 h", "falling …", or "about level (0.00042 mm/1000 h)". */
export function trendWords(value: number): string {
  if (!Number.isFinite(value)) return "trend unknown";
  if (Math.abs(value) < LEVEL_RATE_MM_PER_1000H) return `about level (${rateText(value)})`;
  return `${value > 0 ? "rising" : "falling"} ${rateText(Math.abs(value))}`;
}

/** A calendar day as "4 Mar 2027". */
export function day(iso: string | null | undefined): string {
  if (!iso) return NO_VALUE;
  const d = ymd(iso);
  return d ? `${d[2]} ${MONTHS[d[1] - 1]} ${d[0]}` : NO_VALUE;
}

/** A month as "Mar 2027". */
export function monthYear(iso: string | null | undefined): string {
  if (!iso) return NO_VALUE;
  const d = ymd(iso);
  return d ? `${MONTHS[d[1] - 1]} ${d[0]}` : NO_VALUE;
}
