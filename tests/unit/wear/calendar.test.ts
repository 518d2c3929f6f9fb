import { describe, expect, test } from "vitest";
import { addDays, formatRunningHours, parseIsoDate, projectDate, runningHoursPerDay } from "@/lib/wear/calendar";

describe("parseIsoDate and addDays (UTC)", () => {
  test.each([
    ["2024-02-29", true],
    ["2023-02-29", false],
    ["2024-13-01", false],
    ["2024-1-01", false],
    ["", false],
  ])("%j valid: %s", (text, valid) => {
    expect(parseIsoDate(text) !== null).toBe(valid);
  });

  test.each([
    ["2024-02-28", 1, "2024-02-29"],
    ["2024-12-31", 1, "2025-01-01"],
    ["2024-03-31", -31, "2024-02-29"],
    ["2024-01-01", 0.6, "2024-01-02"],
    ["2024-01-01", 1e9, null],
    ["2024-01-01", NaN, null],
  ])("%s + %d days = %s", (date, days, expected) => {
    expect(addDays(date, days)).toBe(expected);
  });
});

describe("runningHoursPerDay", () => {
  test("averages over the last 365 days of the log", () => {
    const log = [
      { date: "2021-01-01", engineHours: 10_000 },
      { date: "2023-01-01", engineHours: 20_000 },
      { date: "2023-07-02", engineHours: 23_620 },
      { date: "2024-01-01", engineHours: 26_570 },
    ];
    // [derived] window starts 2023-01-01: (26 570 − 20 000) / 365 days = 18 h/day
    expect(runningHoursPerDay(log)).toEqual({ kind: "known", hoursPerDay: 18, fromDate: "2023-01-01", toDate: "2024-01-01", entriesUsed: 3 });
  });

  test("uses the last two entries when the window holds only one", () => {
    const log = [
      { date: "2020-01-01", engineHours: 0 },
      { date: "2022-01-01", engineHours: 7_310 },
    ];
    expect(runningHoursPerDay(log)).toMatchObject({ kind: "known", hoursPerDay: 10, entriesUsed: 2 });
  });

  test.each([
    [[], "too_few_entries"],
    [[{ date: "2024-01-01", engineHours: 100 }], "too_few_entries"],
    [[{ date: "2024-01-01", engineHours: 100 }, { date: "2024-01-01", engineHours: 120 }], "too_few_entries"],
    [[{ date: "2024-01-01", engineHours: 100 }, { date: "2024-02-01", engineHours: 100 }], "no_running"],
    [[{ date: "2024-01-01", engineHours: 100 }, { date: "2024-02-01", engineHours: 50 }], "hours_decreasing"],
    [[{ date: "2024-01-01", engineHours: 100 }, { date: "2024-01-02", engineHours: 130 }], "implausible_rate"],
    [[{ date: "bad", engineHours: 100 }, { date: "2024-01-02", engineHours: 110 }], "too_few_entries"],
  ])("%j → unknown (%s)", (log, reason) => {
    expect(runningHoursPerDay(log)).toEqual({ kind: "unknown", reason });
  });

  test("asOf ignores later entries", () => {
    const log = [
      { date: "2024-01-01", engineHours: 0 },
      { date: "2024-01-11", engineHours: 200 },
      { date: "2024-01-21", engineHours: 200 },
    ];
    expect(runningHoursPerDay(log, { asOf: "2024-01-15" })).toMatchObject({ kind: "known", hoursPerDay: 20 });
  });
});

describe("projectDate", () => {
  const rate = { kind: "known", hoursPerDay: 20, fromDate: "2023-01-01", toDate: "2024-01-01", entriesUsed: 5 } as const;
  const reference = { linerHours: 30_000, date: "2024-01-01" };

  test("converts liner hours and the interval into dates", () => {
    // [derived] at 20 h/day: 2000 h = 100 days, 1000 h = 50 days, 4000 h = 200 days
    expect(projectDate({ atLinerHours: 32_000, lowerHours: 31_000, upperHours: 34_000 }, reference, rate)).toEqual({
      kind: "dated",
      date: "2024-04-10",
      lower: "2024-02-20",
      upper: "2024-07-19",
    });
  });

  test("an open interval end stays open", () => {
    expect(projectDate({ atLinerHours: 32_000, lowerHours: 31_000, upperHours: null }, reference, rate)).toMatchObject({ upper: null });
  });

  test("a figure behind the reference gives an earlier date", () => {
    expect(projectDate({ atLinerHours: 29_800, lowerHours: null, upperHours: null }, reference, rate)).toMatchObject({ date: "2023-12-22" });
  });

  test.each([
    [{ kind: "unknown", reason: "no_running" } as const, reference, "rate_unknown"],
    [rate, { linerHours: 30_000, date: "01/01/2024" }, "invalid_input"],
  ])("unknown when the rate or reference is unusable", (r, ref, reason) => {
    expect(projectDate({ atLinerHours: 32_000, lowerHours: null, upperHours: null }, ref, r)).toEqual({ kind: "unknown", reason });
  });

  test("a limit centuries away is beyond the horizon", () => {
    expect(projectDate({ atLinerHours: 1e12, lowerHours: null, upperHours: null }, reference, rate)).toEqual({ kind: "unknown", reason: "beyond_horizon" });
  });
});

describe("formatRunningHours", () => {
  test.each([
    [150_612.4, "150,612 h"],
    [999, "999 h"],
    [1000, "1,000 h"],
    [-2500, "-2,500 h"],
    [NaN, "–"],
  ])("%d → %s", (h, text) => {
    expect(formatRunningHours(h)).toBe(text);
  });
});
