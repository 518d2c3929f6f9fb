import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { guessMapping, IMPORT_FIELDS, LAYOUT_COLUMNS, type ColumnMapping } from "@/lib/imports/layout";
import { axisByName, likelyLengthUnit, stationAtDepth, stationByName } from "@/lib/imports/match";
import { parseCsv } from "@/lib/imports/parse";
import { buildPreview, linerOn, type ImportContext, type PreviewSettings } from "@/lib/imports/preview";
import { p640Context } from "./world";

const fixture = (name: string) => readFileSync(`fixtures/imports/${name}`, "utf8");
const LAYOUT: ColumnMapping = Object.fromEntries(LAYOUT_COLUMNS.map((c, i) => [c.field, i]));

function previewOf(name: string, o: Partial<PreviewSettings> & { ctx?: ImportContext } = {}) {
  const p = parseCsv(fixture(name));
  const ctx = o.ctx ?? p640Context();
  return buildPreview(p.rows, ctx, { destination: "history", mapping: p.header ? guessMapping(p.header) : LAYOUT, options: p.options, header: p.header, excludedLines: [], ...o });
}

describe("matching to the profile", () => {
  const { profile } = p640Context();
  // The demo 640 mm design: ring 1 at TDC 150 mm, ring 2 at TDC 230 mm below the liner top.
  it.each([
    [150, "R1"],
    [158, "R1"],
    [141, "R1"],
    [222, "R2"],
  ])("a depth of %d mm is station %s (within 10 mm)", (depth, key) => {
    const m = stationAtDepth(profile, depth);
    expect(m.kind === "ok" && m.station.key).toBe(key);
  });

  it("a depth between two stations matches neither and names both", () => {
    const m = stationAtDepth(profile, 190);
    expect(m.kind).toBe("none");
    expect(m.kind === "none" && m.message).toContain("Ring 1 at TDC at 150 mm and Ring 2 at TDC at 230 mm");
  });

  it("stations by key or label, directions by key, label or a plain word", () => {
    expect(stationByName(profile, "r1").kind === "ok").toBe(true);
    expect(stationByName(profile, "Lubricator level").kind === "ok").toBe(true);
    expect(stationByName(profile, "X9").kind).toBe("none");
    expect(axisByName(profile, "Fore–aft")).toBe("fa");
    expect(axisByName(profile, "ATH")).toBe("ath");
    expect(axisByName(profile, "transverse")).toBe("ath");
    expect(axisByName(profile, "up")).toBeNull();
  });

  it("guesses inches from the bore: 640 mm is 25.197 in (25.4 mm to the inch, 1959 agreement)", () => {
    expect(likelyLengthUnit([25.2, 25.21, 25.22], 640)).toBe("in");
    expect(likelyLengthUnit([640.1, 640.4], 640)).toBe("mm");
    expect(likelyLengthUnit([64.01], 640)).toBeNull();
  });

  it("the liner of a day is the one fitted then", () => {
    const unit = { id: 1, cylinderNo: 1, liners: [
      { id: 1, serial: "A", installedOn: "2015-01-01", removedOn: "2019-06-01", installedEngineHours: 0, linerHoursAtInstall: 0 },
      { id: 2, serial: "B", installedOn: "2019-06-02", removedOn: null, installedEngineHours: 30000, linerHoursAtInstall: 0 },
    ] };
    expect(linerOn(unit, "2018-01-01")?.serial).toBe("A");
    expect(linerOn(unit, "2020-01-01")?.serial).toBe("B");
    expect(linerOn(unit, "2014-01-01")).toBeNull();
  });
});

