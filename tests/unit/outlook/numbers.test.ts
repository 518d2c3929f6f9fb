import { describe, expect, test } from "vitest";
import type { PredictionFit } from "@/lib/stats/regression";
import type { RunningRate } from "@/lib/wear/calendar";
import {
  budgetByYear,
  exceedProbability,
  horizonEnd,
  nextOverhauls,
  probabilityText,
  ratePercentile,
  reachesRisk,
  recommend,
  renewalCost,
  spareShortfall,
  type StockLine,
} from "@/lib/outlook/numbers";

// A fit on 12 gaugings (10 residual degrees of freedom) with s = 0.02 mm, asked at its own mean
// x, where the leverage is exactly 1/n: the prediction standard error is s·√(1 + 1/12).
const fit12: PredictionFit = { model: "intercept", n: 12, df: 10, intercept: 0, slope: 0.0001, mse: 0.0004, xMean: 5000, sxx: 4e8, sumX2: 0 };
const se12 = 0.02 * Math.sqrt(1 + 1 / 12);
const rate20: RunningRate = { kind: "known", hoursPerDay: 20, fromDate: "2025-01-01", toDate: "2026-01-01", entriesUsed: 27 };

describe("exceedProbability (Student t, n − 2 df)", () => {
  // [src] NIST/SEMATECH e-Handbook of Statistical Methods, 1.3.6.7.2, critical values of
  // Student's t for ν = 10: upper-tail 0.10 → 1.372, 0.05 → 1.812, 0.01 → 2.764 (3 decimals;
  // a rounding of 0.0005 in t moves the tail by under 1e-4 at these points).
  test.each([
    [1.372, 0.1],
    [1.812, 0.05],
    [2.764, 0.01],
  ])("a limit %d prediction standard errors above the line is passed with chance %d", (t, tail) => {
    const e = exceedProbability(fit12, 0.5 + t * se12, 5000);
    expect(e.kind).toBe("probability");
    if (e.kind === "probability") {
      expect(Math.abs(e.p - tail)).toBeLessThan(1e-4);
      expect(e.df).toBe(10);
    }
  });

  test("a limit on the line itself is passed with chance one half (symmetry of t)", () => {
    const e = exceedProbability(fit12, 0.5, 5000);
    expect(e.kind === "probability" && e.p).toBeCloseTo(0.5, 12);
  });

  test("a limit below the line gives the complement (NIST table, ν = 10, 1.812 → 0.95)", () => {
    const e = exceedProbability(fit12, 0.5 - 1.812 * se12, 5000);
    expect(e.kind === "probability" && Math.abs(e.p - 0.95) < 1e-4).toBe(true);
  });

  test("no trend, no degree of freedom or no hours say so in words", () => {
    expect(exceedProbability(null, 1, 5000)).toMatchObject({ kind: "not_enough_data" });
    expect(exceedProbability({ ...fit12, n: 2, df: 0 }, 1, 5000)).toMatchObject({ kind: "not_enough_data" });
    expect(exceedProbability(fit12, 1, null)).toMatchObject({ kind: "not_enough_data" });
    expect(probabilityText({ kind: "not_enough_data", reason: "x" })).toBe("not enough data");
    expect(probabilityText({ kind: "probability", p: 0.123, linerHours: 1, df: 3 })).toBe("12 %");
  });
});

describe("nextOverhauls", () => {
  test("hand-worked: 2,000 h and 10,000 h ahead at 20 h a day from 1 Jan 2026", () => {
    // 2,000 h / 20 h per day = 100 days → 11 Apr 2026; 10,000 h = 500 days → 16 May 2027
    // (365 days to 1 Jan 2027, then 31 + 28 + 31 + 30 + 15).
    const list = nextOverhauls({
      nextOverhaulEngineHours: 52_000,
      intervalHours: 8_000,
      reference: { date: "2026-01-01", engineHours: 50_000, linerHours: 20_000 },
      rate: rate20,
    });
    expect(list).toEqual([
      { ordinal: 1, engineHours: 52_000, linerHours: 22_000, date: "2026-04-11" },
      { ordinal: 2, engineHours: 60_000, linerHours: 30_000, date: "2027-05-16" },
    ]);
  });

  test("no dates without a known running rate; nothing without a next overhaul", () => {
    const list = nextOverhauls({
      nextOverhaulEngineHours: 52_000,
      intervalHours: 8_000,
      reference: { date: "2026-01-01", engineHours: 50_000, linerHours: 20_000 },
      rate: { kind: "unknown", reason: "too_few_entries" },
    });
    expect(list.map((o) => o.date)).toEqual([null, null]);
    expect(nextOverhauls({ nextOverhaulEngineHours: null, intervalHours: 8_000, reference: null, rate: rate20 })).toEqual([]);
  });
});

