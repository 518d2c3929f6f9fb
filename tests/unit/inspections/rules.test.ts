import { describe, expect, it } from "vitest";
import type { InspectionContext } from "@/lib/inspections/context";
import { lengthText, parseDecimal, ringInUnit, toDraft, toMm, fromDraft } from "@/lib/inspections/form";
import { checkHours, derivedLinerHours, expectedEngineHours, submissionProblems, tallyStatus } from "@/lib/inspections/rules";
import { inspectionDraftSchema, type InspectionDraft } from "@/lib/inspections/schemas";
import { sniffImageType } from "@/lib/photos/sniff";

// An invented 600 mm profile with three stations and one ring, for the pure rules.
const ctx: InspectionContext = {
  unit: { id: 1, cylinderNo: 1, engineId: 1, engineSerial: "T-1", vesselId: 1, vesselName: "Test" },
  profile: {
    id: 1,
    name: "Test 600",
    designation: "T-600",
    boreMm: 600,
    linerWearLimitMm: 3.6,
    ovalityLimitMm: 1.2,
    wearReference: "nominal",
    temperatureCorrection: true,
    alphaLinerPerK: 10.5e-6,
    alphaGaugePerK: 11.5e-6,
    runningInHours: 3000,
    minPointsForProjection: 3,
    axes: [
      { key: "fa", label: "Fore–aft" },
      { key: "ath", label: "Athwartships" },
    ],
    stations: [
      { id: 1, key: "s1", label: "Top", depthMm: 40, role: "unworn_top" },
      { id: 2, key: "s2", label: "Ring 1 TDC", depthMm: 120, role: "ring_tdc" },
    ],
    rings: [{ position: 1, label: "Ring 1", gapNewMinMm: 3.2, gapNewMaxMm: 3.8, gapLimitMm: 6.5, grooveNewMinMm: 0.4, grooveNewMaxMm: 0.5, grooveLimitMm: 0.9 }],
    rodNutPressureBar: 900,
  },
  liner: { id: 1, serial: "L1", installedOn: "2024-01-01", installedEngineHours: 10_000, linerHoursAtInstall: 500 },
  previous: { id: 9, inspectedOn: "2026-01-10", engineHours: 30_000, linerHours: 20_500, linerId: 1, gaugeTempC: null, linerTempC: null, readings: [] },
  hoursLog: [
    { date: "2026-11-01", engineHours: 39_400 },
    { date: "2026-11-21", engineHours: 39_800 },
  ],
  asFitted: null,
};

describe("typed numbers and lengths", () => {
  it.each([
    ["600.42", 600.42],
    ["600,42", 600.42],
    [" 600.4 ", 600.4],
    ["", null],
    ["60O.42", "invalid"],
    ["1e3", "invalid"],
    ["600.4.2", "invalid"],
  ])("reads %j as %j", (text, expected) => expect(parseDecimal(text)).toBe(expected));

  it("converts inches with exactly 25.4 mm to the inch (1959 agreement), kept to 1 µm", () => {
    expect(toMm(1, "in")).toBe(25.4);
    expect(toMm(23.6378, "in")).toBe(600.4); // 600.40012 mm
    expect(lengthText(600.4, "in")).toBe("23.6378");
    expect(lengthText(601.7, "mm")).toBe("601.70");
    expect(lengthText(600.075, "mm")).toBe("600.075");
  });
});

describe("hours", () => {
  it("derives liner hours from the liner's fitting", () => {
    expect(derivedLinerHours(ctx.liner, 39_000)).toBe(29_500);
  });
  it("reads the expected counter off the log: on a logged day, between entries, or carried forward", () => {
    expect(expectedEngineHours(ctx.hoursLog, "2026-11-21")!.hours).toBe(39_800);
    expect(expectedEngineHours(ctx.hoursLog, "2026-11-11")!.hours).toBeCloseTo(39_600, 6);
    expect(expectedEngineHours(ctx.hoursLog, "2026-12-01")!.hours).toBeCloseTo(40_000, 6); // 20 h a day for 10 days
    expect(expectedEngineHours(ctx.hoursLog, "2026-10-01")).toBeNull();
  });
  it("refuses hours below the previous inspection and warns when far from the log", () => {
    const below = checkHours(ctx, { inspectedOn: "2026-12-01", engineHours: 29_000, linerHours: 19_500, linerHoursReason: null });
    expect(below.errors.map((e) => e.field)).toContain("header.engineHours");
    const far = checkHours(ctx, { inspectedOn: "2026-12-01", engineHours: 49_000, linerHours: 39_500, linerHoursReason: null });
    expect(far.errors).toEqual([]);
    expect(far.warnings[0].message).toMatch(/suggests about 40,000 h/);
    const reason = checkHours(ctx, { inspectedOn: "2026-12-01", engineHours: 40_000, linerHours: 12_000, linerHoursReason: null });
    expect(reason.errors.map((e) => e.field)).toEqual(["header.linerHoursReason"]);
  });
});

