import { describe, expect, it } from "vitest";
import { jobTokenMatches } from "@/lib/notifications/job-token";
import { isPermanentFailure, retryDelayS } from "@/lib/mail/outbox";
import { horizonEmail, inspectionSubmittedEmail } from "@/lib/mail/templates";

describe("isPermanentFailure", () => {
  // RFC 5321 §4.2.1: a 5yz reply is a permanent negative completion (do not repeat the
  // request as is); 4yz is transient. A connection error carries no reply code at all.
  it.each([
    [{ responseCode: 550 }, true],
    [{ responseCode: 553 }, true],
    [{ responseCode: 421 }, false],
    [{ responseCode: 451 }, false],
    [Object.assign(new Error("connect ECONNREFUSED 127.0.0.1:2525"), { code: "ESOCKET" }), false],
    [null, false],
  ])("%j → %s", (err, permanent) => {
    expect(isPermanentFailure(err)).toBe(permanent);
  });

  it("waits longer after each failure, at most an hour", () => {
    expect([1, 2, 3, 4, 8, 20].map(retryDelayS)).toEqual([30, 60, 120, 240, 3600, 3600]);
  });
});

describe("jobTokenMatches", () => {
  const token = "k3Qm9-long-enough-scheduler-token-0123456789";
  it.each([
    [`Bearer ${token}`, true],
    [`Bearer ${token} `, false],
    [`bearer ${token}`, false],
    [`Bearer ${token.slice(1)}`, false],
    [`Basic ${token}`, false],
    ["Bearer", false],
    ["", false],
    [null, false],
  ])("%j → %s", (header, ok) => {
    expect(jobTokenMatches(header, token)).toBe(ok);
  });

  it("refuses everything when no token is configured", () => {
    expect(jobTokenMatches("Bearer ", undefined)).toBe(false);
    expect(jobTokenMatches(`Bearer ${token}`, undefined)).toBe(false);
  });
});

describe("alert e-mails", () => {
  const who = { name: "Chris Chief", url: "https://kalibore.example/inspections/42", preferencesUrl: "https://kalibore.example/notifications/preferences" };
  it("name the ship, the unit, the figures with dates and link to the page, in text and HTML", () => {
    const m = inspectionSubmittedEmail({ ...who, vesselName: "Test Petrel", cylinderNo: 3, inspectedOn: "2026-11-28", engineHours: 41230.4, linerHours: 18211, submitterName: "Eli Engineer", submittedOn: "2026-12-01T08:00:00Z", maxWearMm: 1.234, wearLimitMm: 3.6 });
    expect(m.subject).toBe("Record to approve: Test Petrel, cylinder 3");
    expect(m.text).toContain("Eli Engineer submitted the inspection of Test Petrel, cylinder 3 on 1 Dec 2026.");
    expect(m.text).toContain("Gauged on 28 Nov 2026 at 41,230 engine hours, 18,211 liner hours. Largest wear 1.23 mm (limit 3.60 mm).");
    expect(m.text).toContain(who.url);
    expect(m.text).toContain(who.preferencesUrl);
    expect(m.html).toContain('href="https://kalibore.example/inspections/42"');
  });

  it("escape what people typed in the HTML part", () => {
    const m = horizonEmail({ ...who, vesselName: "<b>Petrel</b>", cylinderNo: 2, linerSerial: "L&1", limitOn: "2027-05-02", earliestOn: "2027-03-01", latestOn: null, horizonDays: 183, maxWearMm: 2.9, wearLimitMm: 3.6, lastInspectedOn: "2026-11-01" });
    expect(m.html).not.toContain("<b>Petrel</b>");
    expect(m.html).toContain("&lt;b&gt;Petrel&lt;/b&gt;");
    expect(m.text).toContain("around 2 May 2027 (at the earliest 1 Mar 2027)");
  });
});
