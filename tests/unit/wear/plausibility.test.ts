import { describe, expect, test } from "vitest";
import { checkAgainstNominal, checkGauging, checkLinerDiameter, checkRingValue, linerDiameterBounds, type LinerDiameterContext } from "@/lib/wear/plausibility";
import { readingsFor, testProfile } from "../data/profile";

const profile = testProfile(); // 900 mm bore, 5.4 mm wear limit (0.6 % of the bore, BrightHub Engineering)
const at = (d: number | null, extra: Partial<LinerDiameterContext> = {}) => checkLinerDiameter(d, { profile, stationKey: "s2", axisKey: "fa", ...extra });
const codes = (d: number | null, extra: Partial<LinerDiameterContext> = {}) => at(d, extra).map((f) => `${f.level}:${f.code}`);

describe("checkAgainstNominal [practice] thresholds: 0.2 mm under, 2 % of the bore over", () => {
  test.each([
    [900, "ok"],
    [899.85, "ok"],
    [899.79, "below_nominal"],
    [917.9, "ok"],
    [918.1, "far_above_nominal"],
  ] as const)("%d mm on a 900 mm bore is %s", (d, expected) => {
    expect(checkAgainstNominal(900, d)).toBe(expected);
  });
});

describe("hard limits: values that cannot be physically true are errors [practice]", () => {
  test("a liner reads between nominal − 0.5 mm and nominal + 2 × the wear limit", () => {
    expect(linerDiameterBounds(profile)).toEqual({ minMm: 899.5, maxMm: 910.8 });
  });

  test.each([
    ["a dropped digit: 90.05 typed for 900.05", 90.05, "error:decimal_slip"],
    ["a slipped point: 9000.5", 9000.5, "error:decimal_slip"],
    ["inches typed into a mm field: 35.44", 35.44, "error:wrong_unit"],
    ["0.6 mm under nominal", 899.4, "error:impossible_diameter"],
    ["wear of 11 mm, over twice the 5.4 mm limit", 911, "error:impossible_diameter"],
    ["a mistyped 990.2", 990.2, "error:impossible_diameter"],
    ["an empty field", null, "error:not_a_number"],
    ["NaN", NaN, "error:not_a_number"],
  ])("%s", (_name, d, expected) => {
    expect(codes(d)).toEqual([expected]);
  });

  test("an unknown station is an error", () => {
    expect(codes(900.5, { stationKey: "nope" })).toEqual(["error:unknown_cell"]);
  });

  test("the bounds apply to the value at 20 °C", () => {
    // 899.55 as read, a warm liner: factor below 1 takes it under 899.5
    expect(codes(899.55, { correctionFactor: 0.9999 })).toEqual(["error:impossible_diameter"]);
  });

  test("ring gap and groove clearance: 0 … 5 × the limit", () => {
    expect(checkRingValue(3.4, { what: "closed gap", limitMm: 6 })).toEqual([]);
    expect(checkRingValue(29.9, { what: "closed gap", limitMm: 6 })).toEqual([]);
    expect(checkRingValue(34, { what: "closed gap", limitMm: 6 }).map((f) => f.level)).toEqual(["error"]);
    expect(checkRingValue(-0.1, { what: "groove clearance", limitMm: 1 }).map((f) => f.level)).toEqual(["error"]);
    expect(checkRingValue(null, { what: "groove clearance", limitMm: 1 })).toEqual([]);
  });
});

describe("unusual but possible values are warnings the engineer may confirm", () => {
  test.each([
    ["a plausible reading", { d: 901.2 }, []],
    ["0.3 mm under nominal (gauge setting?)", { d: 899.7 }, ["warning:below_nominal"]],
    ["a worn unworn band", { d: 900.09, stationKey: "s1" }, ["warning:unworn_band_worn"]],
    ["wear over the 5.4 mm limit", { d: 905.5 }, ["warning:over_wear_limit"]],
    ["a jump of 0.3 mm with hours unknown", { d: 901.3, previousMm: 901.0 }, ["warning:jump_since_last"]],
    ["0.3 mm over 4000 h (under the abnormal 0.1 mm/1000 h)", { d: 901.3, previousMm: 901.0, hoursSincePrevious: 4000 }, []],
    ["0.5 mm over 4000 h (over the abnormal rate)", { d: 901.5, previousMm: 901.0, hoursSincePrevious: 4000 }, ["warning:jump_since_last"]],
    ["a rise of 0.1 mm", { d: 901.1, previousMm: 901.0 }, []],
    ["a drop of 0.04 mm (within gauge scatter)", { d: 900.96, previousMm: 901.0 }, []],
    ["a drop of 0.08 mm (wear does not go backwards)", { d: 900.92, previousMm: 901.0 }, ["warning:smaller_than_last"]],
  ] as const)("%s", (_name, { d, ...extra }, expected) => {
    expect(codes(d, extra)).toEqual(expected);
  });

  test("messages quote what was typed and, separately, the value at 20 °C", () => {
    // typed 899.70 on a warm liner; ×0.99999 gives 899.691 at 20 °C
    const [w] = at(899.7, { typed: "899.70 mm", correctionFactor: 0.99999 });
    expect(w.message).toContain("899.70 mm (899.69 mm at 20 °C)");
    const [plain] = at(900.92, { typed: "900.92 mm", previousMm: 901.0 });
    expect(plain.message).toContain("900.92 mm is 0.08 mm smaller than last time");
    expect(plain.message).not.toContain("at 20 °C");
  });

  test("as-fitted reference: the unworn band is judged against the as-fitted diameter", () => {
    const p = testProfile({ wearReference: "as_fitted" });
    expect(checkLinerDiameter(900.1, { profile: p, stationKey: "s1", axisKey: "fa", asFittedMm: 900.08 })).toEqual([]);
    expect(checkLinerDiameter(900.2, { profile: p, stationKey: "s1", axisKey: "fa", asFittedMm: 900.08 }).map((w) => w.code)).toEqual(["unworn_band_worn"]);
  });
});

describe("checks of the whole gauging", () => {
  const cells = (list: { stationKey: string; axisKey: string; diameterMm: number }[]) => list;

  test("every cell holding the same value is one warning, not one per cell", () => {
    const same = readingsFor(0).map((r) => ({ ...r, diameterMm: 900.42 }));
    const found = checkGauging(profile, same, null);
    expect(found.map((f) => f.code)).toEqual(["same_value_everywhere"]);
    expect(found[0].message).toContain("Every cell holds the same value, 900.42 mm");
    expect(checkGauging(profile, same.slice(0, 3), null)).toEqual([]);
  });

  test("directions entered the other way round are named, with the fit both ways", () => {
    // previous: 1.0 mm wear at the top ring, 0.3 mm ovality (fore–aft larger); now 0.2 mm more wear, same shape
    const previous = readingsFor(1.0, 0.3);
    const now = readingsFor(1.2, 0.3);
    expect(checkGauging(profile, now, previous)).toEqual([]);
    const swapped = now.map((r) => ({ ...r, axisKey: r.axisKey === "fa" ? "ath" : "fa" }));
    const found = checkGauging(profile, cells(swapped), previous);
    expect(found.map((f) => f.code)).toEqual(["directions_swapped"]);
    expect(found[0].message).toMatch(/fore–aft and athwartships exchanged/);
  });

  test("a round liner gives no swap warning either way (nothing to tell the directions apart)", () => {
    const previous = readingsFor(1.0, 0);
    const now = readingsFor(1.2, 0).map((r) => ({ ...r, axisKey: r.axisKey === "fa" ? "ath" : "fa" }));
    expect(checkGauging(profile, now, previous)).toEqual([]);
  });
});
