import { describe, expect, it } from "vitest";
import { checkHours } from "@/lib/inspections/rules";
import { checklistSchema, createInspectionSchema, inspectionHeaderSchema, saveDraftSchema, submitInspectionSchema } from "@/lib/inspections/schemas";
import { logRunningHoursSchema } from "@/lib/hours/schemas";
import { engineSchema } from "@/lib/admin/schemas";
import { latestRecordDate, recordDate } from "@/lib/validation/dates";
import { MAX_RECORD_ID, parseRecordId } from "@/lib/validation/ids";
import { describeIssues } from "@/lib/validation/issues";
import type { InspectionContext } from "@/lib/inspections/context";

/*
 * The edges of what a record may hold: values that cannot be true are refused, and each
 * refusal says what was wrong with what was sent. Bounds: dates from 1950 to today
 * (lib/validation/dates.ts, common practice), running hours up to 400 000 h (45 years of
 * every hour, lib/validation/bounds.ts), ids within the database's INT UNSIGNED
 * (0 … 4 294 967 295, MariaDB's documented range for INT UNSIGNED).
 */

const header = {
  inspectedOn: "2026-11-30",
  engineHours: 40_000,
  linerHours: 30_000,
  linerHoursReason: null,
  crew: null,
  gaugeTempC: null,
  linerTempC: null,
  notes: null,
};

const firstMessage = (r: { success: boolean; error?: import("zod").ZodError }) => (r.success ? null : describeIssues(r.error!).message);

describe("dates", () => {
  it.each(["0000-01-01", "0001-01-01", "1949-12-31"])("refuses %s as before any engine in service, quoting it", (d) => {
    const m = firstMessage(inspectionHeaderSchema.safeParse({ ...header, inspectedOn: d }));
    expect(m).toContain(d);
    expect(m).toMatch(/before 1950/);
  });

  it.each(["9999-12-31", "2999-01-01"])("refuses %s as in the future, quoting it", (d) => {
    const m = firstMessage(inspectionHeaderSchema.safeParse({ ...header, inspectedOn: d }));
    expect(m).toContain(d);
    expect(m).toMatch(/in the future/);
  });

  it("accepts today and the first allowed day, refuses a day that does not exist and a malformed date", () => {
    expect(recordDate("date").safeParse(new Date().toISOString().slice(0, 10)).success).toBe(true);
    expect(recordDate("date").safeParse("1950-01-01").success).toBe(true);
    expect(recordDate("date").safeParse(latestRecordDate()).success).toBe(true);
    expect(firstMessage(recordDate("date").safeParse("2025-02-29"))).toMatch(/There is no day 2025-02-29/);
    expect(firstMessage(recordDate("date").safeParse("30.11.2026"))).toMatch(/yyyy-mm-dd, not "30.11.2026"/);
  });

  it("bounds the closing time, the running-hours log and an engine's commissioning date the same way", () => {
    const closing = checklistSchema.safeParse({
      tally: [],
      closing: { signedName: "A", signedAt: "9999-01-01T10:00:00+00:00" },
      rodNutPressureBar: null,
      stuffingBox: { done: false, note: null },
      cylinderLubrication: { done: false, note: null },
    });
    expect(firstMessage(closing)).toMatch(/in the future/);
    expect(firstMessage(logRunningHoursSchema.safeParse({ engineId: 1, loggedOn: "0000-01-01", engineHours: 100 }))).toMatch(/before 1950/);
    const engine = engineSchema.safeParse({ vesselId: "1", profileId: "1", serial: "X1", cylinderCount: "6", commissionedOn: "9999-12-31" });
    expect(engine.success).toBe(false);
    expect(JSON.stringify(engine.error?.issues.map((i) => i.message))).toMatch(/9999-12-31 is in the future/);
  });

  it("refuses an inspection dated before its liner was fitted", () => {
    const ctx = { liner: { id: 1, serial: "L1", installedOn: "2024-01-01", installedEngineHours: 10_000, linerHoursAtInstall: 0 }, previous: null, hoursLog: [] } as unknown as InspectionContext;
    const before = checkHours(ctx, { inspectedOn: "2023-12-31", engineHours: 12_000, linerHours: 2_000, linerHoursReason: null });
    expect(before.errors.map((e) => e.message).join(" ")).toMatch(/2023-12-31 is before liner L1 was fitted on 2024-01-01/);
    const same = checkHours(ctx, { inspectedOn: "2024-01-01", engineHours: 10_000, linerHours: 0, linerHoursReason: null });
    expect(same.errors.filter((e) => e.field === "header.inspectedOn")).toEqual([]);
  });
});

