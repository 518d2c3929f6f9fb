import fc from "fast-check";
import { describe, expect, test } from "vitest";
import { outlierCriticalValue } from "@/lib/stats/regression";
import { analyseLiner } from "@/lib/wear/liner";
import { allNumbersFinite } from "../data/finite";
import { inspectionAt, readingsFor, testProfile } from "../data/profile";

const profile = testProfile();
/** A small fixed scatter, as a real gauge gives (±0.02 mm). */
const SCATTER = [0.01, -0.015, 0.02, -0.005, 0.0, -0.02, 0.015, -0.01, 0.005, 0.01, -0.01, 0.0];

/** Running-in fast (0.2 mm by 2000 h), then steady at `ratePer1000h`. */
function history(ratePer1000h: number, steadyHours = [4000, 8000, 12_000, 16_000, 20_000, 24_000, 28_000]) {
  return [
    inspectionAt(1000, 0.12),
    inspectionAt(2000, 0.2),
    ...steadyHours.map((h, i) => inspectionAt(h, 0.2 + (ratePer1000h * (h - 2000)) / 1000 + SCATTER[i % SCATTER.length])),
  ];
}

describe("analyseLiner", () => {
  test("a liner wearing a normal 0.035 mm/1000 h ([src] BrightHub: 0.025–0.05 for slow-speed two-strokes)", () => {
    const a = analyseLiner(profile, history(0.035));
    expect(a.issues).toEqual([]);
    expect(a.points).toHaveLength(9);
    expect(a.points.filter((p) => p.steady)).toHaveLength(7);
    expect(a.wear.trend!.n).toBe(7);
    expect(a.wear.trend!.slopeMmPer1000h).toBeCloseTo(0.035, 2);
    expect(a.wear.trend!.rSquared).toBeGreaterThan(0.99);
    expect(a.wear.trend!.residualSdMm).toBeLessThan(0.03);
    const p = a.wear.projection;
    expect(p.kind).toBe("projected");
    if (p.kind !== "projected") return;
    // [derived] 0.2 + 0.035 (h − 2000)/1000 = 5.4  →  h ≈ 150 600
    expect(p.atLinerHours).toBeGreaterThan(140_000);
    expect(p.atLinerHours).toBeLessThan(162_000);
    expect(p.lowerHours!).toBeLessThan(p.atLinerHours);
    expect(p.upperHours!).toBeGreaterThan(p.atLinerHours);
    expect(p.hoursRemaining).toBeCloseTo(p.atLinerHours - 28_000, 6);
    expect(a.wear.trend!.fit.slope * (p.atLinerHours - a.wear.trend!.fit.xMean) + a.wear.trend!.fit.yMean).toBeCloseTo(5.4, 9);
  });

  test("the running-in readings are left out of the steady fit", () => {
    const withRunIn = analyseLiner(profile, history(0.035));
    const withoutRunIn = analyseLiner(profile, history(0.035).slice(2));
    expect(withRunIn.wear.trend!.slopeMmPer1000h).toBe(withoutRunIn.wear.trend!.slopeMmPer1000h);
  });

  test("input order does not matter", () => {
    const h = history(0.04);
    const a = analyseLiner(profile, h);
    const b = analyseLiner(profile, [...h].reverse());
    expect(b.points).toEqual(a.points);
    expect(b.wear.projection).toEqual(a.wear.projection);
  });

  test("last-interval rate in mm per 1000 h", () => {
    const a = analyseLiner(profile, [inspectionAt(10_000, 0.5), inspectionAt(14_000, 0.7)]);
    // [derived] (0.7 − 0.5) × 1000 / 4000 = 0.05
    expect(a.lastIntervalRate!.mmPer1000h).toBeCloseTo(0.05, 10);
    expect(a.lastIntervalRate!.steady).toBe(true);
  });

  test.each([
    ["no inspections", [], 0],
    ["only running-in and one steady point", [inspectionAt(1000, 0.1), inspectionAt(2000, 0.2), inspectionAt(5000, 0.3)], 1],
    ["two steady points", [inspectionAt(5000, 0.3), inspectionAt(9000, 0.45)], 2],
  ])("insufficient data: %s", (_name, inspections, have) => {
    const a = analyseLiner(profile, inspections);
    expect(a.wear.projection).toEqual({ kind: "insufficient_data", needed: 3, have });
  });

  test("a profile asking for more points is honoured", () => {
    const a = analyseLiner(testProfile({ minPointsForProjection: 5 }), history(0.035, [4000, 8000, 12_000, 16_000]));
    expect(a.wear.projection).toEqual({ kind: "insufficient_data", needed: 5, have: 4 });
    expect(a.wear.trend).not.toBeNull();
  });

  test("steady readings all at the same hours cannot be fitted", () => {
    const a = analyseLiner(profile, [inspectionAt(5000, 0.3), inspectionAt(5000, 0.31, { date: "2020-01-02" }), inspectionAt(5000, 0.32, { date: "2020-01-03" })]);
    expect(a.wear.projection).toEqual({ kind: "insufficient_data", needed: 3, have: 1 });
  });

  test("wear not rising is not projected", () => {
    const a = analyseLiner(profile, [inspectionAt(5000, 0.5), inspectionAt(9000, 0.49), inspectionAt(13_000, 0.5), inspectionAt(17_000, 0.48)]);
    expect(a.wear.projection.kind).toBe("not_wearing");
  });

  test("wear at or over the limit now", () => {
    const a = analyseLiner(profile, [inspectionAt(60_000, 5.0), inspectionAt(70_000, 5.45)]);
    expect(a.wear.projection).toMatchObject({ kind: "already_over", limitMm: 5.4, linerHours: 70_000 });
  });

  test("ovality is projected to its own limit", () => {
    const hours = [4000, 8000, 12_000, 16_000, 20_000];
    const a = analyseLiner(profile, hours.map((h, i) => inspectionAt(h, 0.2 + h / 40_000, { readings: readingsFor(0.2 + h / 40_000, h / 40_000 + SCATTER[i] / 4) })));
    const p = a.ovality.projection;
    expect(p.kind).toBe("projected");
    // [derived] ovality = h / 40 000 reaches 1.0 mm at about 40 000 h
    if (p.kind === "projected") expect(p.atLinerHours).toBeCloseTo(40_000, -3);
  });

  test("an outlier past the Bonferroni bound is flagged, reported and kept in the fit", () => {
    const steady = [4000, 6000, 8000, 10_000, 12_000, 14_000, 16_000, 18_000, 20_000, 22_000, 24_000, 26_000];
    const inspections = steady.map((h, i) => inspectionAt(h, 0.2 + (0.04 * h) / 1000 + SCATTER[i] / 4 + (h === 14_000 ? 0.3 : 0)));
    const a = analyseLiner(profile, inspections);
    const outlier = a.points.find((p) => p.linerHours === 14_000)!;
    expect(outlier.wearOutlier).toBe(true);
    expect(Math.abs(outlier.wearResidual!)).toBeGreaterThan(outlierCriticalValue(12)!);
    expect(a.wear.outlierInspectionIds).toEqual([outlier.inspectionId]);
    expect(a.wear.trend!.n).toBe(12);
    expect(a.issues).toContainEqual(expect.objectContaining({ kind: "outlier", inspectionId: outlier.inspectionId }));
    expect(a.points.filter((p) => p.wearOutlier)).toHaveLength(1);
  });

  test.each([5, 6, 7, 8])("%d gaugings past running-in with one gross error (+0.30 mm): that one is flagged", (n) => {
    // Invented history: 0.035 mm/1000 h with a gauge's scatter; the third gauging carries a slipped digit.
    const hours = Array.from({ length: n }, (_, i) => 4000 + 3000 * i);
    const inspections = hours.map((h, i) => inspectionAt(h, 0.2 + (0.035 * h) / 1000 + SCATTER[i] + (i === 2 ? 0.3 : 0)));
    const a = analyseLiner(profile, inspections);
    expect(a.points.filter((p) => p.wearOutlier).map((p) => p.linerHours)).toEqual([hours[2]]);
    expect(a.issues.filter((i) => i.kind === "outlier")).toHaveLength(1);
    // The flag rests on the deleted residual, recomputed here without the library: refit the
    // other n − 1 points by hand and divide the miss at the third point by its standard error.
    const pts = a.points.map((p) => ({ x: p.linerHours, y: p.maxWearMm! }));
    const rest = pts.filter((_, j) => j !== 2);
    const xb = rest.reduce((s, p) => s + p.x, 0) / rest.length;
    const yb = rest.reduce((s, p) => s + p.y, 0) / rest.length;
    const sxx = rest.reduce((s, p) => s + (p.x - xb) ** 2, 0);
    const b1 = rest.reduce((s, p) => s + (p.x - xb) * (p.y - yb), 0) / sxx;
    const s2 = Math.max(Math.sqrt(rest.reduce((s, p) => s + (p.y - yb - b1 * (p.x - xb)) ** 2, 0) / (rest.length - 2)), 0.01);
    const t = (pts[2].y - yb - b1 * (pts[2].x - xb)) / (s2 * Math.sqrt(1 + 1 / rest.length + (pts[2].x - xb) ** 2 / sxx));
    expect(a.points[2].wearResidual!).toBeCloseTo(t, 8);
  });

  test("a clean scattered history of five gaugings flags nothing", () => {
    const hours = [4000, 7000, 10_000, 13_000, 16_000];
    const a = analyseLiner(profile, hours.map((h, i) => inspectionAt(h, 0.2 + (0.035 * h) / 1000 + SCATTER[i])));
    expect(a.points.some((p) => p.wearOutlier)).toBe(false);
  });

  test("three readings on a perfect line still give an interval as wide as the gauge allows", () => {
    const a = analyseLiner(profile, [inspectionAt(10_000, 0.55), inspectionAt(20_000, 0.9), inspectionAt(30_000, 1.25)]);
    expect(a.wear.trend!.residualSdMm).toBe(0.01); // the default 0.01 mm gauge resolution (common practice)
    const p = a.wear.projection;
    expect(p.kind).toBe("projected");
    if (p.kind !== "projected") return;
    // [derived] 0.55 + 0.035 (h − 10 000)/1000 = 5.4 → h ≈ 148 571; a ±0.01 mm band cannot pin it to a few hours.
    expect(p.atLinerHours).toBeCloseTo(148_571.43, 0);
    expect(p.upperHours! - p.lowerHours!).toBeGreaterThan(1000);
  });

  test("a profile's own gauge resolution sets the floor", () => {
    const a = analyseLiner(testProfile({ gaugeResolutionMm: 0.002 }), [inspectionAt(10_000, 0.55), inspectionAt(20_000, 0.9), inspectionAt(30_000, 1.25)]);
    expect(a.wear.trend!.residualSdMm).toBe(0.002);
  });

  test("a gauging at 0 liner hours, the liner as fitted, enters the history", () => {
    const a = analyseLiner(profile, [inspectionAt(0, 0), inspectionAt(8000, 0.4), inspectionAt(12_000, 0.55)]);
    expect(a.issues.filter((i) => i.kind === "invalid_hours")).toEqual([]);
    expect(a.points.map((p) => p.linerHours)).toEqual([0, 8000, 12_000]);
    expect(a.points[0].steady).toBe(false);
  });

  test("negative hours and hours falling while dates advance are typed issues", () => {
    const a = analyseLiner(profile, [
      inspectionAt(0, 0, { date: "2019-01-01" }),
      inspectionAt(-5, 0.1, { date: "2019-02-01" }),
      inspectionAt(8000, 0.4, { date: "2020-01-01" }),
      inspectionAt(6000, 0.45, { date: "2021-01-01" }),
      inspectionAt(NaN, 0.5, { date: "2021-06-01" }),
      inspectionAt(12_000, 0.6, { date: "not a date" }),
    ]);
    const kinds = a.issues.map((i) => i.kind);
    expect(kinds.filter((k) => k === "invalid_hours")).toHaveLength(2);
    expect(kinds).toContain("hours_not_increasing");
    expect(kinds).toContain("invalid_date");
    expect(a.points.map((p) => p.linerHours)).toEqual([0, 8000, 6000]);
    expect(a.lastIntervalRate).toBeNull();
    expect(allNumbersFinite(a)).toBe(true);
  });

  test("a gauging whose largest reading was judged impossible is marked, not silently shown with the next-largest", () => {
    const bad = inspectionAt(12_000, 0.6);
    // 990 mm in a 900 mm bore: far over the nominal, a typing error left out of the maxima.
    bad.readings = bad.readings.map((r) => (r.stationKey === "s2" && r.axisKey === "fa" ? { ...r, diameterMm: 990 } : r));
    const a = analyseLiner(profile, [inspectionAt(8000, 0.4), bad]);
    const p = a.points.find((pt) => pt.inspectionId === bad.id)!;
    expect(p.maxWearExcluded).toBe(true);
    expect(p.excludedReadings).toEqual([expect.objectContaining({ stationKey: "s2", axisKey: "fa", correctedMm: 990 })]);
    expect(p.maxWearMm).toBeCloseTo(0.6, 10); // the athwartships cell at the same station
    expect(a.points[0].maxWearExcluded).toBe(false);
  });

  test("asOf leaves out later inspections", () => {
    const h = history(0.035);
    const a = analyseLiner(profile, h, { asOf: h[4].date });
    expect(a.points).toHaveLength(5);
    expect(a.latest!.inspectionId).toBe(h[4].id);
  });

  test("an invalid profile is reported, not thrown", () => {
    const a = analyseLiner(testProfile({ linerWearLimitMm: 0 }), history(0.035));
    expect(a.issues[0].kind).toBe("invalid_profile");
    expect(a.wear.projection.kind).toBe("insufficient_data");
  });

  test("property: a lower wear rate projects the limit later", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.01, max: 0.05, noNaN: true }),
        fc.double({ min: 1.05, max: 3, noNaN: true }),
        fc.array(fc.double({ min: -0.01, max: 0.01, noNaN: true }), { minLength: 5, maxLength: 5 }),
        (slow, factor, noise) => {
          const hours = [4000, 6500, 9000, 11_500, 14_000];
          const at = (rate: number) => {
            const a = analyseLiner(profile, hours.map((h, i) => inspectionAt(h, 0.1 + (rate * h) / 1000 + noise[i])));
            return a.wear.projection;
          };
          const a = at(slow);
          const b = at(slow * factor);
          expect(a.kind).toBe("projected");
          expect(b.kind).toBe("projected");
          if (a.kind === "projected" && b.kind === "projected") expect(a.atLinerHours).toBeGreaterThan(b.atLinerHours);
        },
      ),
      { numRuns: 60 },
    );
  });
});
