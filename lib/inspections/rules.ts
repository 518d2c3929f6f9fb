import { inspectionAnalysisInput, toGauging } from "@/lib/analysis/input";
import { ringState, type RingState } from "@/lib/rings/rings";
import { formatRunningHours, parseIsoDate, runningHoursPerDay, type RunningHoursEntry } from "@/lib/wear/calendar";
import { temperatureCorrection } from "@/lib/wear/correction";
import { checkReading, type ReadingWarning } from "@/lib/wear/plausibility";
import { cellKey, toWearProfile, type ContextLiner, type ContextProfile, type InspectionContext } from "./context";
import type { ChecklistInput, InspectionDraft, InspectionHeader, TallyItem } from "./schemas";

/*
 * The rules of a good inspection record, pure, so the entry form shows them as the
 * engineer types and the server applies exactly the same ones on save and submit.
 * Two tiers: structural errors a correct client never sends (a station the profile
 * lacks) refuse a save; everything else is a problem that only blocks submission, so a
 * draft always keeps what was typed.
 */

export type Problem = { field: string; message: string };

/** Liner hours differing from the derived value by more than this need a reason. */
export const LINER_HOURS_TOLERANCE_H = 0.5;

const DAY_MS = 86_400_000;
const h = (v: number) => formatRunningHours(v);

/** Liner hours from the liner's installation: engine hours − hours at fitting + hours it arrived with. */
export function derivedLinerHours(liner: Pick<ContextLiner, "installedEngineHours" | "linerHoursAtInstall">, engineHours: number): number {
  return Math.round((engineHours - liner.installedEngineHours + liner.linerHoursAtInstall) * 10) / 10;
}

export function linerHoursDiffer(derived: number, entered: number): boolean {
  return Math.abs(derived - entered) > LINER_HOURS_TOLERANCE_H;
}

export type ExpectedHours = { hours: number; basis: string };

/**
 * The engine hours the running-hours log suggests for a date: read off the log on that
 * day, interpolated between the entries either side, or carried forward from the last
 * entry at the log's average running rate. Null when the log cannot say.
 */
export function expectedEngineHours(log: readonly RunningHoursEntry[], date: string): ExpectedHours | null {
  const at = parseIsoDate(date);
  if (at === null) return null;
  const entries = log
    .map((e) => ({ ms: parseIsoDate(e.date), date: e.date, hours: e.engineHours }))
    .filter((e): e is { ms: number; date: string; hours: number } => e.ms !== null && Number.isFinite(e.hours))
    .sort((a, b) => a.ms - b.ms);
  const before = entries.filter((e) => e.ms <= at).at(-1);
  const after = entries.find((e) => e.ms > at);
  if (!before) return null;
  if (before.ms === at) return { hours: before.hours, basis: `logged ${h(before.hours)} on ${before.date}` };
  if (after) {
    const f = (at - before.ms) / (after.ms - before.ms);
    return { hours: before.hours + f * (after.hours - before.hours), basis: `between ${h(before.hours)} on ${before.date} and ${h(after.hours)} on ${after.date}` };
  }
  const rate = runningHoursPerDay(log, { asOf: date });
  if (rate.kind !== "known") return null;
  const days = (at - before.ms) / DAY_MS;
  return {
    hours: before.hours + rate.hoursPerDay * days,
    basis: `${h(before.hours)} logged on ${before.date}, plus ${Math.round(days)} days at ${rate.hoursPerDay.toFixed(1)} h a day`,
  };
}

export type HoursCheck = { errors: Problem[]; warnings: Problem[]; expected: ExpectedHours | null; derivedLinerHours: number | null };

/**
 * Engine and liner hours against the previous inspection, the liner's fitting and the
 * running-hours log. The counter never runs backwards, so hours below the previous
 * inspection's are an error; hours far from what the log suggests are a warning (the log
 * may be the one that is wrong).
 */
export function checkHours(ctx: InspectionContext, header: Pick<InspectionHeader, "inspectedOn" | "engineHours" | "linerHours" | "linerHoursReason">): HoursCheck {
  const errors: Problem[] = [];
  const warnings: Problem[] = [];
  const { engineHours, linerHours } = header;
  if (!Number.isFinite(engineHours)) return { errors, warnings, expected: null, derivedLinerHours: null };
  const prev = ctx.previous;
  if (prev && engineHours < prev.engineHours) {
    errors.push({
      field: "header.engineHours",
      message: `Engine running hours ${h(engineHours)} are below the ${h(prev.engineHours)} of the previous inspection on ${prev.inspectedOn}. The counter does not run backwards.`,
    });
  }
  if (engineHours < ctx.liner.installedEngineHours) {
    errors.push({
      field: "header.engineHours",
      message: `Engine running hours ${h(engineHours)} are below the ${h(ctx.liner.installedEngineHours)} at which liner ${ctx.liner.serial} was fitted.`,
    });
  }
  const expected = expectedEngineHours(ctx.hoursLog, header.inspectedOn);
  if (expected) {
    const span = Math.abs(expected.hours - (ctx.hoursLog.at(-1)?.engineHours ?? expected.hours));
    const tolerance = 100 + 0.15 * span;
    const diff = engineHours - expected.hours;
    if (Math.abs(diff) > tolerance) {
      warnings.push({
        field: "header.engineHours",
        message: `The running-hours log suggests about ${h(expected.hours)} on ${header.inspectedOn} (${expected.basis}); ${h(engineHours)} is ${h(Math.abs(diff))} ${diff > 0 ? "more" : "less"}. Check the counter reading.`,
      });
    }
  }
  const derived = derivedLinerHours(ctx.liner, engineHours);
  if (Number.isFinite(linerHours) && linerHoursDiffer(derived, linerHours) && !header.linerHoursReason) {
    errors.push({
      field: "header.linerHoursReason",
      message: `Liner hours ${h(linerHours)} differ from the ${h(derived)} derived from the liner's fitting: give the reason.`,
    });
  }
  if (Number.isFinite(linerHours) && linerHours < 0) errors.push({ field: "header.linerHours", message: "Liner hours cannot be negative." });
  return { errors, warnings, expected, derivedLinerHours: derived };
}

