import { readFileSync } from "node:fs";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { DELIMITERS, detectOptions, parseCsv, parseFileDate, parseFileNumber } from "@/lib/imports/parse";
import { INJECTIONS } from "../../support/fuzz";

// The CSV importer's parser, fuzzed (fast-check): whatever a file holds, parsing answers in
// words and never throws, and quoted cells — delimiters, quotes and injection strings
// inside — come back exactly as written (RFC 4180 quoting: a quote doubled inside quotes).

const RUNS = Number(process.env.FUZZ_RUNS ?? 200);
const clean = readFileSync("fixtures/imports/clean.csv", "utf8");
const anyText = fc.oneof(
  fc.string({ unit: "grapheme", maxLength: 400 }),
  fc.string({ unit: "binary", maxLength: 200 }),
  fc.array(fc.tuple(fc.nat({ max: clean.length }), fc.constantFrom('"', ",", ";", "\t", "\n", "\r\n", "\uFEFF", "#", "")), { maxLength: 8 }).map((edits) => {
    let t = clean;
    for (const [at, s] of edits) t = t.slice(0, at) + s + t.slice(at + 1);
    return t;
  }),
);

const quote = (cell: string) => `"${cell.replaceAll('"', '""')}"`;
/** Cells on one line each: injection strings and any text without a line break. */
const cell = fc.oneof(fc.constantFrom(...INJECTIONS.filter((s) => !/[\r\n]/.test(s))), fc.string({ unit: "grapheme", maxLength: 20 }).filter((s) => !/[\r\n]/.test(s)));

describe("CSV import parser, fuzzed", () => {
  it(`never throws on any text, and every row it keeps is a line of the file (${RUNS} runs)`, () => {
    fc.assert(
      fc.property(anyText, (text) => {
        const options = detectOptions(text);
        expect(DELIMITERS).toContain(options.delimiter);
        const parsed = parseCsv(text);
        const lines = text.split(/\r\n|\n|\r/).length;
        for (const row of parsed.rows) {
          expect(row.line).toBeGreaterThanOrEqual(1);
          expect(row.line).toBeLessThanOrEqual(lines);
          expect(row.cells.length).toBeLessThanOrEqual(parsed.columnCount);
        }
      }),
      { numRuns: RUNS },
    );
  });

  it("quoted cells come back exactly, whatever they hold", () => {
    fc.assert(
      fc.property(fc.constantFrom(...DELIMITERS), fc.array(fc.array(cell, { minLength: 2, maxLength: 5 }), { minLength: 1, maxLength: 5 }), (delimiter, table) => {
        // A first column that is never blank or a comment, so every line is kept.
        const rows = table.map((r, i) => [`row${i}`, ...r]);
        const text = rows.map((r) => r.map(quote).join(delimiter)).join("\n");
        const parsed = parseCsv(text, { delimiter, hasHeader: false });
        expect(parsed.rows.map((r) => r.cells)).toEqual(rows);
      }),
      { numRuns: RUNS },
    );
  });

  it("numbers and dates from a file: a finite number or a real day, or a reason", () => {
    fc.assert(
      fc.property(fc.oneof(cell, fc.double().map(String), fc.constantFrom("1,5", "1.234,5", "1e400", "-0", "0x10", "٦٤٠", "640.000.1", "31.02.2024", "2024-02-30")), fc.constantFrom(".", ","), (raw, mark) => {
        const n = parseFileNumber(raw, mark as "." | ",");
        if (n.kind === "number") expect(Number.isFinite(n.value)).toBe(true);
        if (n.kind === "invalid") expect(n.message.trim()).not.toBe("");
        const d = parseFileDate(raw);
        if (d.kind === "date") expect(new Date(`${d.iso}T00:00:00Z`).toISOString().slice(0, 10)).toBe(d.iso);
        if (d.kind === "invalid") expect(d.message.trim()).not.toBe("");
      }),
      { numRuns: RUNS },
    );
  });
});
