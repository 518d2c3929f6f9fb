import { describe, expect, it } from "vitest";
import { approvalFigures } from "@/lib/inspections/approval";

// Worked by hand (derived): 0.3 mm more wear over 6000 liner hours is 0.05 mm/1000 h, within the
// 0.025–0.05 mm/1000 h normal range for slow-speed two-strokes (BrightHub Engineering); from
// 2.1 mm to a 3.6 mm limit is 1.5 mm, 30 000 h at that rate; at 20 h a day that is 1500 days.
const log = [
  { date: "2026-01-01", engineHours: 40_000 },
  { date: "2026-11-27", engineHours: 46_600 }, // 330 days at 20 h a day
];

describe("approvalFigures", () => {
  it("gives the max wear, the interval rate, the limit date at that rate and the open cautions", () => {
    const f = approvalFigures({
      wearLimitMm: 3.6,
      inspectedOn: "2026-11-27",
      linerHours: 26_000,
      maxWear: { wearMm: 2.1, at: "Ring 1 TDC" },
      previous: { maxWearMm: 1.8, linerHours: 20_000, inspectedOn: "2026-01-01" },
      hoursLog: log,
      cautions: [{ message: "Ring 1: closed gap at or over the limit." }],
    });
    expect(f.rateMmPer1000h).toBeCloseTo(0.05, 10);
    expect(f.limitDate).toBe("2031-01-05"); // 2026-11-27 + 1500 days
    expect(f.limitText).toMatch(/30,000 running hours, around 2031-01-05/);
    expect(f.cautions).toEqual(["Ring 1: closed gap at or over the limit."]);
  });
  it("says plainly when there is no date", () => {
    const base = { wearLimitMm: 3.6, inspectedOn: "2026-11-27", linerHours: 26_000, hoursLog: log, cautions: [] };
    expect(approvalFigures({ ...base, maxWear: { wearMm: 2.1, at: "x" }, previous: null }).limitText).toMatch(/first gauging/);
    expect(approvalFigures({ ...base, maxWear: { wearMm: 3.7, at: "x" }, previous: null }).limitText).toMatch(/at or over its wear limit now/);
    expect(approvalFigures({ ...base, maxWear: { wearMm: 1.7, at: "x" }, previous: { maxWearMm: 1.8, linerHours: 20_000, inspectedOn: "2026-01-01" } }).limitText).toMatch(/did not rise/);
  });
});
