import fc from "fast-check";
import { describe, expect, test } from "vitest";
import { REFERENCE_TEMPERATURE_C, correctTo20C, temperatureCorrection } from "@/lib/wear/correction";

const profile = { temperatureCorrection: true, alphaGaugePerK: 11.5e-6, alphaLinerPerK: 10.5e-6 };

describe("temperature correction to 20 °C", () => {
  test("the reference temperature is 20 °C [src] ISO 1:2022", () => {
    expect(REFERENCE_TEMPERATURE_C).toBe(20);
  });

  test("a 900 mm bore 10 K warmer than the gauge reads about 0.09 mm large [derived]", () => {
    // Grey cast iron about 10 × 10⁻⁶ /K [from memory] (handbook values for grey iron run about 9–12 × 10⁻⁶ /K); 900 × 10e-6 × 10 = 0.09 mm.
    const reading = 900.09;
    expect(correctTo20C(reading, 10e-6, 20, 10e-6, 30)).toBeCloseTo(900, 3);
  });

  test.each([
    // [derived] D20 = R(1 + αg(Tg − 20)) / (1 + αl(Tl − 20))
    [900.5, 25, 35, 900.5 * (1 + 11.5e-6 * 5) / (1 + 10.5e-6 * 15)],
    [900.5, 30, 30, 900.5 * (1 + 11.5e-6 * 10) / (1 + 10.5e-6 * 10)],
    [900.5, 10, 15, 900.5 * (1 - 11.5e-6 * 10) / (1 - 10.5e-6 * 5)],
  ])("reading %d with gauge %d °C, liner %d °C", (reading, tg, tl, expected) => {
    expect(correctTo20C(reading, profile.alphaGaugePerK, tg, profile.alphaLinerPerK, tl)).toBeCloseTo(expected, 12);
    const c = temperatureCorrection(profile, tg, tl);
    expect(c.applied).toBe(true);
    expect(reading * c.factor).toBeCloseTo(expected, 10);
  });

  test("steel gauge and iron liner both at 30 °C: the gauge grows more, so the bore is about 0.009 mm larger than read [derived]", () => {
    expect(correctTo20C(900, 11.5e-6, 30, 10.5e-6, 30) - 900).toBeCloseTo(0.009, 4);
  });

  test.each([
    [{ ...profile, temperatureCorrection: false }, 30, 40, "disabled"],
    [profile, null, 40, "missing_temperature"],
    [profile, 30, null, "missing_temperature"],
    [profile, 30, 400, "implausible_temperature"],
    [profile, NaN, 30, "implausible_temperature"],
    [{ ...profile, alphaLinerPerK: 10.5 }, 30, 30, "invalid_coefficient"],
  ])("not applied: %j, %s, %s → %s", (p, tg, tl, reason) => {
    expect(temperatureCorrection(p, tg, tl)).toEqual({ applied: false, factor: 1, reason });
  });

  const temp = fc.double({ min: -20, max: 120, noNaN: true });
  const alpha = fc.double({ min: 0, max: 3e-5, noNaN: true });

  test("property: neutral at 20 °C for any coefficients", () => {
    fc.assert(
      fc.property(fc.double({ min: 100, max: 1200, noNaN: true }), alpha, alpha, (r, ag, al) => {
        expect(correctTo20C(r, ag, 20, al, 20)).toBe(r);
      }),
    );
  });

  test("property: neutral when both alphas are equal and both temperatures are equal", () => {
    fc.assert(
      fc.property(fc.double({ min: 100, max: 1200, noNaN: true }), alpha, temp, (r, a, t) => {
        expect(Math.abs(correctTo20C(r, a, t, a, t) - r)).toBeLessThanOrEqual(1e-12 * r);
      }),
    );
  });
});