describe("the form keeps what was typed and sends only numbers", () => {
  const draft: InspectionDraft = {
    header: { inspectedOn: "2026-12-01", engineHours: 40_000, linerHours: 30_500, linerHoursReason: null, crew: null, gaugeTempC: 20, linerTempC: 20, notes: null },
    readings: [{ stationKey: "s1", axisKey: "fa", diameterMm: 600.01, enteredUnit: "mm", warningConfirmed: null }],
    rings: [],
    checklist: { tally: [], closing: { signedName: null, signedAt: null }, rodNutPressureBar: null, stuffingBox: { done: false, note: null }, cylinderLubrication: { done: false, note: null } },
  };
  it("leaves a mistyped cell out of the draft and lists it, the rest still saves", () => {
    const form = fromDraft(draft, ctx.profile);
    form.cells["s1|ath"] = { text: "600.0x", unit: "mm", confirmed: null };
    form.cells["s2|fa"] = { text: "23.6378", unit: "in", confirmed: null };
    const { draft: out, invalid } = toDraft(form, ctx.profile, draft.header);
    expect(invalid).toEqual(["readings.s1|ath"]);
    expect(out.readings.map((r) => [r.stationKey, r.axisKey, r.diameterMm, r.enteredUnit])).toEqual([
      ["s1", "fa", 600.01, "mm"],
      ["s2", "fa", 600.4, "in"],
    ]);
    expect(inspectionDraftSchema.safeParse(out).success).toBe(true);
  });
  it("takes ring lengths in inches too (25.4 mm to the inch), converting what was typed when the sheet's unit is switched", () => {
    const form = fromDraft(draft, ctx.profile);
    form.rings["1"] = { unit: "in", closedGap: "0.1576", gapMeasuredIn: "liner_worn", gapLinerDiameter: "23.6614", groove: "0.0177", renewed: false, condition: "" };
    const { draft: out, invalid } = toDraft(form, ctx.profile, draft.header);
    expect(invalid).toEqual([]);
    // 0.1576 in = 4.00304 mm, 23.6614 in = 600.99956 mm, 0.0177 in = 0.44958 mm, each kept to 1 µm.
    expect(out.rings[0]).toMatchObject({ closedGapMm: 4.003, gapLinerDiameterMm: 601, grooveClearanceMm: 0.45 });
    const inMm = ringInUnit(form.rings["1"], "mm");
    expect([inMm.unit, inMm.closedGap, inMm.gapLinerDiameter, inMm.groove]).toEqual(["mm", "4.003", "601.00", "0.45"]);
    // A half-typed value is left as typed, not lost.
    expect(ringInUnit({ ...form.rings["1"], groove: "0,0x" }, "mm").groove).toBe("0,0x");
  });
  it("shows stored rings in inches when the readings were all typed in inches", () => {
    const inches: InspectionDraft = {
      ...draft,
      readings: [{ stationKey: "s1", axisKey: "fa", diameterMm: 600.4, enteredUnit: "in", warningConfirmed: null }],
      rings: [{ position: 1, closedGapMm: 4.001, gapMeasuredIn: "gauge_ring", gapLinerDiameterMm: null, grooveClearanceMm: 0.45, renewed: false, condition: null }],
    };
    const form = fromDraft(inches, ctx.profile);
    expect(form.entryUnit).toBe("in");
    expect([form.rings["1"].unit, form.rings["1"].closedGap, form.rings["1"].groove]).toEqual(["in", "0.1575", "0.0177"]);
    const { draft: back } = toDraft(form, ctx.profile, inches.header);
    expect(back.rings[0].closedGapMm).toBeCloseTo(4.001, 2);
  });
  it("lists everything that stands before submission", () => {
    const fields = submissionProblems(ctx, { ...draft, header: { ...draft.header } }).map((p) => p.field);
    expect(fields).toEqual(expect.arrayContaining(["readings", "rings.1.closedGapMm", "checklist.tally", "checklist.closing", "checklist.rodNutPressureBar"]));
  });
  it("counts a tally as matching only when both counts are in and equal", () => {
    expect(tallyStatus({ countIn: 12, countOut: 12 })).toBe("match");
    expect(tallyStatus({ countIn: 12, countOut: 11 })).toBe("mismatch");
    expect(tallyStatus({ countIn: 12, countOut: null })).toBe("incomplete");
  });
});

describe("photo type by content", () => {
  const bytes = (...parts: (number[] | string)[]) => new Uint8Array(parts.flatMap((p) => (typeof p === "string" ? [...new TextEncoder().encode(p)] : p)));
  it.each([
    ["JPEG", bytes([0xff, 0xd8, 0xff, 0xe0, 0, 0]), "image/jpeg"],
    ["PNG", bytes([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0]), "image/png"],
    ["WebP", bytes("RIFF", [0, 0, 0, 0], "WEBPVP8 "), "image/webp"],
    ["HEIC", bytes([0, 0, 0, 0x18], "ftypheic", [0, 0, 0, 0], "mif1heic"), "image/heic"],
    ["HEIF (mif1 only)", bytes([0, 0, 0, 0x14], "ftypmif1", [0, 0, 0, 0], "mif1"), "image/heif"],
    ["a CSV named .jpg", bytes("station,fa,ath\n"), null],
    ["an MP4", bytes([0, 0, 0, 0x18], "ftypisom", [0, 0, 0, 0], "isomavc1"), null],
  ])("%s", (_name, data, expected) => expect(sniffImageType(data)).toBe(expected));
});
