import { analyseGauging, toGauging } from "@/lib/analysis/input";
import { cellKey, toWearProfile, type ContextLiner, type ContextProfile, type InspectionContext, type PreviousInspection } from "@/lib/inspections/context";
import { checkHours, readingChecks, ringFindings, warningText } from "@/lib/inspections/rules";
import type { Finding } from "@/lib/wear/plausibility";
import type { RunningHoursEntry } from "@/lib/wear/calendar";
import type { Inspection } from "@/lib/wear/types";
import { MAX_RUNNING_HOURS } from "@/lib/validation/bounds";
import { EARLIEST_RECORD_DATE, latestRecordDate } from "@/lib/validation/dates";
import { FIELD_LABELS, headerUnit, type ColumnMapping, type ImportField } from "./layout";
import { axisByName, stationAtDepth, stationByName, toMm } from "./match";
import { cellOf, parseFileDate, parseFileNumber, type CsvOptions, type FileRow, type LengthUnit } from "./parse";

/*
 * From parsed rows to what would be written: rows matched to units, liners and stations, grouped
 * into gaugings (one per unit and date), wear worked out per reading, and every problem with its
 * line number. The checks are the gauging sheet's own (lib/inspections/rules.ts and
 * lib/wear/plausibility.ts), applied to each gauging as the sheet would: hard errors block the
 * import, warnings must be confirmed. Pure, so tests and the benchmark call it directly.
 */

export type ImportDestination = "draft" | "history";

export type ImportLiner = ContextLiner & { removedOn: string | null };
export type ImportUnit = { id: number; cylinderNo: number; liners: ImportLiner[] };
/** An approved gauging already on record, as "last time" for the checks. */
export type PriorGauging = PreviousInspection & { unitId: number; importId: number | null };
/** A record already holding a gauging of a unit on a day (any state but superseded). */
export type ExistingRecord = { unitId: number; inspectedOn: string; inspectionId: number; importId: number | null };

export type ImportContext = {
  engine: { id: number; serial: string; vesselId: number; vesselName: string };
  profile: ContextProfile;
  units: ImportUnit[];
  prior: PriorGauging[];
  existing: ExistingRecord[];
  hoursLog: RunningHoursEntry[];
};

/** For a gauge file: the unit it is for and the draft's header (an existing draft's, or the new one's). */
export type DraftTarget = {
  unitId: number;
  linerId: number;
  header: { inspectedOn: string; engineHours: number; linerHours: number; gaugeTempC: number | null; linerTempC: number | null };
};

export type PreviewSettings = {
  destination: ImportDestination;
  mapping: ColumnMapping;
  options: CsvOptions;
  header: string[] | null;
  excludedLines: readonly number[];
  draft?: DraftTarget | null;
  /** An earlier import this one replaces: its records are not "already on record". */
  replacesImportId?: number | null;
};

export type RowIssue = { line: number; level: "error" | "warning"; message: string; /** every line of a gauging, for an issue about the whole gauging */ lines?: number[] };

export type PreviewReading = {
  line: number;
  stationKey: string;
  axisKey: string;
  diameterMm: number;
  enteredUnit: LengthUnit;
  wearMm: number | null;
  /** The warnings this reading carries, as stored when confirmed. */
  warning: string | null;
};

export type PreviewRing = { line: number; position: number; closedGapMm: number | null; grooveClearanceMm: number | null };

export type PreviewGroup = {
  unitId: number;
  cylinderNo: number;
  linerId: number;
  linerSerial: string;
  inspectedOn: string;
  engineHours: number;
  linerHours: number;
  gaugeTempC: number | null;
  linerTempC: number | null;
  gaugeSerial: string | null;
  note: string | null;
  lines: number[];
  readings: PreviewReading[];
  rings: PreviewRing[];
  maxWearMm: number | null;
};

export type Preview = {
  rowCount: number;
  groups: PreviewGroup[];
  issues: RowIssue[];
  errorLines: number[];
  errorCount: number;
  warningCount: number;
  excludedLines: number[];
};