/** Readings and rings that name a station, direction or ring the profile lacks: a save is refused. */
export function structuralErrors(profile: ContextProfile, draft: InspectionDraft): Problem[] {
  const out: Problem[] = [];
  const stations = new Set(profile.stations.map((s) => s.key));
  const axes = new Set(profile.axes.map((a) => a.key));
  draft.readings.forEach((r, i) => {
    if (!stations.has(r.stationKey)) {
      out.push({ field: `readings.${i}.stationKey`, message: `Station "${r.stationKey}" is not in the engine profile ${profile.name}.` });
    } else if (!axes.has(r.axisKey)) {
      out.push({ field: `readings.${i}.axisKey`, message: `Direction "${r.axisKey}" is not in the engine profile ${profile.name}.` });
    }
  });
  const rings = new Set(profile.rings.map((r) => r.position));
  draft.rings.forEach((r, i) => {
    if (!rings.has(r.position)) out.push({ field: `rings.${i}.position`, message: `Ring ${r.position} is not in the engine profile ${profile.name}.` });
  });
  return out;
}

/** The multiplier referring this inspection's readings to 20 °C (1 when it cannot be applied). */
export function correctionFactor(profile: ContextProfile, gaugeTempC: number | null, linerTempC: number | null): number {
  return temperatureCorrection(profile, gaugeTempC, linerTempC).factor;
}

/**
 * Plausibility warnings per cell (key "station|axis"), against the nominal bore and the
 * same cell at the previous inspection of this liner, both referred to 20 °C.
 */
export function readingWarnings(ctx: InspectionContext, draft: Pick<InspectionDraft, "header" | "readings">): Map<string, ReadingWarning[]> {
  const profile = toWearProfile(ctx.profile);
  const factor = correctionFactor(ctx.profile, draft.header.gaugeTempC, draft.header.linerTempC);
  const prev = ctx.previous && ctx.previous.linerId === ctx.liner.id ? ctx.previous : null;
  const prevFactor = prev ? correctionFactor(ctx.profile, prev.gaugeTempC, prev.linerTempC) : 1;
  const prevCells = new Map((prev?.readings ?? []).map((r) => [cellKey(r.stationKey, r.axisKey), r.diameterMm * prevFactor]));
  const { asFittedReadings } = inspectionAnalysisInput(profile, toGauging("draft", draft.header, draft.readings), ctx.asFitted);
  const asFitted = new Map((asFittedReadings ?? []).map((r) => [cellKey(r.stationKey, r.axisKey), r.diameterMm]));
  const hoursSince = prev && Number.isFinite(draft.header.linerHours) ? draft.header.linerHours - prev.linerHours : null;
  const out = new Map<string, ReadingWarning[]>();
  for (const r of draft.readings) {
    const key = cellKey(r.stationKey, r.axisKey);
    const warnings = checkReading(profile, {
      stationKey: r.stationKey,
      axisKey: r.axisKey,
      diameterMm: r.diameterMm * factor,
      previousDiameterMm: prevCells.get(key) ?? null,
      hoursSincePrevious: hoursSince,
      asFittedMm: asFitted.get(key) ?? null,
    });
    if (warnings.length) out.set(key, warnings);
  }
  return out;
}

/** The text stored in `warning_confirmed`: what the engineer saw and confirmed (at most 255 characters). */
export function warningText(warnings: readonly ReadingWarning[]): string {
  const text = warnings.map((w) => w.message).join(" ");
  return text.length > 255 ? `${text.slice(0, 254)}…` : text;
}

export type TallyStatus = "incomplete" | "match" | "mismatch";

export function tallyStatus(item: Pick<TallyItem, "countIn" | "countOut">): TallyStatus {
  if (item.countIn == null || item.countOut == null) return "incomplete";
  return item.countIn === item.countOut ? "match" : "mismatch";
}

/** Every tool and rag taken in has come out: the crankcase may be closed. */
export function tallyComplete(checklist: Pick<ChecklistInput, "tally">): boolean {
  return checklist.tally.length > 0 && checklist.tally.every((t) => tallyStatus(t) === "match");
}

