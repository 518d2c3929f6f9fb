import fc from "fast-check";
import { describe, expect, test } from "vitest";
import { analyseRings } from "@/lib/rings/rings";
import { BAND_LABELS, unitBand } from "@/lib/wear/bands";
import { analyseLiner } from "@/lib/wear/liner";
import { allNumbersFinite } from "../data/finite";
import { RINGS, inspectionAt, readingsFor, testProfile } from "../data/profile";

const profile = testProfile();
const SCATTER = [0.01, -0.015, 0.02, -0.005, 0.0, -0.02];
const steadyAt = (rate: number, start = 0.2, hours = [4000, 8000, 12_000, 16_000, 20_000, 24_000]) =>
  hours.map((h, i) => inspectionAt(h, start + (rate * h) / 1000 + SCATTER[i]));
const band = (inspections: ReturnType<typeof steadyAt>, extra: Omit<Parameters<typeof unitBand>[0], "profile" | "liner"> = {}) =>
  unitBand({ profile, liner: analyseLiner(profile, inspections), ...extra });

describe("unitBand", () => {
  test("labels are our own plain words", () => {
    expect(BAND_LABELS).toEqual({
      over_limit: "Over limit",
      renew_before_next: "Renew before next overhaul",
      watch: "Watch",
      steady: "Steady",
      unknown: "Too few readings",
    });
  });

  test("a normal rate of 0.035 mm/1000 h far from the limit is steady ([src] BrightHub: normal 0.025–0.05)", () => {
    const b = band(steadyAt(0.035), { nextOverhaul: { hoursAhead: 14_000 } });
    expect(b.band).toBe("steady");
    expect(b.label).toBe("Steady");
    expect(b.reasons[0]).toMatch(/^Wear \d\.\d\d mm, rising 0\.03\d mm\/1000 h; projected to reach its limit/);
  });

  test("a rate above 0.1 mm/1000 h is watched ([src] marineengineeringonline.com: abnormal above 0.1)", () => {
    const b = band(steadyAt(0.12), { nextOverhaul: { hoursAhead: 8000 } });
    expect(b.band).toBe("watch");
    expect(b.reasons.join(" ")).toMatch(/above the 0\.100 mm\/1000 h usually taken as abnormal/);
  });

  test("fast wear while running in is not by itself a reason to watch", () => {
    const b = band([inspectionAt(500, 0.1), inspectionAt(2500, 0.4)]); // 0.15 mm/1000 h, all before 3000 h
    expect(b.band).toBe("unknown");
    expect(b.reasons.join(" ")).not.toMatch(/abnormal/);
  });

  test("wear past 80 % of the limit is watched (80 %: common practice, no published source)", () => {
    const b = band(steadyAt(0.01, 4.3), { nextOverhaul: { hoursAhead: 8000 } });
    expect(b.band).toBe("watch");
    expect(b.reasons.join(" ")).toMatch(/past 80 % of its 5\.40 mm limit/);
  });

  test("projected to reach the limit before the next overhaul", () => {
    // About 0.05 mm/1000 h from 4.4 mm at 24 000 h: the limit at about 44 000 h.
    const b = band(steadyAt(0.05, 3.2), { nextOverhaul: { engineHours: 50_000 + 24_000 + 30_000 } });
    expect(b.band).toBe("renew_before_next");
    expect(b.label).toBe("Renew before next overhaul");
    expect(b.reasons[0]).toMatch(/before the next overhaul in 30,000 h/);
    expect(b.reasons.join(" ")).toMatch(/past 80 %/);
  });

  test("the early end of the interval before the next overhaul is enough", () => {
    const liner = analyseLiner(profile, steadyAt(0.05, 3.2));
    const p = liner.wear.projection;
    if (p.kind !== "projected") throw new Error("expected a projection");
    const ahead = (p.lowerHours! + p.atLinerHours) / 2 - 24_000;
    const b = unitBand({ profile, liner, nextOverhaul: { hoursAhead: ahead } });
    expect(b.band).toBe("renew_before_next");
    expect(b.reasons[0]).toMatch(/early end of its 95 % interval/);
  });

  test("wear over the limit now", () => {
    const b = band([inspectionAt(60_000, 5.0), inspectionAt(70_000, 5.5)]);
    expect(b.band).toBe("over_limit");
    expect(b.reasons[0]).toBe("Wear 5.50 mm is at or over its 5.40 mm limit.");
  });

  test("ovality over the limit now", () => {
    const b = band([inspectionAt(6_000, 0.5, { readings: readingsFor(0.5, 1.1) })]);
    expect(b.band).toBe("over_limit");
    expect(b.reasons[0]).toMatch(/^Ovality 1\.10 mm/);
  });

  test("a ring over its limit puts the unit over limit; a flagged ring is watched", () => {
    const liner = analyseLiner(profile, steadyAt(0.035));
    const over = analyseRings(RINGS, { inspectionId: "x", engineHours: 74_000, readings: [
      { position: 1, closedGapMm: 6.2, gapMeasuredIn: "gauge_ring", grooveClearanceMm: 0.6, renewed: false },
    ] });
    expect(unitBand({ profile, liner, rings: over }).band).toBe("over_limit");
    const flagged = analyseRings(
      RINGS,
      { inspectionId: "y", engineHours: 74_000, readings: [{ position: 1, closedGapMm: 5.6, gapMeasuredIn: "gauge_ring", grooveClearanceMm: 0.6, renewed: false }] },
      [{ inspectionId: "z", engineHours: 64_000, readings: [{ position: 1, closedGapMm: 3.2, gapMeasuredIn: "gauge_ring", grooveClearanceMm: 0.55, renewed: true }] }],
      { hoursToNextOverhaul: 12_000 },
    );
    const b = unitBand({ profile, liner, rings: flagged });
    expect(b.band).toBe("watch");
    expect(b.reasons[0]).toMatch(/^Ring 1 closed gap is growing/);
  });

  test.each([
    ["no inspections", [], "No usable liner readings yet."],
    ["two readings past running-in", [inspectionAt(5000, 0.3), inspectionAt(9000, 0.4)], "A projection needs 3 readings past running-in; there are 2."],
  ])("too few readings: %s", (_name, inspections, reason) => {
    const b = band(inspections);
    expect(b.band).toBe("unknown");
    expect(b.label).toBe("Too few readings");
    expect(b.reasons).toContain(reason);
  });
});

