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
  const d = ymd(iso);
  return d ? `${d[2]} ${MONTHS[d[1] - 1]} ${d[0]}` : "–";
}

export function monthYear(iso: string | null | undefined): string {
  if (!iso) return "–";
  const d = ymd(iso);
  return d ? `${MONTHS[d[1] - 1]} ${d[0]}` : "–";
}
