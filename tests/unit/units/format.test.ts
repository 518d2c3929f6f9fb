import { describe, expect, test } from "vitest";
import { spread } from "@/lib/format";

describe("an uncertainty is never printed as zero", () => {
  test("at least three decimals, more when three would show 0.000", () => {
    expect(spread(0.0123)).toBe("0.012");
    expect(spread(0.00078)).toBe("0.00078");
    expect(spread(0.000049)).toBe("0.000049");
  });

  test("an exact zero and a missing value print as such", () => {
    expect(spread(0)).toBe("0.000");
    expect(spread(null)).toBe("–");
    expect(spread(Number.NaN)).toBe("–");
  });
});
