import fc from "fast-check";
import { describe, expect, test } from "vitest";
import { MM_PER_INCH, formatFixed, formatLength, formatMm, inchToMm, mmToInch } from "@/lib/units/length";

describe("mm and inch", () => {
  // [src] international yard and pound agreement (1959): 1 in = 25.4 mm exactly.
  test.each([
    [25.4, 1],
    [0, 0],
    [254, 10],
    [900, 35.43307086614173],
    [-2.54, -0.1],
  ])("%d mm is %d in", (mm, inch) => {
    expect(mmToInch(mm)).toBeCloseTo(inch, 12);
    expect(inchToMm(inch)).toBeCloseTo(mm, 10);
  });

  test("the inch is exactly 25.4 mm", () => expect(MM_PER_INCH).toBe(25.4));

  test.each([NaN, Infinity, -Infinity])("non-finite %d gives null, never NaN", (v) => {
    expect(mmToInch(v)).toBeNull();
    expect(inchToMm(v)).toBeNull();
  });

  test("mm -> inch -> mm round trip", () => {
    fc.assert(
      fc.property(fc.double({ min: -1e6, max: 1e6, noNaN: true }), (mm) => {
        const back = inchToMm(mmToInch(mm)!)!;
        expect(Math.abs(back - mm)).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(mm)));
      }),
    );
  });
});

describe("fixed-decimal formatting", () => {
  test.each([
    [0.4237, 2, "0.42"],
    [900.005, 3, "900.005"],
    [-0.001, 2, "0.00"],
    [-0.25, 2, "-0.25"],
    [12.5, 0, "13"],
    [null, 2, "–"],
    [NaN, 2, "–"],
    [Infinity, 2, "–"],
  ])("formatFixed(%s, %d) is %s", (value, decimals, text) => {
    expect(formatFixed(value, decimals)).toBe(text);
  });

  test.each([
    [0.42, "mm", "0.42 mm"],
    [0.42, "in", "0.0165 in"],
    [null, "mm", "–"],
  ] as const)("formatLength(%s, %s) is %s", (mm, unit, text) => {
    expect(formatLength(mm, unit)).toBe(text);
  });

  test.each([
    [0.4237, undefined, "0.42 mm"],
    [0.04237, 3, "0.042 mm"],
    [NaN, undefined, "–"],
  ])("formatMm(%s, %s) is %s", (mm, decimals, text) => {
    expect(formatMm(mm, decimals)).toBe(text);
  });
});
