import { describe, expect, it } from "vitest";
import { alertKey, isoWeek, topicsFor, TOPICS } from "@/lib/notifications/topics";

describe("isoWeek", () => {
  // ISO 8601 week dates: weeks start on Monday and week 1 is the week with the year's first
  // Thursday. The pairs are the worked examples of the "ISO week date" article (Wikipedia),
  // which gives e.g. 2008-12-29 as 2009-W01-1 and 2010-01-03 as 2009-W53-7.
  it.each([
    ["2005-01-01", "2004-W53"],
    ["2005-01-02", "2004-W53"],
    ["2005-12-31", "2005-W52"],
    ["2006-01-01", "2005-W52"],
    ["2006-01-02", "2006-W01"],
    ["2006-12-31", "2006-W52"],
    ["2007-01-01", "2007-W01"],
    ["2007-12-30", "2007-W52"],
    ["2007-12-31", "2008-W01"],
    ["2008-01-01", "2008-W01"],
    ["2008-12-28", "2008-W52"],
    ["2008-12-29", "2009-W01"],
    ["2008-12-31", "2009-W01"],
    ["2009-01-01", "2009-W01"],
    ["2009-12-31", "2009-W53"],
    ["2010-01-03", "2009-W53"],
  ])("%s is in %s", (day, week) => {
    expect(isoWeek(new Date(`${day}T12:00:00Z`))).toBe(week);
  });

  it("gives every day of a Monday-to-Sunday week the same key, and the next Monday the next", () => {
    const monday = Date.UTC(2026, 10, 30); // 30 Nov 2026 is a Monday
    const keys = Array.from({ length: 7 }, (_, i) => isoWeek(new Date(monday + i * 86_400_000 + 23 * 3_600_000)));
    expect(new Set(keys)).toEqual(new Set(["2026-W49"]));
    expect(isoWeek(new Date(monday + 7 * 86_400_000))).toBe("2026-W50");
  });
});

describe("topics", () => {
  it("offers the administrator nothing and the superintendent the renewal and spares alerts", () => {
    expect(topicsFor("admin")).toEqual([]);
    expect(topicsFor("superintendent")).toEqual(expect.arrayContaining(["plan_missed", "spare_order_by", "inspection_submitted", "weekly_digest"]));
    expect(topicsFor("engineer")).toEqual(["inspection_returned", "weekly_digest"]);
  });

  it("keys an alert by its cause and its recipient, within the outbox's 191 characters", () => {
    const key = alertKey("unit_horizon", "liner:4294967295", "0f8fad5b-d9cb-469f-a165-70867728950e");
    expect(key).toBe("unit_horizon:liner:4294967295:0f8fad5b-d9cb-469f-a165-70867728950e");
    for (const t of TOPICS) expect(alertKey(t, "inspection:4294967295:r4294967295", "0f8fad5b-d9cb-469f-a165-70867728950e").length).toBeLessThanOrEqual(191);
  });
});
