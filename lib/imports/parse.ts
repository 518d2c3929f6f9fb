import Papa from "papaparse";
import { parseNumberInput } from "@/lib/units/parse-number";
import { guessMapping, headerUnit, type ColumnMapping } from "./layout";

/*
 * Reading a CSV the way ships keep them: a byte-order mark, CRLF line ends, quoted fields with
 * the delimiter inside, blank lines, comment lines (starting with #), columns in any order and
 * columns we do not use. The delimiter, decimal mark, header row and length unit are detected
 * and can be overridden. Every row keeps its line number in the file, so an error names the
 * line the engineer sees in a text editor. Pure: the browser's worker and the server share it.
 */

export const DELIMITERS = [",", ";", "\t"] as const;
export type Delimiter = (typeof DELIMITERS)[number];
export type DecimalMark = "." | ",";
export type LengthUnit = "mm" | "in";

export type CsvOptions = { delimiter: Delimiter; decimalMark: DecimalMark; hasHeader: boolean; lengthUnit: LengthUnit };

export type FileRow = { line: number; cells: string[] };

export type ParsedFile = {
  options: CsvOptions;
  header: string[] | null;
  rows: FileRow[];
  /** Most cells in any row (a row may carry more columns than the header). */
  columnCount: number;
  blankLines: number;
  commentLines: number;
};

export const DELIMITER_NAMES: Record<Delimiter, string> = { ",": "comma", ";": "semicolon", "\t": "tab" };

const BOM = "\ufeff";
export const stripBom = (text: string) => (text.startsWith(BOM) ? text.slice(1) : text);

const isComment = (cells: readonly string[]) => (cells[0] ?? "").trimStart().startsWith("#");
const isBlank = (cells: readonly string[]) => cells.every((c) => c.trim() === "");

/** Counts a character outside double quotes in one line. */
function countOutsideQuotes(line: string, ch: string): number {
  let n = 0;
  let quoted = false;
  for (let i = 0; i < line.length; i++) {
    const c = line[i];
    if (c === '"') quoted = !quoted;
    else if (c === ch && !quoted) n++;
  }
  return n;
}

const NUMERIC_POINT = /^[+-]?\d+\.\d+$/;
const NUMERIC_COMMA = /^[+-]?\d+,\d+$/;
const NUMBERISH = /^[+-]?[\d.,]+$/;

/**
 * Guesses how a file is written from its first lines: the delimiter that splits most lines
 * into the same number of fields (tab, then semicolon, then comma on a tie), a decimal comma
 * when numbers carry a comma and none a point, a header row when the first row holds no
 * number but later rows do, and inches when the diameter column's header says so.
 */
export function detectOptions(text: string): CsvOptions {
  const lines = stripBom(text)
    .split(/\r\n|\n|\r/)
    .filter((l) => l.trim() !== "" && !l.trimStart().startsWith("#"))
    .slice(0, 50);
  let delimiter: Delimiter = ",";
  let best = -1;
  for (const d of ["\t", ";", ","] as Delimiter[]) {
    const counts = lines.map((l) => countOutsideQuotes(l, d));
    const freq = new Map<number, number>();
    for (const c of counts) if (c > 0) freq.set(c, (freq.get(c) ?? 0) + 1);
    const score = Math.max(0, ...freq.values());
    if (score > best) {
      best = score;
      delimiter = d;
    }
  }
  const rows = lines.map((l) => Papa.parse<string[]>(l, { delimiter }).data[0] ?? []);
  const cells = rows.slice(0, 50).flat().map((c) => c.trim());
  const commaNumbers = cells.filter((c) => NUMERIC_COMMA.test(c)).length;
  const pointNumbers = cells.filter((c) => NUMERIC_POINT.test(c)).length;
  const decimalMark: DecimalMark = commaNumbers > 0 && pointNumbers === 0 ? "," : ".";
  const numeric = (row: string[]) => row.filter((c) => NUMBERISH.test(c.trim()) && /\d/.test(c)).length;
  const hasHeader = rows.length > 1 ? numeric(rows[0]) === 0 && rows.slice(1).some((r) => numeric(r) > 0) : false;
  let lengthUnit: LengthUnit = "mm";
  if (hasHeader) {
    const map = guessMapping(rows[0]);
    const named = map.diameter !== undefined ? headerUnit(rows[0][map.diameter]) : null;
    if (named) lengthUnit = named;
  }
  return { delimiter, decimalMark, hasHeader, lengthUnit };
}

/**
 * Parses a whole file with the given options (detected ones when none are given). Blank and
 * comment lines are counted and left out; every other row keeps the line it starts on.
 */
