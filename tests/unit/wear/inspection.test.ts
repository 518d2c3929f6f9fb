import fc from "fast-check";
import { describe, expect, test } from "vitest";
import { analyseInspection } from "@/lib/wear/inspection";
import type { Inspection, LinerReading } from "@/lib/wear/types";
import { allNumbersFinite } from "../data/finite";
import { readingsFor, testProfile } from "../data/profile";

const base: Omit<Inspection, "readings"> = { id: "x", date: "2024-03-01", engineHours: 60_000, linerHours: 20_000, gaugeTempC: null, linerTempC: null };
const profile = testProfile();

describe("analyseInspection", () => {
  test("wear, ovality and their maxima for a complete set of readings", () => {
    const a = analyseInspection(profile, { ...base, readings: readingsFor(1.2, 0.3) });
    expect(a.cells).toHaveLength(14);
    expect(a.maxWear).toMatchObject({ stationKey: "s2", axisKey: "fa", depthMm: 220 });
    expect(a.maxWear!.wearMm).toBeCloseTo(1.5, 10);
    expect(a.maxOvality).toMatchObject({ stationKey: "s2", depthMm: 220 });
    expect(a.maxOvality!.ovalityMm).toBeCloseTo(0.3, 10);
    expect(a.unwornBand).toEqual({ status: "ok", maxAbsWearMm: 0 });
    expect(a.issues).toEqual([]);
  });

  test("temperature correction keeps raw and corrected readings", () => {
    const p = testProfile({ temperatureCorrection: true, alphaGaugePerK: 10e-6, alphaLinerPerK: 10e-6 });
    const a = analyseInspection(p, { ...base, gaugeTempC: 20, linerTempC: 30, readings: [{ stationKey: "s2", axisKey: "fa", diameterMm: 901.09 }] });
    const cell = a.cells[0];
    expect(cell.rawMm).toBe(901.09);
    // [derived] 901.09 / (1 + 10e-6 × 10)
    expect(cell.correctedMm).toBeCloseTo(901.09 / 1.0001, 10);
    expect(cell.wearMm).toBeCloseTo(901.09 / 1.0001 - 900, 10);
  });

  test("as-fitted reference measures wear from the same cell as fitted, falling back to nominal", () => {
    const p = testProfile({ wearReference: "as_fitted" });
    const asFitted: LinerReading[] = [{ stationKey: "s2", axisKey: "fa", diameterMm: 900.1 }];
    const a = analyseInspection(p, { ...base, readings: [
      { stationKey: "s2", axisKey: "fa", diameterMm: 901 },
      { stationKey: "s2", axisKey: "ath", diameterMm: 901 },
    ] }, asFitted);
    const wear = Object.fromEntries(a.cells.map((c) => [c.axisKey, c.wearMm]));
    expect(wear.fa).toBeCloseTo(0.9, 10);
    expect(wear.ath).toBeCloseTo(1, 10);
    expect(a.issues.some((i) => i.kind === "no_as_fitted_reading" && i.axisKey === "ath")).toBe(true);
  });

  test.each([
    // [practice] thresholds: 0.2 mm under nominal, 2 % of the bore over it
    ["below nominal by more than 0.2 mm", 899.7, "below_nominal"],
    ["more than 2 % of the bore over nominal", 919, "far_above_nominal"],
  ])("a reading %s is a typed issue and kept out of the maxima", (_name, diameterMm, kind) => {
    const readings = readingsFor(0.5).map((r) => (r.stationKey === "s4" && r.axisKey === "fa" ? { ...r, diameterMm } : r));
    const a = analyseInspection(profile, { ...base, readings });
    expect(a.issues.map((i) => i.kind)).toContain(kind);
    expect(a.cells.find((c) => c.stationKey === "s4" && c.axisKey === "fa")!.usable).toBe(false);
    expect(a.maxWear!.wearMm).toBeCloseTo(0.5, 10);
    expect(a.ovality.find((o) => o.stationKey === "s4")!.ovalityMm).toBeNull();
  });

  test.each([NaN, Infinity, -Infinity, 0, -900])("a non-finite or non-positive reading (%d) becomes an issue, never NaN", (diameterMm) => {
    const a = analyseInspection(profile, { ...base, readings: [{ stationKey: "s2", axisKey: "fa", diameterMm }, { stationKey: "s2", axisKey: "ath", diameterMm: 900.4 }] });
    expect(a.issues.map((i) => i.kind)).toContain("invalid_value");
    expect(a.maxWear!.wearMm).toBeCloseTo(0.4, 10);
    expect(allNumbersFinite(a)).toBe(true);
  });

  test("missing direction: ovality null at that station and a missing_reading issue", () => {
    const readings = readingsFor(0.5).filter((r) => !(r.stationKey === "s3" && r.axisKey === "ath"));
    const a = analyseInspection(profile, { ...base, readings });
    expect(a.ovality.find((o) => o.stationKey === "s3")!.ovalityMm).toBeNull();
    expect(a.issues).toContainEqual(expect.objectContaining({ kind: "missing_reading", stationKey: "s3", axisKey: "ath" }));
  });

  test("unknown cells and duplicates are reported, the first duplicate used", () => {
    const a = analyseInspection(profile, { ...base, readings: [
      { stationKey: "zz", axisKey: "fa", diameterMm: 900.1 },
      { stationKey: "s2", axisKey: "up", diameterMm: 900.1 },
      { stationKey: "s2", axisKey: "fa", diameterMm: 900.3 },
      { stationKey: "s2", axisKey: "fa", diameterMm: 900.6 },
    ] });
    expect(a.issues.filter((i) => i.kind === "unknown_cell")).toHaveLength(2);
    expect(a.issues.filter((i) => i.kind === "duplicate_reading")).toHaveLength(1);
    expect(a.cells).toHaveLength(1);
    expect(a.cells[0].rawMm).toBe(900.3);
  });

  test("unworn band reading more than 0.05 mm off the reference suggests a gauge or nominal-bore problem [practice]", () => {
    const readings = readingsFor(0.5).map((r) => (r.stationKey === "s1" ? { ...r, diameterMm: 900.08 } : r));
    const a = analyseInspection(profile, { ...base, readings });
    expect(a.unwornBand.status).toBe("suspect");
    expect(a.unwornBand.maxAbsWearMm).toBeCloseTo(0.08, 10);
    expect(a.issues.filter((i) => i.kind === "unworn_band_worn")).toHaveLength(2);
  });

  test("a profile without a valid bore yields issues, not exceptions", () => {
    const a = analyseInspection(testProfile({ boreMm: NaN }), { ...base, readings: readingsFor(0.5) });
    expect(a.issues[0].kind).toBe("invalid_profile");
    expect(a.cells).toEqual([]);
    expect(a.maxWear).toBeNull();
  });

  test("missing temperatures with correction on: used as read, with an issue", () => {
    const a = analyseInspection(testProfile({ temperatureCorrection: true }), { ...base, readings: readingsFor(0.5) });
    expect(a.correction).toEqual({ applied: false, factor: 1, reason: "missing_temperature" });
    expect(a.issues.map((i) => i.kind)).toContain("temperature_not_applied");
  });

  test("property: ovality is symmetric in the axes", () => {
    const d = fc.double({ min: 899.9, max: 905, noNaN: true });
    fc.assert(
      fc.property(fc.array(fc.tuple(d, d), { minLength: 7, maxLength: 7 }), (pairs) => {
        const readings = (swap: boolean) =>
          profile.stations.flatMap((s, i) => [
            { stationKey: s.key, axisKey: "fa", diameterMm: pairs[i][swap ? 1 : 0] },
            { stationKey: s.key, axisKey: "ath", diameterMm: pairs[i][swap ? 0 : 1] },
          ]);
        const a = analyseInspection(profile, { ...base, readings: readings(false) });
        const b = analyseInspection(profile, { ...base, readings: readings(true) });
        expect(b.ovality).toEqual(a.ovality);
        expect(b.maxOvality).toEqual(a.maxOvality);
        expect(b.maxWear?.wearMm).toBe(a.maxWear?.wearMm);
      }),
    );
  });
});
