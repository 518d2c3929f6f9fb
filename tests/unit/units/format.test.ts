import { describe, expect, test } from "vitest";
import { fixed, hours, hoursText, length, mm, rate, rateText, spread, trendWords } from "@/lib/format";
import { unitBand } from "@/lib/wear/bands";
import { formatRunningHours } from "@/lib/wear/calendar";
import { analyseLiner } from "@/lib/wear/liner";
import { inspectionAt, testProfile } from "../data/profile";

describe("an uncertainty is never printed as zero", () => {
  test("at least three decimals, more when three would show 0.000", () => {
    expect(spread(0.0123)).toBe("0.012");
    expect(spread(0.00078)).toBe("0.00078");
    expect(spread(0.000049)).toBe("0.000049");
  });

  test("an exact zero and a missing value print as such", () => {
    expect(spread(0)).toBe("0.000");
    expect(spread(null)).toBe("–");
    expect(spread(Number.NaN)).toBe("–");
  });
});

describe("one number style", () => {
  test("running hours: thousands grouped with a comma, rounded once, the unit always h", () => {
    expect(hours(92_123)).toBe("92,123");
    expect(hoursText(92_123)).toBe("92,123 h");
    expect(hoursText(90_614.5)).toBe("90,615 h"); // [derived] toFixed(0) rounds a half up here
    expect(hoursText(150_612.4)).toBe("150,612 h");
    expect(formatRunningHours(150_612.4)).toBe(hoursText(150_612.4));
    expect(hoursText(null)).toBe("–");
  });

  test("a figure that rounds to zero has no minus sign", () => {
    expect(fixed(-0.001)).toBe("0.00");
    expect(fixed(-0.004, 2)).toBe("0.00");
    expect(fixed(-0.0004, 3)).toBe("0.000");
    expect(fixed(-0.25)).toBe("-0.25");
    expect(mm(-0.003)).toBe("0.00 mm");
  });

  test("lengths carry their unit and group thousands", () => {
    expect(mm(900.4237)).toBe("900.42 mm");
    expect(mm(1234.5)).toBe("1,234.50 mm");
    expect(length(0.42, "in")).toBe("0.0165 in");
  });
});

describe("wear rates never print a non-zero rate as 0.000", () => {
  test("three decimals, or two significant digits below 0.0005", () => {
    expect(rate(0.035)).toBe("0.035");
    expect(rate(0.00042)).toBe("0.00042");
    expect(rate(0.0000123)).toBe("0.000012");
    expect(rate(0)).toBe("0.000");
    expect(rateText(0.00042)).toBe("0.00042 mm/1000 h");
  });

  test("a trend under 0.01 mm per 10,000 h (the gauge's step; common practice) reads as about level", () => {
    expect(trendWords(0.035)).toBe("rising 0.035 mm/1000 h");
    expect(trendWords(0.0004)).toBe("about level (0.00040 mm/1000 h)");
    expect(trendWords(-0.002)).toBe("falling 0.002 mm/1000 h");
  });

  test("the band's reason for a nearly flat liner says about level, not rising 0.000", () => {
    // Invented: a liner at 2.00 mm whose trend rises 0.0004 mm/1000 h, read with no scatter.
    const inspections = [4000, 8000, 12_000, 16_000, 20_000, 24_000].map((h) => inspectionAt(h, 2 + (0.0004 * h) / 1000));
    const b = unitBand({ profile: testProfile(), liner: analyseLiner(testProfile(), inspections) });
    const text = b.reasons.join(" ");
    expect(text).toMatch(/about level \(0\.00040 mm\/1000 h\)/);
    expect(text).not.toMatch(/0\.000 mm\/1000 h/);
  });
});
