import { describe, expect, test } from "vitest";
import { rateSpread } from "@/lib/fleet/rates";

describe("the fleet's spread of wear rates", () => {
  test("median and 10th/90th percentiles of ten rates", () => {
    // [derived] by hand with Hyndman & Fan's type 7 (The American Statistician 50, 1996; R's
    // default): h = (n − 1)·p, x[⌊h⌋] + (h − ⌊h⌋)·(x[⌊h⌋+1] − x[⌊h⌋]) on the sorted rates (0-based).
    // n = 10: p = 0.5 → h = 4.5; p = 0.1 → h = 0.9; p = 0.9 → h = 8.1.
    const rates = [0.05, 0.01, 0.03, 0.1, 0.02, 0.04, 0.06, 0.08, 0.07, 0.09];
    const s = rateSpread(rates)!;
    expect(s.n).toBe(10);
    expect(s.median).toBeCloseTo(0.05 + 0.5 * 0.01, 12);
    expect(s.p10).toBeCloseTo(0.01 + 0.9 * 0.01, 12);
    expect(s.p90).toBeCloseTo(0.09 + 0.1 * 0.01, 12);
  });

  test("missing rates are left out; too few give no spread", () => {
    expect(rateSpread([0.03, null, Number.NaN, 0.04])).toBeNull();
    expect(rateSpread([0.03, null, 0.05, 0.04])!.median).toBeCloseTo(0.04, 12); // [derived] h = 2 × 0.5 = 1 → the 2nd of 3
  });
});