describe("recommend", () => {
  // Hand-worked: wear = 0.0001 mm/h × liner hours, s = 0.01 mm, 5,000 liner hours on 1 Jan 2026
  // at 20 h a day. Overhauls at day 50 (6,000 h) and day 150 (8,000 h, 0.80 mm expected).
  const fit: PredictionFit = { ...fit12, mse: 0.0001, sxx: 1e12 };
  const base = {
    today: "2026-01-01",
    mustRenew: false,
    fit,
    reference: { date: "2026-01-01", engineHours: 40_000, linerHours: 5_000 },
    rate: rate20,
    overhauls: [
      { ordinal: 1, engineHours: 41_000, linerHours: 6_000, date: "2026-02-20" },
      { ordinal: 2, engineHours: 43_000, linerHours: 8_000, date: "2026-05-31" },
    ],
    schedule: [{ kind: "port_stay" as const, date: "2026-05-01", label: "port stay at Harbourtown", scheduleId: 7 }],
  };

  test("a limit of 1.0 mm is 20 standard errors away at overhaul 2: run on", () => {
    expect(recommend({ ...base, limitMm: 1.0 }).kind).toBe("run_on");
  });

  test("a limit of 0.81 mm: about 17 % by overhaul 2, under 1e-9 at the port stay (7,400 h): renew at the port stay", () => {
    const r = recommend({ ...base, limitMm: 0.81 });
    expect(r.kind).toBe("renew_at");
    expect(r.opportunity?.scheduleId).toBe(7);
    expect(r.text).toContain("port stay at Harbourtown");
  });

  test("a limit of 0.70 mm is passed before the port stay: renew at overhaul 1", () => {
    const r = recommend({ ...base, limitMm: 0.7 });
    expect(r.kind).toBe("renew_at");
    expect(r.opportunity?.kind).toBe("overhaul");
  });

  test("a liner at its limit, or a limit passed before any opportunity: renew now", () => {
    expect(recommend({ ...base, limitMm: 1.0, mustRenew: true }).kind).toBe("renew_now");
    expect(recommend({ ...base, limitMm: 0.55 }).kind).toBe("renew_now");
  });

  test("without a trend the words say there is not enough data", () => {
    const r = recommend({ ...base, fit: null, limitMm: 1 });
    expect(r.kind).toBe("run_on");
    expect(r.text).toMatch(/not enough data/);
  });
});

describe("spareShortfall", () => {
  const line = (o: Partial<StockLine> & Pick<StockLine, "id">): StockLine => ({
    profileId: 1, part: "liner", vesselId: null, onHand: 0, onOrder: 0, onOrderDue: null, leadTimeDays: 120, unitCost: null, jobCost: null, ...o,
  });
  const stock = [line({ id: 1, onHand: 1, onOrder: 1, onOrderDue: "2027-03-01" }), line({ id: 2, vesselId: 10, onHand: 1 })];
  const demands = [
    { key: "a", vesselId: 10, neededOn: "2027-01-10" },
    { key: "b", vesselId: 20, neededOn: "2027-02-01" },
    { key: "c", vesselId: 20, neededOn: "2027-04-01" },
    { key: "d", vesselId: 10, neededOn: "2027-05-01" },
    { key: "e", vesselId: 20, neededOn: "2027-06-01" },
  ].map((d) => ({ ...d, profileId: 1, part: "liner" as const, source: "plan" as const }));

  test("hand-worked: ship, store, the order due 1 Mar, then two short; order by 120 days before 1 May 2027", () => {
    const { lines, sources } = spareShortfall(demands, stock, "2026-12-02");
    expect([...sources.values()]).toEqual(["ship", "store", "on_order", null, null]);
    // 1 May 2027 − 120 days: − 30 (April) − 31 (March) − 28 (February) − 31 (January) = 1 Jan 2027.
    expect(lines).toEqual([{ profileId: 1, part: "liner", needed: 5, available: 3, short: 2, firstShortOn: "2027-05-01", orderBy: "2027-01-01", leadTimeDays: 120, late: false }]);
  });

  test("an order-by date already past is late", () => {
    expect(spareShortfall(demands, stock, "2027-01-02").lines[0].late).toBe(true);
  });

  test("an order not due by the day does not cover it", () => {
    const { sources } = spareShortfall([{ ...demands[2], neededOn: "2027-02-15" }, ...demands.slice(0, 2)], stock, "2026-12-02");
    expect(sources.get("c")).toBeNull();
  });
});

