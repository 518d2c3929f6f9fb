import { describe, expect, test } from "vitest";
import { checkAgainstNominal, checkReading } from "@/lib/wear/plausibility";
import { testProfile } from "../data/profile";

const profile = testProfile();
const kinds = (input: Parameters<typeof checkReading>[1]) => checkReading(profile, input).map((w) => w.kind);

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

describe("checkReading for the live entry form", () => {
  test.each([
    ["a plausible reading", { stationKey: "s2", axisKey: "fa", diameterMm: 901.2 }, []],
    ["an empty field", { stationKey: "s2", axisKey: "fa", diameterMm: null }, ["not_a_number"]],
    ["NaN", { stationKey: "s2", axisKey: "fa", diameterMm: NaN }, ["not_a_number"]],
    ["an unknown station", { stationKey: "nope", axisKey: "fa", diameterMm: 900.5 }, ["unknown_cell"]],
    ["under nominal", { stationKey: "s2", axisKey: "fa", diameterMm: 899.5 }, ["below_nominal"]],
    ["a dropped digit", { stationKey: "s2", axisKey: "fa", diameterMm: 990.2 }, ["far_above_nominal"]],
    ["a worn unworn band", { stationKey: "s1", axisKey: "fa", diameterMm: 900.09 }, ["unworn_band_worn"]],
    ["wear over the 5.4 mm limit", { stationKey: "s2", axisKey: "fa", diameterMm: 905.5 }, ["over_wear_limit"]],
    ["a jump of 0.3 mm with hours unknown", { stationKey: "s2", axisKey: "fa", diameterMm: 901.3, previousDiameterMm: 901.0 }, ["jump_since_last"]],
    ["0.3 mm over 4000 h (under the abnormal 0.1 mm/1000 h)", { stationKey: "s2", axisKey: "fa", diameterMm: 901.3, previousDiameterMm: 901.0, hoursSincePrevious: 4000 }, []],
    ["0.5 mm over 4000 h (over the abnormal rate)", { stationKey: "s2", axisKey: "fa", diameterMm: 901.5, previousDiameterMm: 901.0, hoursSincePrevious: 4000 }, ["jump_since_last"]],
    ["a rise of 0.1 mm", { stationKey: "s2", axisKey: "fa", diameterMm: 901.1, previousDiameterMm: 901.0 }, []],
    ["a drop of 0.04 mm (within gauge scatter)", { stationKey: "s2", axisKey: "fa", diameterMm: 900.96, previousDiameterMm: 901.0 }, []],
    ["a drop of 0.08 mm (wear does not go backwards)", { stationKey: "s2", axisKey: "fa", diameterMm: 900.92, previousDiameterMm: 901.0 }, ["smaller_than_last"]],
  ])("%s", (_name, input, expected) => {
    expect(kinds(input)).toEqual(expected);
  });

  test("warnings are plain English with the numbers and units in them", () => {
    const [w] = checkReading(profile, { stationKey: "s2", axisKey: "fa", diameterMm: 900.92, previousDiameterMm: 901.0 });
    expect(w.message).toContain("0.08 mm smaller than last time");
    expect(w.message).toMatch(/does not go backwards/);
  });

  test("as-fitted reference: the unworn band is judged against the as-fitted diameter", () => {
    const p = testProfile({ wearReference: "as_fitted" });
    expect(checkReading(p, { stationKey: "s1", axisKey: "fa", diameterMm: 900.1, asFittedMm: 900.08 })).toEqual([]);
    expect(checkReading(p, { stationKey: "s1", axisKey: "fa", diameterMm: 900.2, asFittedMm: 900.08 }).map((w) => w.kind)).toEqual(["unworn_band_worn"]);
  });
});
