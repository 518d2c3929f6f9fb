import { describe, expect, it } from "vitest";
import { composeDigest, type DigestFacts, type DigestRecord } from "@/lib/notifications/digest";

// Invented people and ships. The approval rule is lib/inspections/approval.ts's: whoever
// entered or submitted a record never approves it.
const rec = (o: Partial<DigestRecord>): DigestRecord => ({
  id: 1,
  vesselId: 1,
  vesselName: "Test Petrel",
  cylinderNo: 3,
  inspectedOn: "2026-11-28",
  state: "submitted",
  createdBy: "eng",
  submittedBy: "eng",
  byName: "Eli Engineer",
  ...o,
});
const none: DigestFacts = { records: [], bandMoves: [], limits: [], renewals: [], shortfalls: [] };

describe("composeDigest", () => {
  it("says nothing to a person with nothing on their vessels", () => {
    const facts = { ...none, records: [rec({ vesselId: 2 })] };
    expect(composeDigest({ id: "chief", role: "chief_engineer", vesselIds: [1] }, facts)).toBeNull();
  });

  it("lists records to approve for the chief, and never his own as his to approve", () => {
    const facts = { ...none, records: [rec({ id: 1 }), rec({ id: 2, cylinderNo: 5, createdBy: "chief", submittedBy: "chief", byName: "Chris Chief" })] };
    const d = composeDigest({ id: "chief", role: "chief_engineer", vesselIds: [1] }, facts)!;
    expect(d.sections[0]).toEqual({ title: "Records waiting for your approval:", lines: ["Test Petrel, cylinder 3, gauged 28 Nov 2026, submitted by Eli Engineer"] });
    expect(d.sections[1]).toEqual({ title: "Your records waiting for someone else's approval:", lines: ["Test Petrel, cylinder 5, gauged 28 Nov 2026"] });
    expect(d.summary).toBe("1 record to approve");
  });

  it("tells the engineer about his returned record, not about other people's", () => {
    const facts = { ...none, records: [rec({ state: "returned" }), rec({ id: 9, state: "returned", createdBy: "other" })] };
    const d = composeDigest({ id: "eng", role: "engineer", vesselIds: [1] }, facts)!;
    expect(d.sections).toEqual([{ title: "Your records returned for correction:", lines: ["Test Petrel, cylinder 3, gauged 28 Nov 2026"] }]);
  });

  it("names band moves in words and limits with their dates and wear", () => {
    const facts: DigestFacts = {
      ...none,
      bandMoves: [{ unitId: 4, vesselId: 1, vesselName: "Test Petrel", cylinderNo: 4, from: "watch", to: "renew_before_next" }],
      limits: [{ unitId: 4, vesselId: 1, vesselName: "Test Petrel", cylinderNo: 4, limitOn: "2027-05-02", earliestOn: "2027-03-01", maxWearMm: 2.914 }],
    };
    const d = composeDigest({ id: "supt", role: "superintendent", vesselIds: [1, 2] }, facts)!;
    expect(d.sections.map((s) => s.lines[0])).toEqual([
      "Test Petrel, cylinder 4: Watch → Renew before next overhaul",
      "Test Petrel, cylinder 4: limit around 2 May 2027, at the earliest 1 Mar 2027 (wear now 2.91 mm)",
    ]);
    expect(d.summary).toBe("1 unit moved band, 1 limit in sight");
  });

  it("keeps a long list short and says how many more there are", () => {
    const facts = { ...none, records: Array.from({ length: 20 }, (_, i) => rec({ id: i, cylinderNo: i + 1 })) };
    const d = composeDigest({ id: "chief", role: "chief_engineer", vesselIds: [1] }, facts)!;
    expect(d.sections[0].lines).toHaveLength(13);
    expect(d.sections[0].lines[12]).toBe("and 8 more in Kalibore");
  });
});
