import { describe, expect, it } from "vitest";
import { parseNumberInput, plainNumber } from "@/lib/units/parse-number";

// Decimal marks and digit grouping: the point and the comma are both decimal marks in
// ISO 80000-1:2009 (clause 7.3.2), which groups digits in threes with a space only; a comma
// or point between thousands is common practice in English- and German-speaking texts.
describe("parseNumberInput", () => {
  it.each([
    ["600.42", 600.42],
    ["600,42", 600.42],
    [" 600.4 ", 600.4],
    ["65 950", 65950],
    ["65\u202f950,5", 65950.5],
    ["65,950.5", 65950.5],
    ["65.950,5", 65950.5],
    ["1,250,000", 1250000],
    ["0,250", 0.25],
    ["-1.5", -1.5],
    [".5", 0.5],
    ["600,05", 600.05],
  ])("reads %j as %d", (text, value) => expect(parseNumberInput(text)).toEqual({ kind: "number", value }));

  it.each(["60O.42", "1e3", "600.4.2", "1,25,0", "12,34.5", "-", "abc", "1.250,5,5"])("refuses %j", (text) =>
    expect(parseNumberInput(text)).toEqual({ kind: "invalid" }),
  );

  it("is empty for blank input", () => expect(parseNumberInput("  ")).toEqual({ kind: "empty" }));

  it("asks about a comma followed by exactly three digits when nothing settles it", () => {
    expect(parseNumberInput("1,250")).toEqual({ kind: "ambiguous", grouped: 1250, decimal: 1.25 });
    expect(parseNumberInput("65,950")).toEqual({ kind: "ambiguous", grouped: 65950, decimal: 65.95 });
  });

  it("settles it by the field's expected size: a pressure or an hours counter is never a fraction of it", () => {
    // rod nut pressure against a profile figure of 1250 bar (invented demo value)
    expect(parseNumberInput("1,250", { expected: 1250 })).toEqual({ kind: "number", value: 1250 });
    // engine hours against the last 64 000 h on the counter
    expect(parseNumberInput("65,950", { expected: 64_000 })).toEqual({ kind: "number", value: 65950 });
    // a liner diameter against a 600 mm nominal bore: three decimals, not thousands
    expect(parseNumberInput("600,050", { expected: 600 })).toEqual({ kind: "number", value: 600.05 });
    // a closed gap against a 6.5 mm limit
    expect(parseNumberInput("2,150", { expected: 6.5 })).toEqual({ kind: "number", value: 2.15 });
  });

  it("still asks when the expected size sits between the two readings", () => {
    // 1250 and 1.25 are equally far (in ratio) from about 35
    expect(parseNumberInput("1,250", { expected: 35 }).kind).toBe("ambiguous");
  });
});

describe("plainNumber", () => {
  it("prints a value so it cannot be misread either way", () => {
    expect(plainNumber(1250)).toBe("1\u202f250");
    expect(plainNumber(1.25)).toBe("1.25");
    expect(plainNumber(65950.5)).toBe("65\u202f950.5");
    expect(plainNumber(600.05, 3)).toBe("600.05");
    expect(plainNumber(-0.0001, 3)).toBe("0");
  });
});