describe("no NaN, Infinity or exception reaches the caller", () => {
  const anyNumber = fc.oneof(fc.double(), fc.constantFrom(NaN, Infinity, -Infinity, 0, -1), fc.double({ min: 899, max: 906, noNaN: true }));
  const reading = fc.record({ stationKey: fc.constantFrom("s1", "s2", "s3", "s4", "zz"), axisKey: fc.constantFrom("fa", "ath", "x"), diameterMm: anyNumber });
  const inspection = fc.record({
    id: fc.string({ maxLength: 4 }),
    date: fc.constantFrom("2020-01-01", "2021-06-30", "2022-02-29", "garbage", "2023-12-31"),
    engineHours: anyNumber,
    linerHours: fc.oneof(anyNumber, fc.integer({ min: 0, max: 90_000 })),
    gaugeTempC: fc.option(anyNumber),
    linerTempC: fc.option(anyNumber),
    readings: fc.array(reading, { maxLength: 16 }),
  });

  test("property: fuzzed inspections give finite numbers and plain reasons", () => {
    fc.assert(
      fc.property(fc.array(inspection, { maxLength: 8 }), fc.boolean(), anyNumber, (inspections, correction, ahead) => {
        const p = testProfile({ temperatureCorrection: correction });
        const liner = analyseLiner(p, inspections);
        expect(allNumbersFinite(liner)).toBe(true);
        const b = unitBand({ profile: p, liner, nextOverhaul: { hoursAhead: ahead } });
        expect(b.reasons.join(" ")).not.toMatch(/NaN|Infinity|undefined/);
      }),
      { numRuns: 200 },
    );
  });
});