describe("budget and costs", () => {
  test("hand-worked sums per year and vessel, in cents, with unpriced renewals counted apart", () => {
    // 0.1 + 0.2 in binary floating point is 0.30000000000000004; in cents it is 30.
    const lines = budgetByYear([
      { vesselId: 2, date: "2027-03-01", cost: 0.1 },
      { vesselId: 2, date: "2027-09-01", cost: 0.2 },
      { vesselId: 2, date: "2027-10-01", cost: null },
      { vesselId: 1, date: "2027-01-01", cost: 48_250.5 },
      { vesselId: 1, date: "2028-01-01", cost: 61_000 },
    ]);
    expect(lines).toEqual([
      { year: 2027, vesselId: 1, renewals: 1, total: 48_250.5, unpriced: 0 },
      { year: 2027, vesselId: 2, renewals: 3, total: 0.3, unpriced: 1 },
      { year: 2028, vesselId: 1, renewals: 1, total: 61_000, unpriced: 0 },
    ]);
  });

  test("a renewal costs the spare plus the job; neither known is null", () => {
    expect(renewalCost({ unitCost: 41_500, jobCost: 6_750.5 })).toBe(48_250.5);
    expect(renewalCost({ unitCost: null, jobCost: null })).toBeNull();
  });
});

describe("ratePercentile", () => {
  test("hand-counted: 3 of 10 rates at or below 0.05 → 30th percentile; ties share the middle", () => {
    const rates = [0.02, 0.04, 0.05, 0.06, 0.07, 0.08, 0.09, 0.1, 0.12, 0.2];
    expect(ratePercentile(rates, 0.05)).toBeCloseTo(0.3, 12);
    expect(ratePercentile(rates, 0.2)).toBe(1);
    expect(ratePercentile(rates, 0.01)).toBe(0);
    // Two tied values at positions 3 and 4 of 5: the rank is the middle of 3/5 and 4/5 = 0.7.
    expect(ratePercentile([1, 2, 3, 3, 4], 3)).toBeCloseTo(0.7, 12);
    expect(ratePercentile([1, 2], 1)).toBeNull();
  });
});

describe("horizonEnd", () => {
  test.each([
    ["2026-12-02", 12, "2027-12-02"],
    ["2027-01-31", 1, "2027-02-28"],
    ["2028-01-31", 1, "2028-02-29"],
  ])("%s + %d months = %s (Gregorian calendar)", (today, months, end) => {
    expect(horizonEnd(today, months)).toBe(end);
  });
});

describe("reachesRisk agrees with exceedProbability", () => {
  // The quantile comparison must give the same verdict as working out the chance, either side of
  // the NIST table's ν = 10 point t = 1.812 (upper tail 0.05).
  test.each([1.7, 1.8, 1.82, 1.9, 0, -1, 3])("at %d standard errors below the limit", (z) => {
    const limit = 0.5 + z * se12;
    const e = exceedProbability(fit12, limit, 5000);
    expect(e.kind).toBe("probability");
    if (e.kind === "probability") expect(reachesRisk(fit12, limit, 5000, 0.05)).toBe(e.p >= 0.05);
  });
  test("not enough data alike", () => {
    expect(reachesRisk(null, 1, 5000, 0.05)).toBeNull();
  });
});
