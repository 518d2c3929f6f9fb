/*
 * Writing CSV that a spreadsheet cannot turn into a formula. A text cell beginning with =, +,
 * -, @, a tab or a carriage return is what spreadsheet programs evaluate (the OWASP "CSV
 * injection" guidance lists these characters); such a cell is written with a leading
 * apostrophe, so it stays the text it was. Numbers are written as numbers. Pure.
 */

const FORMULA_START = /^[=+\-@\t\r]/;

/** One cell, quoted when it holds the delimiter, a quote or a line end; formula starts neutralised. */
export function csvCell(value: string | number | null | undefined, delimiter = ","): string {
  if (value === null || value === undefined) return "";
  if (typeof value === "number") return Number.isFinite(value) ? String(value) : "";
  const safe = FORMULA_START.test(value) ? `'${value}` : value;
  return safe.includes(delimiter) || /["\r\n]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}

/** Rows to CSV text with CRLF line ends (what spreadsheet programs expect). */
export function toCsv(rows: readonly (readonly (string | number | null | undefined)[])[], delimiter = ","): string {
  return rows.map((r) => r.map((c) => csvCell(c, delimiter)).join(delimiter)).join("\r\n") + "\r\n";
}
