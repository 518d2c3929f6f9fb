import { MM_PER_INCH, type LengthUnit } from "@/lib/units/length";
import { parseNumberInput } from "@/lib/units/parse-number";
import type { ContextProfile } from "./context";
import { cellKey } from "./context";
import type { InspectionDraft, InspectionHeader, RingReadingInput } from "./schemas";
import { emptyChecklist } from "./constants";

/*
 * The entry form keeps what was typed as text, exactly, so a half-typed or mistyped
 * value survives a reload and an offline spell on the device; `toDraft` turns it into
 * the numbers the server stores (in millimetres) and lists what could not be read.
 */

export type CellEntry = { text: string; unit: LengthUnit; confirmed: string | null };
export type RingEntry = {
  /** The unit the three lengths below are typed in; absent in records kept before it existed (mm). */
  unit?: LengthUnit;
  closedGap: string;
  gapMeasuredIn: RingReadingInput["gapMeasuredIn"];
  /** Liner diameter where a gap was measured in a worn part of the liner. */
  gapLinerDiameter?: string;
  groove: string;
  renewed: boolean;
  condition: string;
};
/** A ring not yet touched on the sheet. */
export const emptyRing: RingEntry = { closedGap: "", gapMeasuredIn: null, groove: "", renewed: false, condition: "" };

export type TallyEntry = { key: string; label: string; countIn: string; countOut: string };

export type FormState = {
  header: {
    inspectedOn: string;
    engineHours: string;
    linerHours: string;
    linerHoursReason: string;
    crew: string;
    gaugeTempC: string;
    linerTempC: string;
    notes: string;
  };
  entryUnit: LengthUnit;
  cells: Record<string, CellEntry>;
  rings: Record<string, RingEntry>;
  checklist: {
    tally: TallyEntry[];
    closingName: string;
    /** ISO instant, or "" when not signed. */
    closingAt: string;
    rodNutPressure: string;
    stuffingBoxDone: boolean;
    stuffingBoxNote: string;
    lubricationDone: boolean;
    lubricationNote: string;
  };
};

/**
 * A number as typed on a tablet (see `parseNumberInput`): a comma or a point for the decimal,
 * spaces between thousands. `expected` is about how large the field's values are, which
 * settles "1,250"; when nothing settles it the value is "invalid" here (kept on the device,
 * not saved) and the sheet asks. Null for an empty field.
 */
export function parseDecimal(text: string, expected?: number | null): number | null | "invalid" {
  const p = parseNumberInput(text, { expected });
  return p.kind === "number" ? p.value : p.kind === "empty" ? null : "invalid";
}

/** About how large each field's values are, to settle a typed "1,250" (see `parseNumberInput`). */
export type ExpectedSizes = {
  engineHours: number | null;
  linerHours: number | null;
  temperatureC: number;
  /** Nominal bore, mm. */
  diameterMm: number;
  gapMm: (position: number) => number | null;
  grooveMm: (position: number) => number | null;
  pressureBar: number;
  count: number;
};

/**
 * The expected sizes for a sheet: the hours last saved (a counter is never a fraction of
 * them), about 20 °C, the nominal bore, each ring's limits, and the profile's rod nut pressure
 * (or about 1000 bar, the order of hydraulic tightening pressures, common practice).
 */
export function expectedSizes(profile: ContextProfile, hours: { engineHours: number | null; linerHours: number | null }): ExpectedSizes {
  const ring = (position: number) => profile.rings.find((r) => r.position === position);
  return {
    engineHours: hours.engineHours || null,
    linerHours: hours.linerHours || null,
    temperatureC: 20,
    diameterMm: profile.boreMm,
    gapMm: (position) => ring(position)?.gapLimitMm ?? null,
    grooveMm: (position) => ring(position)?.grooveLimitMm ?? null,
    pressureBar: profile.rodNutPressureBar ?? 1000,
    count: 10,
  };
}

/** An expected length in mm as the size of a value typed in `unit`. */
export const expectedIn = (mm: number | null, unit: LengthUnit) => (mm == null ? null : unit === "in" ? mm / MM_PER_INCH : mm);

/** A length as typed, in millimetres rounded to the 1 µm the database keeps. */
export function toMm(value: number, unit: LengthUnit): number {
  const mm = unit === "in" ? value * MM_PER_INCH : value;
  return Math.round(mm * 1000) / 1000;
}

/**
 * A ring's typed lengths in another unit, as the sheet's mm/inch switch does for every ring:
 * numbers are converted, anything half-typed or not a number is left as typed.
 */
