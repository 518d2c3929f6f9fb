import { hoursText } from "../format";

const DAY_MS = 86_400_000;
/** Dates further out than this are not worth printing; the projection says "beyond" instead. */
const HORIZON_DAYS = 100 * 366;

export type RunningHoursEntry = { date: string; engineHours: number };

export type RunningRate =
  | { kind: "known"; hoursPerDay: number; fromDate: string; toDate: string; entriesUsed: number }
  | { kind: "unknown"; reason: "too_few_entries" | "no_running" | "hours_decreasing" | "implausible_rate" };

export type DateProjection =
  | { kind: "dated"; date: string; lower: string | null; upper: string | null }
  | { kind: "unknown"; reason: "rate_unknown" | "beyond_horizon" | "invalid_input" };

/** Running hours rounded to the hour with thousands grouped, e.g. "150,600 h" (lib/format's hoursText). */
export const formatRunningHours = (hours: number): string => hoursText(hours);

/** Epoch milliseconds of a strict ISO calendar date (yyyy-mm-dd, UTC midnight), or null. */
export function parseIsoDate(text: string): number | null {
  // Hand-parsed: a fleet recompute reads every running-hours entry of every engine, and
  // Date.parse plus a round trip through toISOString dominated that work.
  if (typeof text !== "string" || text.length !== 10 || text.charCodeAt(4) !== 45 || text.charCodeAt(7) !== 45) return null;
  const y = digits(text, 0, 4);
  const m = digits(text, 5, 7);
  const d = digits(text, 8, 10);
  if (y === null || m === null || d === null || m < 1 || m > 12 || d < 1) return null;
  const ms = Date.UTC(y, m - 1, d);
  // Date.UTC rolls 31 April over into May; a real calendar day keeps its month.
  return new Date(ms).getUTCMonth() === m - 1 ? ms : null;
}

function digits(text: string, from: number, to: number): number | null {
  let n = 0;
  for (let i = from; i < to; i++) {
    const c = text.charCodeAt(i) - 48;
    if (c < 0 || c > 9) return null;
    n = n * 10 + c;
  }
  return n;
}

/** A date a (possibly fractional) number of days after an ISO date, rounded to the nearest day. */
export function addDays(isoDate: string, days: number): string | null {
  const start = parseIsoDate(isoDate);
  if (start === null || !Number.isFinite(days) || Math.abs(days) > HORIZON_DAYS) return null;
  return new Date(start + Math.round(days) * DAY_MS).toISOString().slice(0, 10);
}

/**
 * Average running hours per calendar day from the engine's running-hours log, over the window
 * before the latest entry (365 days by default, which smooths out dockings and lay-ups).
 * When the window holds fewer than two entries, the last two entries are used instead.
 * More than 24 h a day, a falling counter or no running at all give a typed "unknown", since a
 * projected date from such a rate would be fiction.
 */
export function runningHoursPerDay(log: readonly RunningHoursEntry[], options: { windowDays?: number; asOf?: string } = {}): RunningRate {
  const windowDays = options.windowDays ?? 365;
  const asOf = options.asOf === undefined ? Infinity : parseIsoDate(options.asOf) ?? Infinity;
  const entries = log
    .map((e) => ({ ms: parseIsoDate(e.date), date: e.date, hours: e.engineHours }))
    .filter((e): e is { ms: number; date: string; hours: number } => e.ms !== null && e.ms <= asOf && Number.isFinite(e.hours))
    .sort((a, b) => a.ms - b.ms);
  if (entries.length < 2) return { kind: "unknown", reason: "too_few_entries" };
  const last = entries[entries.length - 1];
  const inWindow = entries.filter((e) => e.ms >= last.ms - windowDays * DAY_MS);
  const used = inWindow.length >= 2 ? inWindow : entries.slice(-2);
  const first = used[0];
  const days = (last.ms - first.ms) / DAY_MS;
  if (days <= 0) return { kind: "unknown", reason: "too_few_entries" };
  const hoursPerDay = (last.hours - first.hours) / days;
  if (hoursPerDay < 0) return { kind: "unknown", reason: "hours_decreasing" };
  if (hoursPerDay === 0) return { kind: "unknown", reason: "no_running" };
  if (hoursPerDay > 24) return { kind: "unknown", reason: "implausible_rate" };
  return { kind: "known", hoursPerDay, fromDate: first.date, toDate: last.date, entriesUsed: used.length };
}

/**
 * Calendar dates for a liner-hours figure and its interval, counting forward from liner hours
 * known on a given date (the latest inspection, or the latest log entry) at the average running
 * rate. A figure already behind the reference gives a date before it, which is the honest
 * answer. An open interval end stays null; an end more than a century out becomes null too.
 */
export function projectDate(
  target: { atLinerHours: number; lowerHours: number | null; upperHours: number | null },
  reference: { linerHours: number; date: string },
  rate: RunningRate,
): DateProjection {
  if (rate.kind !== "known") return { kind: "unknown", reason: "rate_unknown" };
  if (parseIsoDate(reference.date) === null || !Number.isFinite(reference.linerHours)) return { kind: "unknown", reason: "invalid_input" };
  const toDate = (hours: number | null) => (hours === null ? null : addDays(reference.date, (hours - reference.linerHours) / rate.hoursPerDay));
  const date = toDate(target.atLinerHours);
  if (date === null) return { kind: "unknown", reason: Number.isFinite(target.atLinerHours) ? "beyond_horizon" : "invalid_input" };
  return { kind: "dated", date, lower: toDate(target.lowerHours), upper: toDate(target.upperHours) };
}
