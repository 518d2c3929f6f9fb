import { format, parseISO } from "date-fns";

/** Fixed-decimal figure, or an en dash when there is no value. */
export function fixed(value: number | null | undefined, decimals = 2): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return "–";
  return value.toFixed(decimals);
}

/**
 * An uncertainty beside a figure: at least `decimals` places, more when the value is so small
 * that they would print it as zero (0.00078 rather than 0.000), so a tight fit never reads as
 * no uncertainty at all.
 */
export function spread(value: number | null | undefined, decimals = 3): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return "–";
  const a = Math.abs(value);
  if (a === 0 || a >= 10 ** -decimals) return value.toFixed(decimals);
  return value.toFixed(Math.min(10, Math.ceil(-Math.log10(a)) + 1));
}

/** Whole running hours with thin-space grouping, e.g. 41 250. */
export function hours(value: number | null | undefined): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return "–";
  return Math.round(value).toLocaleString("en-GB").replace(/,/g, "\u2009");
}

/** A calendar day as "4 Mar 2027". */
export function day(iso: string | null | undefined): string {
  if (!iso) return "–";
  const d = parseISO(iso.slice(0, 10));
  return Number.isNaN(d.getTime()) ? "–" : format(d, "d MMM yyyy");
}

export function monthYear(iso: string | null | undefined): string {
  if (!iso) return "–";
  const d = parseISO(iso.slice(0, 10));
  return Number.isNaN(d.getTime()) ? "–" : format(d, "MMM yyyy");
}