describe("preview of the awkward files", () => {
  it.each(["clean.csv", "bom-crlf.csv", "semicolon-decimal-comma.csv", "tab-separated.tsv", "no-header.csv", "quoted-delimiter.csv", "inch-readings.csv", "blank-and-comment-lines.csv"])(
    "%s: one gauging of cylinder 1, 18 diameters and 4 rings, no error",
    (name) => {
      const p = previewOf(name);
      expect(p.issues.filter((i) => i.level === "error")).toEqual([]);
      expect(p.groups).toHaveLength(1);
      expect(p.groups[0].readings).toHaveLength(18);
      expect(p.groups[0].rings).toHaveLength(4);
      expect(p.groups[0].cylinderNo).toBe(1);
    },
  );

  it("inch readings arrive in millimetres at 25.4 mm to the inch, and their wear matches the mm file's", () => {
    const mm = previewOf("clean.csv").groups[0];
    const inch = previewOf("inch-readings.csv").groups[0];
    inch.readings.forEach((r, i) => {
      expect(r.enteredUnit).toBe("in");
      expect(r.diameterMm).toBeCloseTo(mm.readings[i].diameterMm, 3);
      expect(r.wearMm!).toBeCloseTo(mm.readings[i].wearMm!, 3);
    });
    expect(inch.rings[0].closedGapMm).toBeCloseTo(mm.rings[0].closedGapMm!, 2);
  });

  it("computes wear per reading against the nominal bore: 640.530 mm on a 640 mm bore is 0.53 mm", () => {
    const r1 = previewOf("clean.csv").groups[0].readings.find((r) => r.stationKey === "R1" && r.axisKey === "fa")!;
    expect(r1.diameterMm).toBe(640.53);
    expect(r1.wearMm).toBeCloseTo(0.53, 6); // equal temperatures: no correction
  });

  it("the extra, reordered file reads its diameters and ignores the columns it does not use", () => {
    const p = previewOf("extra-reordered-columns.csv");
    expect(p.errorCount).toBe(0);
    expect(p.groups[0].readings).toHaveLength(18);
  });

  it.each([
    ["duplicate-row.csv", 7, "Duplicate station and direction: Ring 2 at TDC fore–aft was already read on line 6"],
    ["unknown-unit.csv", 5, 'Unknown unit "9": engine KB-640-6-TEST has cylinders 1–6.'],
    ["depth-between-stations.csv", 4, "No station within 10 mm of the depth 190.0 mm"],
    ["thousands-separator.csv", 8, '"16,720" has a thousands separator'],
  ])("%s: an error on line %d in words", (name, line, words) => {
    const p = previewOf(name);
    expect(p.errorLines).toEqual([line]);
    expect(p.issues.find((i) => i.level === "error")!.message).toContain(words);
  });

  it("leaving out the named row clears the error and keeps the rest", () => {
    const p = previewOf("duplicate-row.csv", { excludedLines: [7] });
    expect(p.errorCount).toBe(0);
    expect(p.groups[0].readings).toHaveLength(18);
  });

  it("the same hard check as the sheet: a slipped decimal point cannot be imported", () => {
    const text = fixture("clean.csv").replace("640.530", "6405.30");
    const p = parseCsv(text);
    const pv = buildPreview(p.rows, p640Context(), { destination: "history", mapping: guessMapping(p.header!), options: p.options, header: p.header, excludedLines: [] });
    expect(pv.errorLines).toEqual([4]);
    expect(pv.issues[0].message).toContain("a digit or the decimal point has slipped");
  });

  it("the same soft check as the sheet: a reading under the nominal bore is a warning to confirm", () => {
    const text = fixture("clean.csv").replace("640.530", "639.800");
    const p = parseCsv(text);
    const pv = buildPreview(p.rows, p640Context(), { destination: "history", mapping: guessMapping(p.header!), options: p.options, header: p.header, excludedLines: [] });
    expect(pv.errorCount).toBe(0);
    expect(pv.issues.find((i) => i.line === 4 && i.level === "warning")?.message).toContain("under the 640.00 mm nominal bore");
    expect(pv.groups[0].readings.find((r) => r.line === 4)?.warning).toContain("A liner does not shrink");
  });

  it("a gauging dated before its liner was fitted is refused for all its lines", () => {
    const p = previewOf("clean.csv", { ctx: p640Context({ linerFittedOn: "2024-06-01" }) });
    expect(p.errorLines).toHaveLength(22);
    expect(p.issues[0].message).toContain("No liner on record in cylinder 1 on 2024-05-30");
  });

  it("a day already on record is refused, unless the import holding it is being replaced", () => {
    const ctx = p640Context();
    ctx.existing = [{ unitId: 11, inspectedOn: "2024-05-30", inspectionId: 900, importId: 4 }];
    expect(previewOf("clean.csv", { ctx }).issues[0].message).toContain("already has a gauging on 2024-05-30");
    expect(previewOf("clean.csv", { ctx, replacesImportId: 4 }).errorCount).toBe(0);
  });
});

describe("ten years of an engine's records", () => {
  it("groups into 60 gaugings (6 units × 10), with wear that grows year on year and no error or warning", () => {
    const p = previewOf("history-10-years.csv");
    expect(p.errorCount).toBe(0);
    expect(p.warningCount).toBe(0);
    expect(p.groups).toHaveLength(60);
    const unit3 = p.groups.filter((g) => g.cylinderNo === 3).map((g) => g.maxWearMm!);
    expect(unit3).toHaveLength(10);
    for (let i = 1; i < unit3.length; i++) expect(unit3[i]).toBeGreaterThan(unit3[i - 1]);
    // A normal slow-speed rate (0.025–0.05 mm / 1000 h, BrightHub Engineering) over the decade.
    const last = p.groups.filter((g) => g.cylinderNo === 3).at(-1)!;
    expect((last.maxWearMm! * 1000) / last.linerHours).toBeGreaterThan(0.025);
    expect((last.maxWearMm! * 1000) / last.linerHours).toBeLessThan(0.05);
  });

  it("a gauging compares with the file's previous one, as the sheet compares with last time", () => {
    const text = fixture("history-10-years.csv");
    const p = parseCsv(text);
    // Cylinder 1's fifth gauging, ring 1 at TDC fore–aft, made 0.5 mm smaller than the year before.
    const rows = p.rows.filter((r) => r.cells[0] === "1" && r.cells[4] === "R1" && r.cells[6] === "fa");
    const target = rows[4];
    target.cells[7] = (Number(rows[3].cells[7]) - 0.5).toFixed(3);
    const pv = buildPreview(p.rows, p640Context(), { destination: "history", mapping: guessMapping(p.header!), options: p.options, header: p.header, excludedLines: [] });
    expect(pv.issues.find((i) => i.line === target.line)?.message).toContain("smaller than last time");
  });

  it("every field of our layout can be mapped", () => {
    expect(Object.keys(LAYOUT).sort()).toEqual([...IMPORT_FIELDS].filter((f) => f !== "lengthUnit").sort());
  });
});