export function ringInUnit(r: RingEntry, unit: LengthUnit): RingEntry {
  const from = r.unit ?? "mm";
  if (from === unit) return { ...r, unit };
  const convert = (text: string | undefined) => {
    if (text === undefined) return undefined;
    const v = parseDecimal(text);
    return typeof v === "number" ? lengthText(toMm(v, from), unit) : text;
  };
  return { ...r, unit, closedGap: convert(r.closedGap)!, groove: convert(r.groove)!, gapLinerDiameter: convert(r.gapLinerDiameter) };
}

/** A stored millimetre value as text in the unit it is shown in (inches to 0.0001 in). */
export function lengthText(mm: number, unit: LengthUnit): string {
  // Gauges read to 0.01 mm: keep two decimals at least, and the third when the value has one.
  if (unit === "mm") return (Math.round(mm * 1000) / 1000).toFixed(3).replace(/0$/, "");
  return (mm / MM_PER_INCH).toFixed(4);
}

const str = (v: number | null | undefined) => (v == null ? "" : String(v));

export function fromDraft(draft: InspectionDraft, profile: ContextProfile): FormState {
  const cells: Record<string, CellEntry> = {};
  for (const r of draft.readings) {
    cells[cellKey(r.stationKey, r.axisKey)] = { text: lengthText(r.diameterMm, r.enteredUnit), unit: r.enteredUnit, confirmed: r.warningConfirmed };
  }
  // Rings are stored in mm and shown in the sheet's unit: inches when every reading was typed in inches.
  const units = draft.readings.map((r) => r.enteredUnit);
  const entryUnit: LengthUnit = units.length && units.every((u) => u === "in") ? "in" : "mm";
  const ringText = (v: number | null | undefined) => (v == null ? "" : entryUnit === "mm" ? String(v) : lengthText(v, "in"));
  const rings: Record<string, RingEntry> = {};
  for (const spec of profile.rings) {
    const r = draft.rings.find((x) => x.position === spec.position);
    rings[spec.position] = {
      unit: entryUnit,
      closedGap: ringText(r?.closedGapMm),
      gapMeasuredIn: r?.gapMeasuredIn ?? null,
      gapLinerDiameter: ringText(r?.gapLinerDiameterMm),
      groove: ringText(r?.grooveClearanceMm),
      renewed: r?.renewed ?? false,
      condition: r?.condition ?? "",
    };
  }
  const c = draft.checklist ?? emptyChecklist();
  return {
    header: {
      inspectedOn: draft.header.inspectedOn,
      engineHours: str(draft.header.engineHours),
      linerHours: str(draft.header.linerHours),
      linerHoursReason: draft.header.linerHoursReason ?? "",
      crew: draft.header.crew ?? "",
      gaugeTempC: str(draft.header.gaugeTempC),
      linerTempC: str(draft.header.linerTempC),
      notes: draft.header.notes ?? "",
    },
    entryUnit,
    cells,
    rings,
    checklist: {
      tally: c.tally.map((t) => ({ key: t.key, label: t.label, countIn: str(t.countIn), countOut: str(t.countOut) })),
      closingName: c.closing.signedName ?? "",
      closingAt: c.closing.signedAt ?? "",
      rodNutPressure: str(c.rodNutPressureBar),
      stuffingBoxDone: c.stuffingBox.done,
      stuffingBoxNote: c.stuffingBox.note ?? "",
      lubricationDone: c.cylinderLubrication.done,
      lubricationNote: c.cylinderLubrication.note ?? "",
    },
  };
}

export type ConvertedForm = {
  draft: InspectionDraft;
  /** Fields whose text is not a number: kept on the device, not sent to the server. */
  invalid: string[];
};

/**
 * The form as the draft the server stores. Text that does not read as a number is left
 * out (and listed) rather than sent, so one mistyped cell never blocks saving the rest;
 * required header numbers that do not read fall back to the last saved values.
 */