/** The rod nut pressure's relative difference from the profile's figure, when both are known. */
export function rodNutDeviation(profile: ContextProfile, bar: number | null): number | null {
  if (bar == null || profile.rodNutPressureBar == null || profile.rodNutPressureBar <= 0) return null;
  return (bar - profile.rodNutPressureBar) / profile.rodNutPressureBar;
}

/** Deviation beyond which the recorded rod nut pressure is flagged (the maker's manual governs). */
export const ROD_NUT_TOLERANCE = 0.02;

export function checklistProblems(checklist: ChecklistInput): Problem[] {
  const out: Problem[] = [];
  if (checklist.tally.length === 0) {
    out.push({ field: "checklist.tally", message: "List every tool and rag taken into the crankcase, with the counts in and out." });
  }
  checklist.tally.forEach((t, i) => {
    const name = t.label || `Tally item ${i + 1}`;
    const status = tallyStatus(t);
    if (status === "incomplete") {
      out.push({ field: `checklist.tally.${i}`, message: `${name}: enter the count taken in and the count brought out.` });
    } else if (status === "mismatch") {
      out.push({
        field: `checklist.tally.${i}`,
        message: `${name}: ${t.countIn} taken in, ${t.countOut} brought out. Find the difference before the crankcase is closed.`,
      });
    }
  });
  if (!checklist.closing.signedName || !checklist.closing.signedAt) {
    out.push({ field: "checklist.closing", message: "Sign the closing inspection with a name and the time." });
  }
  if (checklist.rodNutPressureBar == null) {
    out.push({ field: "checklist.rodNutPressureBar", message: "Record the piston rod nut tightening pressure." });
  }
  if (!checklist.stuffingBox.done) out.push({ field: "checklist.stuffingBox", message: "Tick the stuffing box item when it is overhauled and checked." });
  if (!checklist.cylinderLubrication.done) {
    out.push({ field: "checklist.cylinderLubrication", message: "Tick the cylinder lubrication item when it is checked." });
  }
  return out;
}

/**
 * Everything that stands between a draft and submission, in the order of the form:
 * hours, every station in both directions, confirmed warnings, every ring, the checklist.
 */
export function submissionProblems(ctx: InspectionContext, draft: InspectionDraft): Problem[] {
  const out: Problem[] = [...structuralErrors(ctx.profile, draft), ...checkHours(ctx, draft.header).errors];
  const readings = new Map(draft.readings.map((r) => [cellKey(r.stationKey, r.axisKey), r]));
  const missing: string[] = [];
  for (const s of ctx.profile.stations) {
    for (const a of ctx.profile.axes) if (!readings.has(cellKey(s.key, a.key))) missing.push(`${s.label} ${a.label.toLowerCase()}`);
  }
  if (missing.length) {
    out.push({ field: "readings", message: `No reading yet at ${missing.length === 1 ? "" : `${missing.length} points: `}${missing.slice(0, 4).join(", ")}${missing.length > 4 ? ", …" : "."}` });
  }
  const warnings = readingWarnings(ctx, draft);
  for (const [key, list] of warnings) {
    const r = readings.get(key);
    if (r && !r.warningConfirmed) {
      const [stationKey, axisKey] = key.split("|");
      const st = ctx.profile.stations.find((s) => s.key === stationKey);
      const ax = ctx.profile.axes.find((a) => a.key === axisKey);
      out.push({
        field: `readings.${key}`,
        message: `${st?.label ?? stationKey} ${ax?.label.toLowerCase() ?? axisKey}: confirm or correct the warning (${list[0].message})`,
      });
    }
  }
  const rings = new Map(draft.rings.map((r) => [r.position, r]));
  for (const spec of ctx.profile.rings) {
    const r = rings.get(spec.position);
    if (!r || r.closedGapMm == null) out.push({ field: `rings.${spec.position}.closedGapMm`, message: `${spec.label}: enter the closed gap.` });
    if (!r || r.grooveClearanceMm == null) out.push({ field: `rings.${spec.position}.grooveClearanceMm`, message: `${spec.label}: enter the groove clearance.` });
  }
  out.push(...checklistProblems(draft.checklist));
  return out;
}

export type RingLive = { gap: RingState | null; groove: RingState | null };

/** Where a ring's typed values sit against the profile's new range and limit. */
export function ringLive(spec: ContextProfile["rings"][number], closedGapMm: number | null, grooveClearanceMm: number | null): RingLive {
  return {
    gap: closedGapMm == null ? null : ringState(closedGapMm, spec.gapNewMinMm, spec.gapNewMaxMm, spec.gapLimitMm),
    groove: grooveClearanceMm == null ? null : ringState(grooveClearanceMm, spec.grooveNewMinMm, spec.grooveNewMaxMm, spec.grooveLimitMm),
  };
}

export const RING_STATE_TEXT: Record<RingState, string> = {
  below_new_range: "under the new range — check",
  within_new_range: "within the new range",
  worn: "worn, under the limit",
  at_or_over_limit: "at or over the limit",
};
