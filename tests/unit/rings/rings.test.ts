import { describe, expect, test } from "vitest";
import type { RingInspection, RingReading } from "@/lib/rings/rings";
import { analyseRings, gapLinerIncrease, normaliseClosedGap, ringState } from "@/lib/rings/rings";
import { correctTo20C } from "@/lib/wear/correction";
import { RINGS } from "../data/profile";

const reading = (overrides: Partial<RingReading> = {}): RingReading => ({
  position: 1,
  closedGapMm: 3.3,
  gapMeasuredIn: "gauge_ring",
  grooveClearanceMm: 0.55,
  renewed: false,
  ...overrides,
});
const at = (engineHours: number, readings: RingReading[], id = `r${engineHours}`): RingInspection => ({ inspectionId: id, engineHours, readings });

describe("normaliseClosedGap", () => {
  test.each([
    [4.0, "gauge_ring", undefined, 4.0, "gauge_ring"],
    [4.0, "liner_unworn", undefined, 4.0, "gauge_ring"],
    // [derived] a ring in a bore worn 0.5 mm opens by π × 0.5 = 1.5708 mm
    [5.5708, "liner_worn", 0.5, 5.5708 - Math.PI * 0.5, "gauge_ring"],
    [5.0, "liner_worn", null, 5.0, "as_measured"],
  ] as const)("%d mm measured in %s (ΔD %s)", (measured, where, dd, gap, basis) => {
    const r = normaliseClosedGap(measured, where, dd);
    expect(r.gapMm).toBeCloseTo(gap, 12);
    expect(r.basis).toBe(basis);
  });
});

describe("the liner diameter where a gap was read in a worn part", () => {
  test("a negative increase does not enlarge the gap: it is used as measured", () => {
    // [derived] before, −0.3 mm gave 5.0 + π × 0.3 = 5.94 mm, a gap larger than the one read.
    expect(normaliseClosedGap(5.0, "liner_worn", -0.3)).toEqual({ gapMm: 5.0, basis: "as_measured" });
  });

  test("a diameter under the nominal bore is refused with a plain reason", () => {
    const r = gapLinerIncrease(900, 899.7);
    expect(r.kind).toBe("invalid");
    if (r.kind === "invalid") expect(r.message).toMatch(/under the 900\.00 mm nominal bore/);
    // Within the gauge's 0.01 mm it counts as nominal.
    expect(gapLinerIncrease(900, 899.995)).toEqual({ kind: "ok", increaseMm: 0 });
    expect(gapLinerIncrease(900, null)).toEqual({ kind: "none" });
  });

  test("it is referred to 20 °C with the inspection's factor, like the bore readings", () => {
    // [derived] D20 = R(1 + αg(Tg − 20)) / (1 + αl(Tl − 20)) with αg = 11.5e-6 at 24 °C and αl = 10.5e-6 at 45 °C.
    const factor = correctTo20C(1, 11.5e-6, 24, 10.5e-6, 45);
    const r = gapLinerIncrease(900, 900.6, factor);
    expect(r.kind).toBe("ok");
    if (r.kind === "ok") expect(r.increaseMm).toBeCloseTo((900.6 * (1 + 11.5e-6 * 4)) / (1 + 10.5e-6 * 25) - 900, 12);
    // Read raw, the warm liner's 0.6 mm would be taken as about 0.41 mm more wear than there is.
    if (r.kind === "ok") expect(r.increaseMm).toBeLessThan(0.45);
  });

  test("the ring analysis reports an under-nominal diameter and keeps the gap as read", () => {
    const { rings, issues } = analyseRings(RINGS.slice(0, 1), at(20_000, [reading({ closedGapMm: 5.0, gapMeasuredIn: "liner_worn", linerDiameterIncreaseMm: -0.3 })]));
    expect(rings[0].gap!.valueMm).toBe(5.0);
    expect(issues).toContainEqual(expect.objectContaining({ kind: "invalid_value", position: 1 }));
  });
});

describe("ringState against the new range and limit", () => {
  // Groove clearance of the test profile's top ring: new 0.50–0.58 mm, limit 1.00 mm. Invented
  // test figures (see tests/unit/data/profile.ts), not any maker's; the states follow from them.
  test.each([
    [0.45, "below_new_range"],
    [0.5, "within_new_range"],
    [0.58, "within_new_range"],
    [0.7, "worn"],
    [1.0, "at_or_over_limit"],
    [1.2, "at_or_over_limit"],
  ] as const)("%d mm is %s", (v, state) => {
    expect(ringState(v, 0.5, 0.58, 1.0)).toBe(state);
  });
});

