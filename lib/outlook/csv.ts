/*
 * CSV for spreadsheets: RFC 4180 quoting, CRLF line ends, a UTF-8 byte-order mark so
 * spreadsheet programs read accented names right, and formula-safe cells: a cell beginning
 * with = + - @, a tab or a carriage return is prefixed with an apostrophe, so no spreadsheet
 * runs it as a formula (the OWASP "CSV Injection" guidance). Numbers are written as numbers.
 */

const FORMULA_START = /^[=+\-@\t\r]/;

/** One cell: numbers as they are, text made formula-safe and quoted when it needs to be. */
export function csvCell(value: string | number | null | undefined): string {
  if (value === null || value === undefined) return "";
  if (typeof value === "number") return Number.isFinite(value) ? String(value) : "";
  const safe = FORMULA_START.test(value) ? `'${value}` : value;
  return /[",\r\n]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}

/** A whole file: the header row, then one line per row, CRLF-separated, with a UTF-8 BOM. */
export function toCsv(header: readonly string[], rows: readonly (readonly (string | number | null | undefined)[])[]): string {
  const lines = [header, ...rows].map((r) => r.map(csvCell).join(","));
  return `\uFEFF${lines.join("\r\n")}\r\n`;
}