type Header = { date: string | null; engineHours: number | null; linerHours: number | null; gaugeTempC: number | null; linerTempC: number | null; gaugeSerial: string | null; note: string | null };
type Pending = {
  unitId: number;
  cylinderNo: number;
  date: string;
  lines: number[];
  header: Header;
  readings: Omit<PreviewReading, "wearMm" | "warning">[];
  rings: PreviewRing[];
};

const TEMP_MIN = -30;
const TEMP_MAX = 150;

/** Builds the preview of a parsed file under one mapping. */
export function buildPreview(rows: readonly FileRow[], ctx: ImportContext, settings: PreviewSettings): Preview {
  const { mapping, options, destination } = settings;
  const excluded = new Set(settings.excludedLines);
  const issues: RowIssue[] = [];
  const err = (line: number, message: string, lines?: number[]) => issues.push({ line, level: "error", message, ...(lines ? { lines } : {}) });
  const warn = (line: number, message: string, lines?: number[]) => issues.push({ line, level: "warning", message, ...(lines ? { lines } : {}) });
  const profile = ctx.profile;
  const unitByNo = new Map(ctx.units.map((u) => [u.cylinderNo, u]));
  const unitById = new Map(ctx.units.map((u) => [u.id, u]));
  const draftUnit = settings.draft ? unitById.get(settings.draft.unitId) ?? null : null;
  const cylinders = ctx.units.map((u) => u.cylinderNo).sort((a, b) => a - b);
  const unitOf = (field: ImportField) => (settings.header && mapping[field] !== undefined ? headerUnit(settings.header[mapping[field]!] ?? "") : null);
  const columnUnit = { diameter: unitOf("diameter"), depth: unitOf("depth"), closedGap: unitOf("closedGap"), grooveClearance: unitOf("grooveClearance") };

  const groups = new Map<string, Pending>();
  let rowCount = 0;
  // A history repeats the same few dates, stations and directions on every row: read each once.
  const latest = latestRecordDate();
  const dates = new Map<string, ReturnType<typeof parseFileDate>>();
  const stationsByText = new Map<string, ReturnType<typeof stationByName>>();
  const axesByText = new Map<string, string | null>();
  const memo = <V,>(cache: Map<string, V>, key: string, make: () => V): V => {
    let v = cache.get(key);
    if (v === undefined && !cache.has(key)) cache.set(key, (v = make()));
    return v as V;
  };

  for (const row of rows) {
    if (excluded.has(row.line)) continue;
    rowCount++;
    const line = row.line;
    const cell = (f: ImportField) => cellOf(row, mapping, f);
    let rowOk = true;
    const fail = (message: string) => {
      err(line, message);
      rowOk = false;
    };
    const number = (f: ImportField, o: { required?: boolean; min?: number; max?: number; unit?: string } = {}): { value: number | null; unit: LengthUnit | null } => {
      const parsed = parseFileNumber(cell(f), options.decimalMark);
      const label = FIELD_LABELS[f].toLowerCase();
      if (parsed.kind === "empty") {
        if (o.required) fail(`No ${label}.`);
        return { value: null, unit: null };
      }
      if (parsed.kind !== "number") {
        fail(`${FIELD_LABELS[f]}: ${parsed.message}`);
        return { value: null, unit: null };
      }
      if ((o.min !== undefined && parsed.value < o.min) || (o.max !== undefined && parsed.value > o.max)) {
        fail(`${FIELD_LABELS[f]} ${parsed.value}${o.unit ?? ""} is outside ${o.min} … ${o.max}${o.unit ?? ""}.`);
        return { value: null, unit: null };
      }
      return { value: parsed.value, unit: parsed.unit };
    };

    // Which unit.
    let unit: ImportUnit | null = null;
    const cylText = cell("cylinder").trim();
    if (cylText) {
      const n = /^(?:cyl(?:inder)?\.?\s*|unit\s*|no\.?\s*|#)?(\d{1,2})$/i.exec(cylText);
      const found = n ? unitByNo.get(Number(n[1])) : undefined;
      if (!found) {
        fail(`Unknown unit "${cylText.slice(0, 20)}": engine ${ctx.engine.serial} has cylinders ${cylinders[0]}–${cylinders.at(-1)}.`);
      } else unit = found;
    }
    if (destination === "draft") {
      if (unit && draftUnit && unit.id !== draftUnit.id) fail(`This row is for cylinder ${unit.cylinderNo}, but the draft is for cylinder ${draftUnit.cylinderNo}.`);
      unit = draftUnit;
    } else if (!cylText) fail("No cylinder: a row of past records must name its unit.");

    // Which day.
    let date: string | null = null;
    const dateText = cell("date");
    const d = memo(dates, dateText, () => parseFileDate(dateText));
    if (d.kind === "invalid") fail(`Date: ${d.message}`);
    else if (d.kind === "date") {
      if (d.iso < EARLIEST_RECORD_DATE || d.iso > latest) fail(`The date ${d.iso} is ${d.iso > latest ? "in the future" : "before 1950"}: check the year.`);
      else date = d.iso;
    } else if (destination === "history") fail("No date: a row of past records must say when it was gauged.");
    if (destination === "draft") date = settings.draft?.header.inspectedOn ?? date;

    const engineHours = number("engineHours", { required: destination === "history", min: 0, max: MAX_RUNNING_HOURS, unit: " h" }).value;
    const linerHours = number("linerHours", { min: 0, max: MAX_RUNNING_HOURS, unit: " h" }).value;
    const linerTempC = number("linerTempC", { min: TEMP_MIN, max: TEMP_MAX, unit: " °C" }).value;
    const gaugeTempC = number("gaugeTempC", { min: TEMP_MIN, max: TEMP_MAX, unit: " °C" }).value;
    let rowUnit: LengthUnit = options.lengthUnit;
    const unitText = cell("lengthUnit").trim().toLowerCase();
    if (unitText) {
      if (["mm", "millimetre", "millimeter", "millimetres", "millimeters"].includes(unitText)) rowUnit = "mm";
      else if (["in", "inch", "inches", '"'].includes(unitText)) rowUnit = "in";
      else fail(`Length unit "${unitText.slice(0, 12)}" is neither mm nor in.`);
    }

    const ringText = cell("ring").trim();
    let reading: Pending["readings"][number] | null = null;
    let ring: PreviewRing | null = null;
    if (ringText) {
      const pos = /^\d{1,2}$/.test(ringText) ? Number(ringText) : NaN;
      const spec = profile.rings.find((r) => r.position === pos);
      if (!spec) fail(`Ring "${ringText.slice(0, 10)}" is not in the engine profile (rings 1–${profile.rings.length}).`);
      const gap = number("closedGap", { min: 0, max: 1000 });
      const groove = number("grooveClearance", { min: 0, max: 1000 });
      const gapMm = gap.value === null ? null : toMm(gap.value, gap.unit ?? columnUnit.closedGap ?? rowUnit);
      const grooveMm = groove.value === null ? null : toMm(groove.value, groove.unit ?? columnUnit.grooveClearance ?? rowUnit);
      if (rowOk && gapMm === null && grooveMm === null) fail("A ring row needs a closed gap or a groove clearance.");
      if (rowOk && spec) {
        for (const f of ringFindings(profile, spec, { position: pos, closedGapMm: gapMm, grooveClearanceMm: grooveMm, gapMeasuredIn: "gauge_ring", renewed: false, condition: null })) {
          if (f.level === "error") fail(`${spec.label}: ${f.message}`);
          else warn(line, `${spec.label}: ${f.message}`);
        }
      }
      ring = { line, position: pos, closedGapMm: gapMm, grooveClearanceMm: grooveMm };
    } else {
      const stationText = cell("station").trim();
      let stationKey: string | null = null;
      if (stationText) {
        const m = memo(stationsByText, stationText, () => stationByName(profile, stationText));
        if (m.kind === "ok") stationKey = m.station.key;
        else fail(m.message);
      } else {
        const depth = number("depth", { min: 0, max: 100_000 });
        if (depth.value !== null) {
          const m = stationAtDepth(profile, toMm(depth.value, depth.unit ?? columnUnit.depth ?? rowUnit));
          if (m.kind === "ok") stationKey = m.station.key;
          else fail(m.message);
        } else if (rowOk) fail("No station and no depth: the row cannot be placed on the liner.");
      }
      const dirText = cell("direction");
      const axisKey = memo(axesByText, dirText, () => axisByName(profile, dirText));
      if (!dirText.trim()) fail("No direction.");
      else if (!axisKey) fail(`Direction "${dirText.trim().slice(0, 20)}" is neither ${profile.axes.map((a) => `${a.key} (${a.label.toLowerCase()})`).join(" nor ")}.`);
      const dia = number("diameter", { required: true });
      if (rowOk && stationKey && axisKey && dia.value !== null) {
        const entered = dia.unit ?? columnUnit.diameter ?? rowUnit;
        const diameterMm = Math.round(toMm(dia.value, entered) * 1000) / 1000;
        reading = { line, stationKey, axisKey, diameterMm, enteredUnit: entered };
      }
    }
    if (!rowOk || !unit || !date) continue;
    const key = `${unit.id}|${date}`;
    let g = groups.get(key);
    if (!g) {
      g = { unitId: unit.id, cylinderNo: unit.cylinderNo, date, lines: [], readings: [], rings: [], header: { date, engineHours: null, linerHours: null, gaugeTempC: null, linerTempC: null, gaugeSerial: null, note: null } };
      groups.set(key, g);
    }
    g.lines.push(line);
    // The gauging's header is taken from its rows; rows that disagree are an error on the later row.
    const agree = (field: keyof Header, value: number | string | null, label: string) => {
      if (value === null || value === "") return true;
      const had = g!.header[field];
      if (had === null) {
        (g!.header as Record<string, unknown>)[field] = value;
        return true;
      }
      if (had !== value) {
        err(line, `${label} ${value} differs from ${had} on an earlier row of the same gauging (cylinder ${unit!.cylinderNo}, ${date}).`);
        return false;
      }
      return true;
    };
    const ok =
      agree("engineHours", engineHours, "Engine hours") &&
      agree("linerHours", linerHours, "Liner hours") &&
      agree("linerTempC", linerTempC, "Liner temperature") &&
      agree("gaugeTempC", gaugeTempC, "Gauge temperature") &&
      agree("gaugeSerial", cell("gaugeSerial").trim().slice(0, 60) || null, "Gauge serial");
    const note = cell("note").trim();
    if (note) g.header.note = g.header.note ? `${g.header.note}\n${note}`.slice(0, 5000) : note.slice(0, 5000);
    if (!ok) continue;
    if (reading) {
      const dup = g.readings.find((r) => r.stationKey === reading!.stationKey && r.axisKey === reading!.axisKey);
      if (dup) {
        const st = profile.stations.find((s) => s.key === reading!.stationKey)!;
        const ax = profile.axes.find((a) => a.key === reading!.axisKey)!;
        err(line, `Duplicate station and direction: ${st.label} ${ax.label.toLowerCase()} was already read on line ${dup.line} for cylinder ${unit.cylinderNo} on ${date}. Leave one of the two rows out.`);
      } else g.readings.push(reading);
    }
    if (ring) {
      const dup = g.rings.find((r) => r.position === ring!.position);
      if (dup) err(line, `Ring ${ring.position} was already given on line ${dup.line} for cylinder ${unit.cylinderNo} on ${date}. Leave one of the two rows out.`);
      else g.rings.push(ring);
    }
  }

  const out = finishGroups([...groups.values()], ctx, settings, err, warn);
  const errorLines = [...new Set(issues.filter((i) => i.level === "error").flatMap((i) => i.lines ?? [i.line]))].sort((a, b) => a - b);
  issues.sort((a, b) => a.line - b.line || (a.level === b.level ? 0 : a.level === "error" ? -1 : 1));
  return {
    rowCount,
    groups: out,
    issues,
    errorLines,
    errorCount: issues.filter((i) => i.level === "error").length,
    warningCount: issues.filter((i) => i.level === "warning").length,
    excludedLines: [...excluded].sort((a, b) => a - b),
  };
}

/** The liner fitted in a unit on a day (fitted on or before it, not removed before it). */
export function linerOn(unit: ImportUnit, date: string): ImportLiner | null {
  return unit.liners.filter((l) => l.installedOn <= date && (l.removedOn === null || l.removedOn >= date)).sort((a, b) => (a.installedOn < b.installedOn ? 1 : -1))[0] ?? null;
}

function finishGroups(
  pending: Pending[],
  ctx: ImportContext,
  settings: PreviewSettings,
  err: (line: number, message: string, lines?: number[]) => void,
  warn: (line: number, message: string, lines?: number[]) => void,
): PreviewGroup[] {
  const profile = ctx.profile;
  const wearProfile = toWearProfile(profile);
  const replaces = settings.replacesImportId ?? null;
  const unitById = new Map(ctx.units.map((u) => [u.id, u]));
  // Earlier gaugings per liner, oldest first: on record, then this file's as they are accepted.
  const byLiner = new Map<number, PreviousInspection[]>();
  for (const p of ctx.prior) {
    if (replaces !== null && p.importId === replaces) continue;
    let list = byLiner.get(p.linerId);
    if (!list) byLiner.set(p.linerId, (list = []));
    list.push(p);
  }
  const existing = new Map<string, ExistingRecord>();
  for (const e of ctx.existing) if (replaces === null || e.importId !== replaces) existing.set(`${e.unitId}|${e.inspectedOn}`, e);
  const sorted = [...pending].sort((a, b) => (a.date < b.date ? -1 : a.date > b.date ? 1 : a.cylinderNo - b.cylinderNo));
  const out: PreviewGroup[] = [];
  for (const g of sorted) {
    const unit = unitById.get(g.unitId)!;
    const first = g.lines[0];
    const where = `cylinder ${g.cylinderNo}, ${g.date}`;
    const draft = settings.destination === "draft" ? settings.draft! : null;
    const liner = draft ? unit.liners.find((l) => l.id === draft.linerId) ?? null : linerOn(unit, g.date);
    if (!liner) {
      err(first, `No liner on record in cylinder ${g.cylinderNo} on ${g.date}. Record the liner fitted then (engine set-up) before importing its gaugings.`, g.lines);
      continue;
    }
    if (!draft) {
      const clash = existing.get(`${g.unitId}|${g.date}`);
      if (clash) {
        err(first, `Cylinder ${g.cylinderNo} already has a gauging on ${g.date} in Kalibore (record ${clash.inspectionId}${clash.importId ? `, from import ${clash.importId}` : ""}). Leave these rows out, or import this file as a replacement of that import.`, g.lines);
        continue;
      }
    }
    const engineHours = draft ? draft.header.engineHours : g.header.engineHours!;
    const linerHours = draft
      ? draft.header.linerHours
      : g.header.linerHours ?? Math.round((liner.linerHoursAtInstall + engineHours - liner.installedEngineHours) * 10) / 10;
    const header = {
      inspectedOn: g.date,
      engineHours,
      linerHours,
      gaugeTempC: g.header.gaugeTempC ?? draft?.header.gaugeTempC ?? null,
      linerTempC: g.header.linerTempC ?? draft?.header.linerTempC ?? null,
    };
    // The liner's gaugings are kept in date order: the ones before this one end at `before`.
    const ofLiner = byLiner.get(liner.id) ?? [];
    const isEarlier = (p: PreviousInspection) => p.inspectedOn < g.date || (p.inspectedOn === g.date && p.engineHours < engineHours);
    let before = ofLiner.length;
    while (before > 0 && !isEarlier(ofLiner[before - 1])) before--;
    const previousOfLiner = before > 0 ? ofLiner[before - 1] : null;
    const firstOfLiner = before > 0 ? ofLiner[0] : null;
    const asFitted: Inspection | null =
      profile.wearReference === "as_fitted" && firstOfLiner
        ? toGauging(firstOfLiner.id, { inspectedOn: firstOfLiner.inspectedOn, engineHours: firstOfLiner.engineHours, linerHours: firstOfLiner.linerHours, gaugeTempC: firstOfLiner.gaugeTempC, linerTempC: firstOfLiner.linerTempC }, firstOfLiner.readings)
        : null;
    const inspectionCtx: InspectionContext = {
      unit: { id: unit.id, cylinderNo: unit.cylinderNo, engineId: ctx.engine.id, engineSerial: ctx.engine.serial, vesselId: ctx.engine.vesselId, vesselName: ctx.engine.vesselName },
      profile,
      liner,
      previous: previousOfLiner,
      hoursLog: ctx.hoursLog,
      asFitted,
    };
    let groupOk = true;
    if (!draft) {
      const hours = checkHours(inspectionCtx, { ...header, linerHoursReason: g.header.linerHours === null ? null : g.header.note });
      for (const e of hours.errors) {
        err(first, `${where}: ${e.message}${e.field === "header.linerHoursReason" ? " Put the reason in the note column." : ""}`, g.lines);
        groupOk = false;
      }
      for (const w of hours.warnings) warn(first, `${where}: ${w.message}`, g.lines);
    }
    const draftForChecks = { header: { ...header, linerHoursReason: null, crew: null, notes: null }, readings: g.readings.map((r) => ({ stationKey: r.stationKey, axisKey: r.axisKey, diameterMm: r.diameterMm, enteredUnit: r.enteredUnit, warningConfirmed: null })) };
    const checks = readingChecks(inspectionCtx, draftForChecks);
    const lineOf = new Map(g.readings.map((r) => [cellKey(r.stationKey, r.axisKey), r.line]));
    const warningOf = new Map<string, Finding[]>();
    for (const [key, findings] of checks.cells) {
      const line = lineOf.get(key) ?? first;
      for (const f of findings) {
        if (f.level === "error") {
          err(line, f.message);
          groupOk = false;
        } else if (f.code !== "same_value_everywhere") warn(line, f.message);
      }
      warningOf.set(key, findings);
    }
    for (const f of checks.sheet) warn(first, `${where}: ${f.message}`, g.lines);
    if (!groupOk) continue;
    const analysis = analyseGauging(wearProfile, toGauging("import", header, draftForChecks.readings), asFitted);
    const wearOf = new Map(analysis.cells.map((c) => [cellKey(c.stationKey, c.axisKey), c.wearMm]));
    const group: PreviewGroup = {
      unitId: unit.id,
      cylinderNo: unit.cylinderNo,
      linerId: liner.id,
      linerSerial: liner.serial,
      inspectedOn: g.date,
      engineHours,
      linerHours,
      gaugeTempC: header.gaugeTempC,
      linerTempC: header.linerTempC,
      gaugeSerial: g.header.gaugeSerial,
      note: g.header.note,
      lines: g.lines,
      readings: g.readings.map((r) => {
        const key = cellKey(r.stationKey, r.axisKey);
        const w = warningOf.get(key) ?? [];
        return {
          line: r.line,
          stationKey: r.stationKey,
          axisKey: r.axisKey,
          diameterMm: r.diameterMm,
          enteredUnit: r.enteredUnit,
          wearMm: wearOf.get(key) ?? null,
          warning: w.some((f) => f.level === "warning") ? warningText(w) : null,
        };
      }),
      rings: g.rings,
      maxWearMm: analysis.maxWear?.wearMm ?? null,
    };
    out.push(group);
    // Later gaugings of this liner in the file compare with this one, as the sheet compares with last time.
    let list = byLiner.get(liner.id);
    if (!list) byLiner.set(liner.id, (list = []));
    // Kept in date order: the file's gaugings come in date order, so this is nearly always an append.
    const entry = { id: -out.length, linerId: liner.id, inspectedOn: g.date, engineHours, linerHours, gaugeTempC: header.gaugeTempC, linerTempC: header.linerTempC, readings: draftForChecks.readings };
    let at = list.length;
    while (at > 0 && (list[at - 1].inspectedOn > g.date || (list[at - 1].inspectedOn === g.date && list[at - 1].engineHours > engineHours))) at--;
    list.splice(at, 0, entry);
  }
  return out;
}

/** One sentence on a preview's state, for the screen and the API. */
export function previewSummary(p: Pick<Preview, "rowCount" | "groups" | "errorCount" | "warningCount">): string {
  const g = p.groups.length;
  const readings = p.groups.reduce((n, x) => n + x.readings.length, 0);
  const parts = [`${p.rowCount} rows read`, `${g} gauging${g === 1 ? "" : "s"} with ${readings} diameter${readings === 1 ? "" : "s"}`];
  if (p.errorCount) parts.push(`${p.errorCount} error${p.errorCount === 1 ? "" : "s"} to fix or leave out`);
  if (p.warningCount) parts.push(`${p.warningCount} warning${p.warningCount === 1 ? "" : "s"} to confirm`);
  return `${parts.join(", ")}.`;
}


