import { createElement } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import { describe, expect, it } from "vitest";
import { RingTable } from "@/components/inspections/ring-table";
import type { InspectionContext } from "@/lib/inspections/context";
import { referredWornGap } from "@/lib/inspections/rules";

// A closed gap read in a worn part of the liner opens by the increase in circumference,
// π × the diameter increase (derived: circumference = π·d); the diameter is first referred to
// 20 °C with the gauging's factor (ISO 1, as for the bore readings).
describe("referredWornGap", () => {
  it("hand-worked: 8.00 mm read where the liner is 640.50 mm, at 20 °C (factor 1)", () => {
    // 8.00 − π × 0.50 = 8.00 − 1.570796 = 6.429204
    expect(referredWornGap(640, 8, 640.5, 1)).toBeCloseTo(6.429204, 6);
  });

  it("hand-worked: the same reading with a factor of 0.9999 to 20 °C", () => {
    // 640.50 × 0.9999 = 640.43595; increase 0.43595; 8.00 − π × 0.43595 = 8.00 − 1.369577 = 6.630423
    expect(referredWornGap(640, 8, 640.5, 0.9999)).toBeCloseTo(6.630423, 5);
  });

  it("no figure for a diameter under the nominal bore, or a missing one", () => {
    expect(referredWornGap(640, 8, 639.9, 1)).toBeNull();
    expect(referredWornGap(640, null, 640.5, 1)).toBeNull();
    expect(referredWornGap(640, 8, null, 1)).toBeNull();
  });
});

const profile = {
  id: 1, name: "Test 600", designation: "T-600", boreMm: 600, linerWearLimitMm: 3.6, ovalityLimitMm: 1.2, wearReference: "nominal", temperatureCorrection: true,
  alphaLinerPerK: 10.5e-6, alphaGaugePerK: 11.5e-6, runningInHours: 3000, minPointsForProjection: 3,
  axes: [{ key: "fa", label: "Fore–aft" }, { key: "ath", label: "Athwartships" }],
  stations: [{ id: 1, key: "s1", label: "Top", depthMm: 40, role: "unworn_top" }],
  rings: [{ position: 1, label: "Ring 1", gapNewMinMm: 3.2, gapNewMaxMm: 3.8, gapLimitMm: 6.5, grooveNewMinMm: 0.4, grooveNewMaxMm: 0.5, grooveLimitMm: 0.9 }],
  rodNutPressureBar: null,
} as unknown as InspectionContext["profile"];

describe("the sheet's ring table judges a worn-liner gap as the server does", () => {
  it("refers the liner diameter to 20 °C before taking the increase off the gap", () => {
    // Read cold: 600.30 mm at a factor of 0.9995 is 599.99985 mm at 20 °C, within the gauge's
    // 0.01 mm of nominal, so nothing comes off and 7.00 mm is over the 6.5 mm limit. Taking the
    // raw 0.30 mm off (7.00 − 0.94 = 6.06 mm) called the ring merely worn.
    const html = renderToStaticMarkup(
      createElement(RingTable, {
        profile,
        rings: { 1: { closedGap: "7.00", gapMeasuredIn: "liner_worn", gapLinerDiameter: "600.30", groove: "0.45", renewed: false, condition: "" } },
        correctionFactor: 0.9995,
        onChange: () => undefined,
      } as Parameters<typeof RingTable>[0]),
    );
    expect(html).toContain("at or over the limit");
    expect(html).toContain("7.00 − π × 0.00 mm at 20 °C");
  });
});