export function toDraft(form: FormState, profile: ContextProfile, fallback: InspectionHeader): ConvertedForm {
  const invalid: string[] = [];
  const sizes = expectedSizes(profile, fallback);
  const read = (field: string, text: string, expected?: number | null): number | null => {
    const v = parseDecimal(text, expected);
    if (v === "invalid") {
      invalid.push(field);
      return null;
    }
    return v;
  };
  const required = (field: string, text: string, fb: number) => {
    const v = read(field, text, fb || null);
    if (v === null && !invalid.includes(field)) invalid.push(field);
    return v ?? fb;
  };
  const count = (field: string, text: string) => {
    const v = read(field, text, sizes.count);
    if (v !== null && (!Number.isInteger(v) || v < 0)) {
      invalid.push(field);
      return null;
    }
    return v;
  };
  const text = (s: string) => (s.trim() === "" ? null : s.trim());

  const header: InspectionHeader = {
    inspectedOn: /^\d{4}-\d{2}-\d{2}$/.test(form.header.inspectedOn) ? form.header.inspectedOn : fallback.inspectedOn,
    engineHours: required("header.engineHours", form.header.engineHours, fallback.engineHours),
    linerHours: required("header.linerHours", form.header.linerHours, fallback.linerHours),
    linerHoursReason: text(form.header.linerHoursReason),
    crew: text(form.header.crew),
    gaugeTempC: read("header.gaugeTempC", form.header.gaugeTempC, sizes.temperatureC),
    linerTempC: read("header.linerTempC", form.header.linerTempC, sizes.temperatureC),
    notes: text(form.header.notes),
  };

  const readings: InspectionDraft["readings"] = [];
  for (const s of profile.stations) {
    for (const a of profile.axes) {
      const key = cellKey(s.key, a.key);
      const cell = form.cells[key];
      if (!cell) continue;
      const v = read(`readings.${key}`, cell.text, expectedIn(sizes.diameterMm, cell.unit));
      if (v === null) continue;
      if (v <= 0) {
        invalid.push(`readings.${key}`);
        continue;
      }
      readings.push({ stationKey: s.key, axisKey: a.key, diameterMm: toMm(v, cell.unit), enteredUnit: cell.unit, warningConfirmed: cell.confirmed });
    }
  }

  const rings: InspectionDraft["rings"] = profile.rings.map((spec) => {
    const r = form.rings[spec.position];
    const length = (field: string, text: string, expectedMm: number | null) => {
      const v = read(field, text, expectedIn(expectedMm, r?.unit ?? "mm"));
      return v === null ? null : toMm(v, r?.unit ?? "mm");
    };
    return {
      position: spec.position,
      closedGapMm: r ? length(`rings.${spec.position}.closedGapMm`, r.closedGap, spec.gapLimitMm) : null,
      gapMeasuredIn: r?.gapMeasuredIn ?? null,
      gapLinerDiameterMm:
        r && r.gapMeasuredIn === "liner_worn" && r.gapLinerDiameter ? length(`rings.${spec.position}.gapLinerDiameterMm`, r.gapLinerDiameter, profile.boreMm) : null,
      grooveClearanceMm: r ? length(`rings.${spec.position}.grooveClearanceMm`, r.groove, spec.grooveLimitMm) : null,
      renewed: r?.renewed ?? false,
      condition: r ? text(r.condition) : null,
    };
  });

  const c = form.checklist;
  const draft: InspectionDraft = {
    header,
    readings,
    rings,
    checklist: {
      tally: c.tally.map((t, i) => ({
        key: t.key,
        label: t.label.trim() || `Item ${i + 1}`,
        countIn: count(`checklist.tally.${i}.countIn`, t.countIn),
        countOut: count(`checklist.tally.${i}.countOut`, t.countOut),
      })),
      closing: { signedName: text(c.closingName), signedAt: c.closingAt || null },
      rodNutPressureBar: read("checklist.rodNutPressureBar", c.rodNutPressure, sizes.pressureBar),
      stuffingBox: { done: c.stuffingBoxDone, note: text(c.stuffingBoxNote) },
      cylinderLubrication: { done: c.lubricationDone, note: text(c.lubricationNote) },
    },
  };
  return { draft, invalid };
}

/**
 * The sheet with the two directions' typed values exchanged at every station (confirmations
 * are dropped, since the warnings they answered no longer apply): one tap when the readings
 * were entered the other way round.
 */
export function swapDirections(form: FormState, profile: Pick<ContextProfile, "stations" | "axes">): FormState {
  const [a, b] = profile.axes;
  const cells: Record<string, CellEntry> = { ...form.cells };
  for (const s of profile.stations) {
    const ka = cellKey(s.key, a.key);
    const kb = cellKey(s.key, b.key);
    const ca = form.cells[ka];
    const cb = form.cells[kb];
    delete cells[ka];
    delete cells[kb];
    if (cb) cells[ka] = { ...cb, confirmed: null };
    if (ca) cells[kb] = { ...ca, confirmed: null };
  }
  return { ...form, cells };
}

/** A short random token for idempotent creates and tally keys (browser or server crypto). */
export function randomToken(length = 24): string {
  const alphabet = "abcdefghijklmnopqrstuvwxyz0123456789";
  const bytes = new Uint8Array(length);
  globalThis.crypto.getRandomValues(bytes);
  return Array.from(bytes, (b) => alphabet[b % alphabet.length]).join("");
}

/** Default crankcase tally rows; the engineer edits the list to what actually went in. */
export const DEFAULT_TALLY_LABELS = ["Spanners and sockets", "Torch / hand lamp", "Rags", "Measuring tools"];
