import { describe, expect, it } from "vitest";
import type { InspectionContext } from "@/lib/inspections/context";
import { emptyRing, fromDraft, swapDirections, toDraft } from "@/lib/inspections/form";
import { openCautions, readingChecks, rodNutCheck, submissionProblems } from "@/lib/inspections/rules";
import type { InspectionDraft } from "@/lib/inspections/schemas";

// An invented 600 mm profile (wear limit 3.6 mm = 0.6 % of the bore, BrightHub Engineering),
// three stations, one ring and a rod nut pressure of 1250 bar (invented demo value).
const profile: InspectionContext["profile"] = {
  id: 1,
  name: "Test 600",
  designation: "T-600",
  boreMm: 600,
  linerWearLimitMm: 3.6,
  ovalityLimitMm: 1.2,
  wearReference: "nominal",
  temperatureCorrection: true,
  alphaLinerPerK: 10.5e-6,
  alphaGaugePerK: 11.5e-6,
  runningInHours: 3000,
  minPointsForProjection: 3,
  axes: [
    { key: "fa", label: "Fore–aft" },
    { key: "ath", label: "Athwartships" },
  ],
  stations: [
    { id: 1, key: "s1", label: "Top", depthMm: 40, role: "unworn_top" },
    { id: 2, key: "s2", label: "Ring 1 TDC", depthMm: 120, role: "ring_tdc" },
    { id: 3, key: "s3", label: "Mid", depthMm: 900, role: "intermediate" },
  ],
  rings: [{ position: 1, label: "Ring 1", gapNewMinMm: 3.2, gapNewMaxMm: 3.8, gapLimitMm: 6.5, grooveNewMinMm: 0.4, grooveNewMaxMm: 0.5, grooveLimitMm: 0.9 }],
  rodNutPressureBar: 1250,
};

const previousReadings = [
  { stationKey: "s1", axisKey: "fa", diameterMm: 600.02 },
  { stationKey: "s1", axisKey: "ath", diameterMm: 600.01 },
  { stationKey: "s2", axisKey: "fa", diameterMm: 601.1 },
  { stationKey: "s2", axisKey: "ath", diameterMm: 600.8 },
  { stationKey: "s3", axisKey: "fa", diameterMm: 600.6 },
  { stationKey: "s3", axisKey: "ath", diameterMm: 600.4 },
];

const ctx: InspectionContext = {
  unit: { id: 1, cylinderNo: 1, engineId: 1, engineSerial: "T-1", vesselId: 1, vesselName: "Test" },
  profile,
  liner: { id: 1, serial: "L1", installedOn: "2024-01-01", installedEngineHours: 10_000, linerHoursAtInstall: 500 },
  previous: { id: 9, inspectedOn: "2026-01-10", engineHours: 30_000, linerHours: 20_500, linerId: 1, gaugeTempC: null, linerTempC: null, readings: previousReadings },
  hoursLog: [],
  asFitted: null,
};

/** A complete, correct record: 0.1 mm more wear everywhere than last time, rings and checklist in. */
function complete(): InspectionDraft {
  return {
    header: { inspectedOn: "2026-12-01", engineHours: 40_000, linerHours: 30_500, linerHoursReason: null, crew: null, gaugeTempC: null, linerTempC: null, notes: null },
    readings: previousReadings.map((r) => ({ ...r, diameterMm: Math.round((r.diameterMm + (r.stationKey === "s1" ? 0 : 0.1)) * 1000) / 1000, enteredUnit: "mm" as const, warningConfirmed: null })),
    rings: [{ position: 1, closedGapMm: 3.5, gapMeasuredIn: "gauge_ring", gapLinerDiameterMm: null, grooveClearanceMm: 0.45, renewed: false, condition: null }],
    checklist: {
      tally: [{ key: "t1", label: "Spanners", countIn: 4, countOut: 4 }],
      closing: { signedName: "A. Engineer", signedAt: "2026-12-01T10:00:00Z" },
      rodNutPressureBar: 1250,
      stuffingBox: { done: true, note: null },
      cylinderLubrication: { done: true, note: null },
    },
  };
}

describe("a complete record", () => {
  it("has no problems and no cautions", () => {
    expect(submissionProblems(ctx, complete())).toEqual([]);
    expect(openCautions(ctx, complete())).toEqual([]);
  });
});

describe("an impossible reading cannot be confirmed into a record", () => {
  it("60.05 typed for 600.05 blocks submission even when marked confirmed", () => {
    const d = complete();
    d.readings[2] = { ...d.readings[2], diameterMm: 60.05, warningConfirmed: "the reading is right" };
    const problems = submissionProblems(ctx, d);
    expect(problems.map((p) => p.field)).toEqual(["readings.s2|fa"]);
    expect(problems[0].message).toMatch(/60\.05 mm is about a tenth of the 600\.00 mm bore/);
  });
  it("a ring gap over five times its limit blocks submission", () => {
    const d = complete();
    d.rings[0].closedGapMm = 35;
    expect(submissionProblems(ctx, d).map((p) => p.field)).toEqual(["rings.1"]);
  });
  it("an unusual but possible reading may be confirmed, and the chief sees the confirmation", () => {
    const d = complete();
    d.readings[2] = { ...d.readings[2], diameterMm: 601.0 }; // 0.1 mm smaller than last time
    expect(submissionProblems(ctx, d).map((p) => p.field)).toEqual(["readings.s2|fa"]);
    d.readings[2].warningConfirmed = readingChecks(ctx, d).cells.get("s2|fa")![0].message;
    expect(submissionProblems(ctx, d)).toEqual([]);
    expect(openCautions(ctx, d).map((c) => c.message)).toEqual([expect.stringMatching(/^Ring 1 TDC fore–aft: confirmed as read: 601\.00 mm is 0\.10 mm smaller/)]);
  });
});

