import { describe, expect, it } from "vitest";
import { day, monthYear } from "@/lib/format";

// Calendar days as the screens print them ("4 Mar 2027"), checked against the proleptic
// Gregorian calendar of ISO 8601 (leap day 2028-02-29 exists, 2027-02-29 does not).
describe("day and monthYear", () => {
  it("prints a day of the ISO calendar without leading zeros", () => {
    expect(day("2027-03-04")).toBe("4 Mar 2027");
    expect(day("2026-12-31T23:59:00Z")).toBe("31 Dec 2026");
    expect(day("2028-02-29")).toBe("29 Feb 2028");
    expect(monthYear("2027-01-15")).toBe("Jan 2027");
  });

  it("prints a dash for no day or a day the calendar does not have", () => {
    expect(day(null)).toBe("–");
    expect(day("")).toBe("–");
    expect(day("2027-02-29")).toBe("–");
    expect(day("not a date")).toBe("–");
  });
});