describe("numbers say what is wrong with what was sent", () => {
  const checklist = (countIn: unknown) => ({
    tally: [{ key: "spanner", label: "Spanner", countIn, countOut: null }],
    closing: { signedName: null, signedAt: null },
    rodNutPressureBar: null,
    stuffingBox: { done: false, note: null },
    cylinderLubrication: { done: false, note: null },
  });

  it("a tally count of 1000 is too many, not 'not a number'", () => {
    const m = firstMessage(checklistSchema.safeParse(checklist(1000)));
    expect(m).toMatch(/at most 999 items; 1000 was entered/);
    expect(m).not.toMatch(/must be a number/);
    expect(firstMessage(checklistSchema.safeParse(checklist(-1)))).toMatch(/cannot be below 0; -1 was entered/);
    expect(firstMessage(checklistSchema.safeParse(checklist(2.5)))).toMatch(/whole number, not 2.5/);
    expect(firstMessage(checklistSchema.safeParse(checklist("12")))).toMatch(/must be a number, not "12"/);
  });

  it("a revision of 1e20 is not 'missing'; a missing one is", () => {
    const huge = firstMessage(saveDraftSchema.safeParse({ revision: 1e20, draft: {} }));
    expect(huge).not.toMatch(/missing/);
    expect(huge).toMatch(/No record has revision 100000000000000000000/);
    expect(firstMessage(saveDraftSchema.safeParse({ draft: {} }))).toMatch(/The revision is missing/);
    expect(firstMessage(saveDraftSchema.safeParse({ revision: 0, draft: {} }))).toMatch(/counts from 1; 0 was sent/);
    expect(firstMessage(submitInspectionSchema.safeParse({ revision: 1.5 }))).toMatch(/whole number, not 1.5/);
  });

  it("running hours beyond 45 years of every hour are refused, quoting the value", () => {
    const m = firstMessage(inspectionHeaderSchema.safeParse({ ...header, engineHours: 4_000_000 }));
    expect(m).toMatch(/cannot be above 400000 h; 4000000 h was entered/);
    expect(inspectionHeaderSchema.safeParse({ ...header, engineHours: 394_000, linerHours: 60_000 }).success).toBe(true);
    expect(firstMessage(logRunningHoursSchema.safeParse({ engineId: 1, loggedOn: "2026-11-30", engineHours: 500_000 }))).toMatch(/500000 h is more running hours/);
  });

  it("an id in a body is a record number in the database's range", () => {
    const base = { clientToken: "a".repeat(24), ...header };
    expect(firstMessage(createInspectionSchema.safeParse({ ...base, unitId: 1e20 }))).toMatch(/There is no unit with a number that large/);
    expect(firstMessage(createInspectionSchema.safeParse({ ...base, unitId: "7" }))).toMatch(/unit must be given by its record number, not "7"/);
    expect(firstMessage(createInspectionSchema.safeParse({ ...base }))).toMatch(/Choose the unit/);
  });
});

describe("ids in addresses", () => {
  it.each([["abc"], ["1e309"], ["1e3"], ["-1"], ["0"], ["1.0"], ["007"], [" 1"], ["0x10"], [String(MAX_RECORD_ID + 1)], [""]])("%j names no record", (s) => {
    expect(parseRecordId(s)).toBeNull();
  });

  it("plain digits within INT UNSIGNED name a record", () => {
    expect(parseRecordId("1")).toBe(1);
    expect(parseRecordId("42")).toBe(42);
    expect(parseRecordId(String(MAX_RECORD_ID))).toBe(MAX_RECORD_ID);
  });
});