describe("analyseRings", () => {
  test("growth per 1000 h since renewal and hours left to the limit", () => {
    const history = [
      at(10_000, [reading({ closedGapMm: 5.5, renewed: false })]),
      at(20_000, [reading({ closedGapMm: 3.2, grooveClearanceMm: 0.52, renewed: true })]),
      at(28_000, [reading({ closedGapMm: 3.6, grooveClearanceMm: 0.56 })]),
    ];
    const current = at(36_000, [reading({ closedGapMm: 4.0, grooveClearanceMm: 0.6 })]);
    const { rings, issues } = analyseRings(RINGS.slice(0, 1), current, history);
    expect(issues).toEqual([]);
    const [r] = rings;
    // [derived] 3.2 → 4.0 mm over 16 000 h = 0.05 mm/1000 h; (6.0 − 4.0)/0.05 × 1000 = 40 000 h left
    expect(r.gap!.growthMmPer1000h).toBeCloseTo(0.05, 10);
    expect(r.gap!.hoursToLimit).toBeCloseTo(40_000, 6);
    expect(r.gap!.state).toBe("worn");
    expect(r.groove!.growthMmPer1000h).toBeCloseTo(0.005, 10);
    expect(r.renew).toBe(false);
  });

  test("a ring renewed at this inspection has no growth yet", () => {
    const { rings } = analyseRings(RINGS.slice(0, 1), at(36_000, [reading({ renewed: true })]), [at(20_000, [reading({ closedGapMm: 5 })])]);
    expect(rings[0].gap!.growthMmPer1000h).toBeNull();
    expect(rings[0].gap!.hoursToLimit).toBeNull();
  });

  test("gap measured in a worn part of the liner is normalised before comparing with the limit", () => {
    const { rings } = analyseRings(RINGS.slice(0, 1), at(30_000, [reading({ closedGapMm: 7.0, gapMeasuredIn: "liner_worn", linerDiameterIncreaseMm: 1.0 })]));
    expect(rings[0].gap!.valueMm).toBeCloseTo(7.0 - Math.PI, 12);
    expect(rings[0].gap!.measuredMm).toBe(7.0);
    expect(rings[0].gap!.state).toBe("worn");
    expect(rings[0].overLimit).toBe(false);
  });

  test.each([
    ["closed gap at its limit", reading({ closedGapMm: 6.0 }), /closed gap 6\.00 mm is at or over its 6\.00 mm limit/],
    ["groove clearance over its limit", reading({ grooveClearanceMm: 1.05 }), /groove clearance 1\.05 mm is at or over/],
  ])("renew when the %s", (_name, r, reason) => {
    const { rings } = analyseRings(RINGS.slice(0, 1), at(30_000, [r]));
    expect(rings[0].overLimit).toBe(true);
    expect(rings[0].renew).toBe(true);
    expect(rings[0].reasons.join(" ")).toMatch(reason);
  });

  test("renew when the limit will be reached before the next overhaul", () => {
    const history = [at(20_000, [reading({ closedGapMm: 3.2, renewed: true })])];
    const current = at(30_000, [reading({ closedGapMm: 5.2 })]);
    // [derived] 0.2 mm/1000 h, 0.8 mm to go → 4 000 h, before an overhaul 12 000 h ahead
    const { rings } = analyseRings(RINGS.slice(0, 1), current, history, { hoursToNextOverhaul: 12_000 });
    expect(rings[0].gap!.hoursToLimit).toBeCloseTo(4000, 6);
    expect(rings[0].overLimit).toBe(false);
    expect(rings[0].renew).toBe(true);
    expect(rings[0].reasons[0]).toMatch(/before the next overhaul/);
  });

  test("typed issues for unknown, duplicate, missing and invalid readings", () => {
    const current = at(30_000, [
      reading({ position: 7 }),
      reading({ position: 1, closedGapMm: NaN }),
      reading({ position: 1 }),
      reading({ position: 1, gapMeasuredIn: "liner_worn", closedGapMm: 4 }),
    ]);
    const { rings, issues } = analyseRings(RINGS, current);
    expect(issues.map((i) => i.kind).sort()).toEqual(["duplicate_reading", "duplicate_reading", "invalid_value", "not_measured", "unknown_position"]);
    expect(rings[0].gap).toBeNull();
    expect(rings[0].groove!.valueMm).toBe(0.55);
    expect(rings[1].gap).toBeNull();
  });

  test("gap in a worn liner without the diameter there is used as measured, with an issue", () => {
    const { rings, issues } = analyseRings(RINGS.slice(0, 1), at(30_000, [reading({ gapMeasuredIn: "liner_worn", closedGapMm: 4 })]));
    expect(rings[0].gap).toMatchObject({ valueMm: 4, basis: "as_measured" });
    expect(issues.map((i) => i.kind)).toEqual(["gap_not_normalised"]);
  });

  test("a gap under the new range is questioned", () => {
    const { rings } = analyseRings(RINGS.slice(0, 1), at(30_000, [reading({ closedGapMm: 2.5 })]));
    expect(rings[0].gap!.state).toBe("below_new_range");
    expect(rings[0].renew).toBe(false);
    expect(rings[0].reasons[0]).toMatch(/under the new range/);
  });
});