export function parseCsv(text: string, options?: Partial<CsvOptions>): ParsedFile {
  const body = stripBom(text);
  const opts: CsvOptions = { ...detectOptions(body.slice(0, 64 * 1024)), ...options };
  const rows: FileRow[] = [];
  let header: string[] | null = null;
  let blankLines = 0;
  let commentLines = 0;
  let columnCount = 0;
  const take = (cells: string[], startLine: number, atEnd: boolean) => {
    if (isBlank(cells)) {
      // Papa reports the nothing after a final line end as one more row; it is not a line.
      if (!atEnd) blankLines++;
      return;
    }
    if (isComment(cells)) {
      commentLines++;
      return;
    }
    if (opts.hasHeader && header === null) {
      header = cells.map((c) => c.trim());
      columnCount = Math.max(columnCount, cells.length);
      return;
    }
    columnCount = Math.max(columnCount, cells.length);
    rows.push({ line: startLine, cells });
  };
  // Without a quote no field spans lines: row k is line k + 1, and the whole file parses at once
  // (the row-by-row mode, which tracks where each row starts, is several times slower).
  if (!body.includes('"')) {
    const data = Papa.parse<string[]>(body, { delimiter: opts.delimiter, skipEmptyLines: false }).data;
    const trailing = /[\r\n]$/.test(body);
    data.forEach((cells, k) => take(cells, k + 1, trailing && k === data.length - 1));
    return { options: opts, header, rows, columnCount, blankLines, commentLines };
  }
  let line = 1;
  let cursor = 0;
  Papa.parse<string[]>(body, {
    delimiter: opts.delimiter,
    skipEmptyLines: false,
    step: (result) => {
      const startLine = line;
      const from = cursor;
      const end = result.meta.cursor;
      // The row's span runs to just after its own line end; quoted fields may hold more.
      for (let i = from; i < end; i++) {
        const c = body.charCodeAt(i);
        if (c === 10 || (c === 13 && body.charCodeAt(i + 1) !== 10)) line++;
      }
      cursor = end;
      take(result.data, startLine, from >= body.length);
    },
  });
  return { options: opts, header, rows, columnCount, blankLines, commentLines };
}

export type FileNumber =
  | { kind: "empty" }
  | { kind: "number"; value: number; unit: LengthUnit | null }
  | { kind: "invalid"; message: string }
  | { kind: "ambiguous"; message: string };

const shown = (s: string) => `"${s.length > 24 ? `${s.slice(0, 24)}…` : s}"`;

/**
 * A number from a file whose decimal mark is known. A trailing unit ("640.02 mm", "25.2 in",
 * 25.2") is read and returned. The other mark is never a decimal: "1,234" in a file with a
 * decimal point is refused as an ambiguous thousands separator (it may mean 1234 or 1.234),
 * since a reading silently 1000 times off is worse than a row to fix.
 */
export function parseFileNumber(raw: string, decimalMark: DecimalMark): FileNumber {
  let t = raw.trim();
  if (t === "") return { kind: "empty" };
  let unit: LengthUnit | null = null;
  const u = /^(.*?)\s*(mm|in|inch|")$/i.exec(t);
  if (u) {
    t = u[1];
    unit = u[2].toLowerCase() === "mm" ? "mm" : "in";
  }
  const other = decimalMark === "." ? "," : ".";
  if (t.includes(other)) {
    const grouped = new RegExp(`^[+-]?\\d{1,3}(\\${other}\\d{3})+(\\${decimalMark}\\d+)?$`);
    if (grouped.test(t)) {
      return {
        kind: "ambiguous",
        message: `${shown(raw)} has a thousands separator or the wrong decimal mark: it could be read two ways. Write numbers without thousands separators, with a ${decimalMark === "." ? "point" : "comma"} as decimal mark.`,
      };
    }
    return { kind: "invalid", message: `${shown(raw)} is not a number with a ${decimalMark === "." ? "decimal point" : "decimal comma"}.` };
  }
  const normalised = decimalMark === "," ? t.replace(",", ".") : t;
  if (!/^[+-]?(\d+\.?\d*|\.\d+)$/.test(normalised)) return { kind: "invalid", message: `${shown(raw)} is not a number.` };
  const parsed = parseNumberInput(normalised);
  if (parsed.kind !== "number") return { kind: "invalid", message: `${shown(raw)} is not a number.` };
  return { kind: "number", value: parsed.value, unit };
}

export type FileDate = { kind: "date"; iso: string } | { kind: "empty" } | { kind: "invalid"; message: string };

/**
 * A day from a file: yyyy-mm-dd (a time after it is ignored) or dd.mm.yyyy. Slashed dates are
 * refused: 03/04/2021 is March or April depending on who wrote it.
 */
export function parseFileDate(raw: string): FileDate {
  const t = raw.trim();
  if (t === "") return { kind: "empty" };
  let iso: string | null = null;
  const a = /^(\d{4})-(\d{2})-(\d{2})(?:[T ]\d{2}:\d{2}(?::\d{2}(?:\.\d+)?)?(?:Z|[+-]\d{2}:?\d{2})?)?$/.exec(t);
  const b = /^(\d{1,2})\.(\d{1,2})\.(\d{4})$/.exec(t);
  if (a) iso = `${a[1]}-${a[2]}-${a[3]}`;
  else if (b) iso = `${b[3]}-${b[2].padStart(2, "0")}-${b[1].padStart(2, "0")}`;
  if (!iso) {
    const slash = /\d{1,2}\/\d{1,2}\/\d{2,4}/.test(t);
    return { kind: "invalid", message: `${shown(raw)} is not a date Kalibore can read without guessing${slash ? " (day and month could be either way round)" : ""}: write yyyy-mm-dd.` };
  }
  const ms = Date.parse(`${iso}T00:00:00Z`);
  if (!Number.isFinite(ms) || new Date(ms).toISOString().slice(0, 10) !== iso) return { kind: "invalid", message: `There is no day ${iso}: check the day and the month.` };
  return { kind: "date", iso };
}

/** The cell of a row for a mapped field ("" when the field is not mapped or the row is short). */
export function cellOf(row: FileRow, mapping: ColumnMapping, field: keyof ColumnMapping): string {
  const i = mapping[field];
  return i === undefined ? "" : (row.cells[i] ?? "");
}