describe("warnings quote what was typed and the value at 20 °C", () => {
  it("typed 599.70 on a warm liner", () => {
    const d = complete();
    d.header.gaugeTempC = 20;
    d.header.linerTempC = 21.5; // factor 1/(1 + 10.5e-6 × 1.5): 599.70 mm reads 599.69 at 20 °C
    d.readings[0] = { ...d.readings[0], diameterMm: 599.7 };
    const [w] = readingChecks(ctx, d).cells.get("s1|fa")!;
    expect(w.message).toMatch(/^599\.70 mm \(599\.69 mm at 20 °C\)/);
  });
});

describe("the same value in every cell", () => {
  it("is one warning for the sheet and one problem, not one per cell", () => {
    const d = complete();
    d.readings = d.readings.map((r) => ({ ...r, diameterMm: 600.5 }));
    const checks = readingChecks(ctx, d);
    expect(checks.sheet.map((f) => f.code)).toEqual(["same_value_everywhere"]);
    for (const list of checks.cells.values()) expect(list.map((f) => f.code)).toEqual(["same_value_everywhere"]);
    const problems = submissionProblems(ctx, d);
    expect(problems).toHaveLength(1);
    expect(problems[0].message).toMatch(/Every cell holds the same value, 600\.50 mm/);
  });
});

describe("swapped directions", () => {
  it("are named, and one swap puts the sheet right", () => {
    const d = complete();
    d.readings = d.readings.map((r) => ({ ...r, axisKey: r.axisKey === "fa" ? "ath" : "fa" }));
    const checks = readingChecks(ctx, d);
    expect(checks.sheet.map((f) => f.code)).toEqual(["directions_swapped"]);
    expect(openCautions(ctx, d).some((c) => /exchanged/.test(c.message))).toBe(true);
    const form = swapDirections(fromDraft(d, profile), profile);
    const { draft: fixed } = toDraft(form, profile, d.header);
    expect(readingChecks(ctx, fixed).sheet).toEqual([]);
    expect(fixed.readings.find((r) => r.stationKey === "s2" && r.axisKey === "fa")!.diameterMm).toBe(601.2);
  });
});

describe("rod nut tightening pressure", () => {
  it("beyond ±10 % of the profile's figure blocks submission; within it is a caution; within 2 % matches", () => {
    expect(rodNutCheck(profile, 1250)).toBeNull();
    expect(rodNutCheck(profile, 1270)).toBeNull(); // +1.6 %
    expect(rodNutCheck(profile, 1200)?.level).toBe("warning"); // −4 %
    expect(rodNutCheck(profile, 1100)?.level).toBe("error"); // −12 %
    const d = complete();
    d.checklist.rodNutPressureBar = 1100;
    expect(submissionProblems(ctx, d).map((p) => p.field)).toEqual(["checklist.rodNutPressureBar"]);
    d.checklist.rodNutPressureBar = 1200;
    expect(submissionProblems(ctx, d)).toEqual([]);
    expect(openCautions(ctx, d).map((p) => p.field)).toEqual(["checklist.rodNutPressureBar"]);
  });
  it("the profile may set its own tolerance", () => {
    expect(rodNutCheck({ ...profile, rodNutTolerancePct: 3 }, 1200)?.level).toBe("error");
    expect(rodNutCheck({ ...profile, rodNutTolerancePct: 15 }, 1100)?.level).toBe("warning");
  });
});

describe("rings: cautions and where the gap was measured", () => {
  it("has no default, and is required once a gap is entered", () => {
    expect(emptyRing.gapMeasuredIn).toBeNull();
    const d = complete();
    d.rings[0].gapMeasuredIn = null;
    expect(submissionProblems(ctx, d).map((p) => p.field)).toEqual(["rings.1.gapMeasuredIn"]);
    expect(fromDraft({ ...d, rings: [] }, profile).rings["1"].gapMeasuredIn).toBeNull();
  });
  it("a gap at the limit is an open caution", () => {
    const d = complete();
    d.rings[0].closedGapMm = 6.6;
    expect(submissionProblems(ctx, d)).toEqual([]);
    expect(openCautions(ctx, d).map((c) => c.message)).toEqual(["Ring 1: closed gap at or over the limit."]);
  });
});

describe("commas in typed numbers are read by the field's expected size", () => {
  it("1,250 bar of rod nut pressure is 1250 bar, 65,950 engine hours are 65 950 h", () => {
    const d = complete();
    d.header.engineHours = 64_000;
    const form = fromDraft(d, profile);
    form.checklist.rodNutPressure = "1,250";
    form.header.engineHours = "65,950";
    form.cells["s2|fa"] = { text: "601,200", unit: "mm", confirmed: null };
    const { draft, invalid } = toDraft(form, profile, d.header);
    expect(invalid).toEqual([]);
    expect(draft.checklist.rodNutPressureBar).toBe(1250);
    expect(draft.header.engineHours).toBe(65_950);
    expect(draft.readings.find((r) => r.stationKey === "s2" && r.axisKey === "fa")!.diameterMm).toBe(601.2);
  });
  it("an ambiguous value with nothing to settle it is kept on the device, not saved", () => {
    const d = complete();
    const form = fromDraft(d, { ...profile, rodNutPressureBar: null });
    form.checklist.rodNutPressure = "35,000"; // neither 35 000 nor 35 bar is near the 1000 bar assumed
    const { invalid } = toDraft(form, { ...profile, rodNutPressureBar: null }, d.header);
    expect(invalid).toEqual(["checklist.rodNutPressureBar"]);
  });
});
