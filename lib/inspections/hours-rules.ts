import { formatRunningHours, parseIsoDate, runningHoursPerDay, type RunningHoursEntry } from "@/lib/wear/calendar";
import type { ContextLiner, InspectionContext } from "./context";
import type { InspectionHeader } from "./schemas";

/*
 * The running-hours rules of an inspection header, apart from the reading rules so the
 * new-inspection form carries only these (and not the wear engine) in its first load.
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
  // A liner cannot be gauged before it was fitted (the engine's own history starts later still).
  const fittedOn = String(ctx.liner.installedOn ?? "").slice(0, 10);
  if (fittedOn && header.inspectedOn && header.inspectedOn < fittedOn) {
    errors.push({ field: "header.inspectedOn", message: `The inspection date ${header.inspectedOn} is before liner ${ctx.liner.serial} was fitted on ${fittedOn}: check the date.` });
  }
  return { errors, warnings, expected, derivedLinerHours: derived };
}
