import { describe, expect, test } from "vitest";
import { analyseGauging, inspectionAnalysisInput, toGauging } from "@/lib/analysis/input";
import { asFittedGauging, correctedAsFittedReadings } from "@/lib/wear/as-fitted";
import { correctTo20C } from "@/lib/wear/correction";
import { analyseLiner } from "@/lib/wear/liner";
import { inspectionAt, readingsFor, testProfile } from "../data/profile";

// An invented as-fitted liner of the 900 mm test profile, corrected to 20 °C (ISO 1).
const profile = testProfile({ wearReference: "as_fitted", temperatureCorrection: true });
const factor = (gauge: number, liner: number) => correctTo20C(1, profile.alphaGaugePerK, gauge, profile.alphaLinerPerK, liner);

/** A bore that is `topWearMm` over its as-fitted size at 20 °C, read with gauge and liner at the given temperatures. */
function gaugedAt(linerHours: number, topWearMm: number, gaugeTempC: number, linerTempC: number, date: string) {
  const asFittedLarge = 0.05; // the new bore was machined 0.05 mm over nominal
  const readings = readingsFor(topWearMm, 0, 900 + asFittedLarge).map((r) => ({ ...r, diameterMm: r.diameterMm / factor(gaugeTempC, linerTempC) }));
  return inspectionAt(linerHours, 0, { date, gaugeTempC, linerTempC, readings });
}

describe("the as-fitted reference", () => {
  const fitted = gaugedAt(0, 0, 20, 45, "2024-01-10"); // gauged as fitted in a warm engine room
  const later = gaugedAt(6000, 0.3, 20, 20, "2025-01-10"); // gauged at 20 °C

  test("as-fitted readings are referred to 20 °C like every other reading", () => {
    // [derived] the liner at 45 °C reads large by 1 + αl·25; corrected, the cell is back at 900.05 mm.
    const corrected = correctedAsFittedReadings(profile, fitted);
    expect(corrected.find((r) => r.stationKey === "s4" && r.axisKey === "fa")!.diameterMm).toBeCloseTo(900.05, 9);
    const a = analyseGauging(profile, later, fitted);
    // [derived] wear is the difference of two 20 °C diameters: 0.3 mm at the top-ring station.
    expect(a.maxWear!.wearMm).toBeCloseTo(0.3, 9);
    // Used raw, the warm as-fitted reading (900.05 × (1 + 10.5e-6 × 25) ≈ 900.286) would have hidden 0.24 mm of wear.
  });

  test("the earliest gauging is the reference: a liner gauged as fitted reads zero wear against itself", () => {
    const own = analyseGauging(profile, fitted, later);
    expect(own.maxWear!.wearMm).toBeCloseTo(0, 9);
    expect(own.issues.filter((i) => i.kind === "no_as_fitted_reading")).toEqual([]);
  });

  test("one rule: the sheet's input and the unit history agree cell by cell", () => {
    const third = gaugedAt(12_000, 0.5, 30, 38, "2026-01-10");
    const history = analyseLiner(profile, [third, later, fitted], {
      asFittedReadings: correctedAsFittedReadings(profile, asFittedGauging([third, later, fitted])!),
    });
    for (const [g, others] of [
      [fitted, [later, third]],
      [later, [fitted, third]],
      [third, [fitted, later]],
    ] as const) {
      const single = analyseGauging(profile, g, asFittedGauging(others));
      const inHistory = history.inspections.find((i) => i.inspectionId === g.id)!;
      expect(single.cells.map((c) => c.wearMm)).toEqual(inHistory.cells.map((c) => c.wearMm));
    }
  });

  test("ties on the date go to the fewer liner hours, then the lower id", () => {
    const a = { id: "12", date: "2025-01-01", linerHours: 10 };
    const b = { id: "11", date: "2025-01-01", linerHours: 20 };
    const c = { id: "13", date: "2025-01-01", linerHours: 10 };
    expect(asFittedGauging([b, c, a])).toBe(a);
    expect(asFittedGauging([])).toBeNull();
  });

  test("a nominal-bore profile takes no as-fitted readings", () => {
    const input = inspectionAnalysisInput(testProfile(), later, fitted);
    expect(input.asFittedReadings).toBeUndefined();
  });

  test("toGauging carries the header onto the gauging", () => {
    const g = toGauging(7, { inspectedOn: "2025-03-04", engineHours: 65_950, linerHours: 0, gaugeTempC: 21, linerTempC: 24 }, []);
    expect(g).toEqual({ id: "7", date: "2025-03-04", engineHours: 65_950, linerHours: 0, gaugeTempC: 21, linerTempC: 24, readings: [] });
  });
});
