import fc from "fast-check";
import { describe, expect, test } from "vitest";
import { studentTCdf, studentTQuantile, tCritical } from "@/lib/stats/t-quantile";

describe("Student t quantile", () => {
  // [src] NIST/SEMATECH e-Handbook of Statistical Methods, 1.3.6.7.2 "Critical values of the
  // Student's t distribution" (upper-tail probabilities, printed to 3 decimals). Its ν = 1,
  // p = 0.999 entry reads 318.313 [memory], off in the last digits from the exact tan(0.499π) =
  // 318.309, so that cell is checked by the closed form below instead.
  test.each([
    [1, 0.9, 3.078], [1, 0.95, 6.314], [1, 0.975, 12.706], [1, 0.99, 31.821], [1, 0.995, 63.657],
    [2, 0.9, 1.886], [2, 0.95, 2.92], [2, 0.975, 4.303], [2, 0.99, 6.965], [2, 0.995, 9.925], [2, 0.999, 22.327],
    [5, 0.9, 1.476], [5, 0.95, 2.015], [5, 0.975, 2.571], [5, 0.99, 3.365], [5, 0.995, 4.032], [5, 0.999, 5.893],
    [9, 0.9, 1.383], [9, 0.95, 1.833], [9, 0.975, 2.262], [9, 0.99, 2.821], [9, 0.995, 3.25], [9, 0.999, 4.297],
    [10, 0.9, 1.372], [10, 0.95, 1.812], [10, 0.975, 2.228], [10, 0.99, 2.764], [10, 0.995, 3.169], [10, 0.999, 4.144],
    [30, 0.9, 1.31], [30, 0.95, 1.697], [30, 0.975, 2.042], [30, 0.99, 2.457], [30, 0.995, 2.75], [30, 0.999, 3.385],
    [100, 0.9, 1.29], [100, 0.95, 1.66], [100, 0.975, 1.984], [100, 0.99, 2.364], [100, 0.995, 2.626], [100, 0.999, 3.174],
  ])("t(%d df) at p = %d is %d to the table's 3 decimals", (df, p, table) => {
    expect(Math.abs(studentTQuantile(p, df)! - table)).toBeLessThanOrEqual(0.0005);
  });

  test.each([
    // [from memory] the usual more-figure quotations of these quantiles; the NIST table prints
    // only 2.262, 12.706 and 2.042 (checked above). The closed forms below check ν = 1 exactly.
    [0.975, 9, 2.262157],
    [0.975, 1, 12.7062],
    [0.975, 30, 2.0423],
  ])("t(%d, %d df) = %d", (p, df, value) => {
    const digits = String(value).split(".")[1].length;
    expect(studentTQuantile(p, df)).toBeCloseTo(value, digits);
  });

  // [derived] exact closed forms: ν = 1 is the Cauchy distribution, t = tan(π(p − ½));
  // ν = 2 gives t = (2p − 1)/√(2p(1 − p)).
  test.each([0.5001, 0.6, 0.75, 0.9, 0.975, 0.999, 0.999999, 0.01, 0.3])("closed forms at p = %d", (p) => {
    const cauchy = Math.tan(Math.PI * (p - 0.5));
    expect(Math.abs(studentTQuantile(p, 1)! - cauchy)).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(cauchy)));
    const two = (2 * p - 1) / Math.sqrt(2 * p * (1 - p));
    expect(Math.abs(studentTQuantile(p, 2)! - two)).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(two)));
  });

  test("tends to the normal quantile 1.959964 for large df", () => {
    // [src] NIST/SEMATECH e-Handbook, normal table: z(0.975) = 1.96; the six decimals 1.959964
    // are [from memory] (the table prints two).
    expect(studentTQuantile(0.975, 1e6)).toBeCloseTo(1.959964, 5);
  });

  test("tCritical(0.95, df) is the 0.975 quantile", () => {
    expect(tCritical(0.95, 9)).toBe(studentTQuantile(0.975, 9));
  });

  test.each([
    [0, 5], [1, 5], [-0.1, 5], [NaN, 5], [0.975, 0], [0.975, -1], [0.975, NaN], [0.975, Infinity],
  ])("invalid p = %d, df = %d gives null", (p, df) => {
    expect(studentTQuantile(p, df)).toBeNull();
  });

  test("quantile and CDF are inverse, and the t distribution is symmetric", () => {
    fc.assert(
      fc.property(fc.double({ min: 0.001, max: 0.999, noNaN: true }), fc.integer({ min: 1, max: 200 }), (p, df) => {
        const t = studentTQuantile(p, df)!;
        expect(studentTCdf(t, df)!).toBeCloseTo(p, 10);
        expect(studentTQuantile(1 - p, df)!).toBeCloseTo(-t, 8);
      }),
    );
  });
});
