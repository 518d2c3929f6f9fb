import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { csvCell, toCsv } from "@/lib/imports/csv-export";
import { guessMapping, headerUnit, LAYOUT_COLUMNS, missingFields, shapeKey, templateCsv } from "@/lib/imports/layout";
import { detectOptions, parseCsv, parseFileDate, parseFileNumber } from "@/lib/imports/parse";

// Files of our own making (fixtures/imports/generate.ts); each holds one gauging of the demo's
// 640 mm design: 9 stations × 2 directions and 4 rings, 22 rows.
const fixture = (name: string) => readFileSync(`fixtures/imports/${name}`, "utf8");

describe("detecting how a file is written", () => {
  it.each([
    ["clean.csv", ",", ".", true, "mm"],
    ["bom-crlf.csv", ",", ".", true, "mm"],
    ["semicolon-decimal-comma.csv", ";", ",", true, "mm"],
    ["tab-separated.tsv", "\t", ".", true, "mm"],
    ["no-header.csv", ",", ".", false, "mm"],
    ["inch-readings.csv", ",", ".", true, "in"],
    ["quoted-delimiter.csv", ",", ".", true, "mm"],
    ["blank-and-comment-lines.csv", ",", ".", true, "mm"],
  ])("%s: delimiter %j, decimal %j, header %s, unit %s", (name, delimiter, decimalMark, hasHeader, lengthUnit) => {
    expect(detectOptions(fixture(name))).toEqual({ delimiter, decimalMark, hasHeader, lengthUnit });
  });
});

describe("parsing a file", () => {
  it.each(["clean.csv", "bom-crlf.csv", "semicolon-decimal-comma.csv", "tab-separated.tsv"])("%s gives the clean file's 22 rows, from line 2", (name) => {
    const clean = parseCsv(fixture("clean.csv"));
    const p = parseCsv(fixture(name));
    expect(p.rows).toHaveLength(22);
    expect(p.rows[0].line).toBe(2);
    expect(p.header?.[0]).toBe("cylinder"); // the BOM is not part of the first name
    const dec = (c: string) => c.replace(",", ".");
    expect(p.rows.map((r) => r.cells.map(dec))).toEqual(clean.rows.map((r) => r.cells));
  });

  it("without a header the first row is data", () => {
    const p = parseCsv(fixture("no-header.csv"));
    expect(p.header).toBeNull();
    expect(p.rows).toHaveLength(22);
    expect(p.rows[0].line).toBe(1);
  });

  it("skips blank and comment lines but keeps each row's own line number", () => {
    const p = parseCsv(fixture("blank-and-comment-lines.csv"));
    expect(p.rows).toHaveLength(22);
    expect(p.commentLines).toBe(2);
    expect(p.blankLines).toBe(3);
    expect(p.rows[0].line).toBe(4); // comment, header, blank line before it
    expect(p.rows[9].line).toBe(16); // after a comment and two blank lines
  });

  it("keeps the delimiter, quotes and a formula-like note inside quoted fields as text", () => {
    const p = parseCsv(fixture("quoted-delimiter.csv"));
    expect(p.rows[0].cells[14]).toBe('Top band, clean; said "as new"');
    expect(p.rows[1].cells[14]).toBe('=HYPERLINK("http://example.invalid")');
    expect(p.rows[2].cells[10]).toBe("MG-0417");
  });

  it("counts lines inside a quoted field that spans lines", () => {
    const p = parseCsv('a,b\r\n1,"two\r\nlines"\r\n2,x\r\n');
    expect(p.rows.map((r) => r.line)).toEqual([2, 4]);
  });

  it("maps our layout's header and the extra, reordered columns by name", () => {
    const p = parseCsv(fixture("extra-reordered-columns.csv"));
    expect(guessMapping(p.header!)).toEqual({ cylinder: 5, date: 6, engineHours: 7, station: 3, direction: 2, diameter: 1 });
    expect(guessMapping(LAYOUT_COLUMNS.map((c) => c.name))).toEqual(Object.fromEntries(LAYOUT_COLUMNS.map((c, i) => [c.field, i])));
  });

  it("reads the unit a header names", () => {
    expect(headerUnit("diameter_in")).toBe("in");
    expect(headerUnit("Diameter (inch)")).toBe("in");
    expect(headerUnit("depth_mm")).toBe("mm");
    expect(headerUnit("direction")).toBeNull();
    expect(headerUnit("ring")).toBeNull();
  });
});

describe("numbers and dates from a file", () => {
  it.each([
    ["640.52", ".", 640.52],
    ["640,52", ",", 640.52],
    [" 25.2181 in", ".", 25.2181],
    ["-3", ".", -3],
  ])("%j with decimal %j is %d", (raw, mark, value) => {
    const n = parseFileNumber(raw, mark as "." | ",");
    expect(n.kind).toBe("number");
    if (n.kind === "number") expect(n.value).toBeCloseTo(value, 9);
  });

  it("refuses a thousands separator as ambiguous, and words as not a number", () => {
    expect(parseFileNumber("16,720", ".").kind).toBe("ambiguous");
    expect(parseFileNumber("16.720", ",").kind).toBe("ambiguous");
    expect(parseFileNumber("1,2,3", ".").kind).toBe("invalid");
    const words = parseFileNumber("n/a", ".");
    expect(words.kind === "invalid" && words.message).toContain('"n/a" is not a number');
  });

  it("reads yyyy-mm-dd (with a time) and dd.mm.yyyy, refuses slashed and impossible days", () => {
    expect(parseFileDate("2021-03-04")).toEqual({ kind: "date", iso: "2021-03-04" });
    expect(parseFileDate("2021-03-04T06:30")).toEqual({ kind: "date", iso: "2021-03-04" });
    expect(parseFileDate("4.3.2021")).toEqual({ kind: "date", iso: "2021-03-04" });
    const slashed = parseFileDate("03/04/2021");
    expect(slashed.kind === "invalid" && slashed.message).toContain("either way round");
    expect(parseFileDate("2021-02-30").kind).toBe("invalid");
  });
});

describe("layout", () => {
  it("the template parses with our own header and needs no mapping by hand", () => {
    const p = parseCsv(templateCsv());
    expect(p.header).toEqual(LAYOUT_COLUMNS.map((c) => c.name));
    expect(p.rows).toHaveLength(3);
    expect(missingFields(guessMapping(p.header!), "history")).toEqual([]);
  });

  it("a mapping lacking what the destination needs names the fields", () => {
    expect(missingFields({ diameter: 1 }, "draft")).toEqual(["direction", "station"]);
    expect(missingFields({ diameter: 1, direction: 2, depth: 3 }, "history")).toEqual(["cylinder", "date", "engineHours"]);
  });

  it("the same header gives the same shape; no header is known by its column count", () => {
    expect(shapeKey(["Cylinder", "Depth mm"], 2)).toBe(shapeKey(["cylinder", "depth_mm"], 2));
    expect(shapeKey(null, 7)).toBe("n:7");
  });
});

describe("exports never emit a formula", () => {
  // Characters a spreadsheet evaluates at the start of a cell: OWASP, "CSV Injection".
  it.each(["=1+2", "+1", "-1+2", "@SUM(A1)", "\tx", "\rx"])("%j is written as text", (text) => {
    expect(csvCell(text).replace(/^"/, "")).toMatch(/^'/);
  });

  it("numbers stay numbers, and fields with delimiters or quotes are quoted", () => {
    expect(csvCell(-0.5)).toBe("-0.5");
    expect(toCsv([["a,b", 'say "hi"', null]])).toBe('"a,b","say ""hi""",\r\n');
  });
});
