import { describe, expect, it } from "vitest";
import { computeUnitAnalysis, earliestLimit, type UnitInput } from "@/lib/analysis/compute";
import { inspectionAt, testProfile } from "../data/profile";

// Invented test unit. Check values are [derived]: a noiseless straight line y = a + b·x
// must be recovered exactly by least squares, and its limit crossing is (limit − a)/b.
function unit(points: [number, number][], overrides: Partial<UnitInput> = {}): UnitInput {
  const inspections = points.map(([h, w]) => inspectionAt(h, w));
  return {
    unitId: 1,
    linerId: 1,
    profile: testProfile(),
    inspections,
    ringInspections: [],
    hoursLog: [
      { date: "2025-12-01", engineHours: 100_000 },
      { date: "2026-12-01", engineHours: 106_570 }, // 18 h a day over 365 days
    ],
    nextOverhaulEngineHours: null,
    ...overrides,
  };
}

describe("computeUnitAnalysis", () => {
  it("recovers a straight wear line and dates its limit from the running-hours log", () => {
    // 0.2 mm at 4000 h rising 0.05 mm/1000 h; limit 5.4 mm → (5.4 − 0.0)/0.00005 = 108 000 h
    const pts: [number, number][] = [4000, 8000, 12000, 16000, 20000].map((h) => [h, 0.05 * (h / 1000)]);
    // tiny scatter so the residual variance is not zero and an interval exists
    pts[1][1] += 0.002;
    pts[3][1] -= 0.002;
    const { summary } = computeUnitAnalysis(unit(pts));
    expect(summary.trend?.slopeMmPer1000h).toBeCloseTo(0.05, 3);
    expect(summary.wear.kind).toBe("projected");
    if (summary.wear.kind !== "projected") return;
    expect(summary.wear.atLinerHours).toBeGreaterThan(106_000);
    expect(summary.wear.atLinerHours).toBeLessThan(110_000);
    expect(summary.wear.dates?.kind).toBe("dated");
    // 88 000 h left at 18 h/day ≈ 4 900 days after the last inspection
    const limit = earliestLimit(summary);
    expect(limit).not.toBeNull();
    const last = new Date(`${summary.lastInspectedOn}T00:00:00Z`).getTime();
    const at = new Date(`${limit!.on}T00:00:00Z`).getTime();
    const days = (at - last) / 86_400_000;
    expect(days).toBeGreaterThan((summary.wear.atLinerHours - 20000) / 18 - 2);
    expect(days).toBeLessThan((summary.wear.atLinerHours - 20000) / 18 + 2);
  });

  it("says too few readings rather than guessing", () => {
    const { summary } = computeUnitAnalysis(unit([[2500, 0.08], [9000, 0.35]]));
    expect(summary.band.band).toBe("unknown");
    expect(summary.wear.kind).toBe("insufficient_data");
    expect(earliestLimit(summary)).toBeNull();
  });

  it("bands a liner at its limit as over limit", () => {
    const { summary } = computeUnitAnalysis(unit([[4000, 3.0], [10000, 4.5], [16000, 5.5]]));
    expect(summary.band.band).toBe("over_limit");
    expect(summary.band.reasons.length).toBeGreaterThan(0);
  });

  it("keeps every figure finite or null on an empty history", () => {
    const { summary } = computeUnitAnalysis(unit([]));
    expect(summary.maxWearMm).toBeNull();
    expect(summary.band.band).toBe("unknown");
    expect(JSON.stringify(summary)).not.toMatch(/NaN|Infinity/);
  });
});
