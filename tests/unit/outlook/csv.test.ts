import { describe, expect, test } from "vitest";
import { csvCell, toCsv } from "@/lib/outlook/csv";

describe("CSV cells", () => {
  // [src] OWASP, "CSV Injection": cells beginning with =, +, -, @, tab (0x09) or carriage
  // return (0x0D) are interpreted as formulas; prefix them with a single quote.
  test.each([
    ["=HYPERLINK(\"http://x\")", "\"'=HYPERLINK(\"\"http://x\"\")\""],
    ["+1", "'+1"],
    ["-2+3", "'-2+3"],
    ["@SUM(A1)", "'@SUM(A1)"],
    ["\tcmd", "'\tcmd"],
    ["\rcmd", "\"'\rcmd\""],
  ])("%j is made inert", (input, out) => {
    expect(csvCell(input)).toBe(out);
  });

  // [src] RFC 4180, section 2: fields with commas, quotes or line breaks are enclosed in double
  // quotes, and a double quote inside is doubled.
  test("quoting per RFC 4180; numbers stay numbers, even negative ones", () => {
    expect(csvCell('Port "A", east')).toBe('"Port ""A"", east"');
    expect(csvCell(-0.25)).toBe("-0.25");
    expect(csvCell(null)).toBe("");
    expect(csvCell(NaN)).toBe("");
    expect(toCsv(["a", "b"], [["x", 1]])).toBe("\uFEFFa,b\r\nx,1\r\n");
  });
});
