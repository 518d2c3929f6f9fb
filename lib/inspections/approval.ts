import { can } from "@/lib/auth/permissions";
import type { Role } from "@/lib/auth/roles";
import { parseIsoDate, projectDate, runningHoursPerDay, type RunningHoursEntry } from "@/lib/wear/calendar";
import { intervalRate } from "@/lib/wear/liner";

/*
 * What the chief engineer is asked to confirm before approving: the figures the record
 * commits the unit to (its maximum wear, the wear rate since the previous gauging, when the
 * liner reaches its limit at that rate) and every caution still open on it. Pure, so the
 * record page and its tests compute the same figures.
 */

export type ApprovalFigures = {
  maxWearMm: number | null;
  maxWearAt: string | null;
  wearLimitMm: number;
  /** mm per 1000 liner hours since the previous gauging of this liner; null without one. */
  rateMmPer1000h: number | null;
  /** The date the wear reaches the limit at that rate (yyyy-mm-dd), when it can be said. */
  limitDate: string | null;
  /** One sentence on the limit: the date, "at or over the limit now", or why there is no date. */
  limitText: string;
  cautions: string[];
};

export type ApprovalInput = {
  wearLimitMm: number;
  inspectedOn: string;
  linerHours: number;
  maxWear: { wearMm: number; at: string } | null;
  /** The previous approved gauging of the same liner. */
  previous: { maxWearMm: number | null; linerHours: number; inspectedOn: string } | null;
  hoursLog: readonly RunningHoursEntry[];
  cautions: readonly { message: string }[];
};

/** The approval's figures: max wear, interval rate, the date the limit is reached at that rate, open cautions. */
export function approvalFigures(input: ApprovalInput): ApprovalFigures {
  const { maxWear, previous, wearLimitMm } = input;
  const rate = maxWear && previous && previous.maxWearMm !== null ? intervalRate(previous.maxWearMm, previous.linerHours, maxWear.wearMm, input.linerHours) : null;
  let limitDate: string | null = null;
  let limitText: string;
  if (!maxWear) limitText = "No readings: no date to the limit.";
  else if (maxWear.wearMm >= wearLimitMm) limitText = "The liner is at or over its wear limit now.";
  else if (rate === null) limitText = previous ? "No date: the liner hours did not rise since the previous gauging." : "No date yet: this is the liner's first gauging on record.";
  else if (rate <= 0) limitText = "No date: the wear did not rise since the previous gauging.";
  else {
    const hoursLeft = ((wearLimitMm - maxWear.wearMm) * 1000) / rate;
    const running = runningHoursPerDay(input.hoursLog, { asOf: input.inspectedOn });
    const d = parseIsoDate(input.inspectedOn) === null ? null : projectDate({ atLinerHours: input.linerHours + hoursLeft, lowerHours: null, upperHours: null }, { linerHours: input.linerHours, date: input.inspectedOn }, running);
    if (d?.kind === "dated") {
      limitDate = d.date;
      limitText = `At this rate the wear reaches the limit in about ${Math.round(hoursLeft).toLocaleString("en-GB")} running hours, around ${d.date}.`;
    } else {
      limitText = `At this rate the wear reaches the limit in about ${Math.round(hoursLeft).toLocaleString("en-GB")} running hours (no date: the running-hours log cannot say how fast the engine runs).`;
    }
  }
  return {
    maxWearMm: maxWear?.wearMm ?? null,
    maxWearAt: maxWear?.at ?? null,
    wearLimitMm,
    rateMmPer1000h: rate,
    limitDate,
    limitText,
    cautions: input.cautions.map((c) => c.message),
  };
}

/*
 * The second pair of eyes, in one place: whoever entered an inspection (created the
 * record, or the amendment) or submitted it cannot approve it, a chief engineer included.
 * Then another chief engineer assigned to the vessel, or the superintendent, approves.
 * The approve mutation applies this inside its transaction; screens ask it to decide
 * whether to offer the button and what to say instead.
 */

export type ApprovalParties = { createdBy: string | null; submittedBy: string | null };

/** Why `user` may not approve a record with these parties, or null when they may. */
export function approvalRefusal(user: { id: string; role: Role }, parties: ApprovalParties): string | null {
  if (!can(user.role, "inspection.approve")) return "Your role does not approve inspection records.";
  const who = "Another chief engineer of the vessel or the superintendent approves it.";
  if (parties.createdBy === user.id) return `You entered this record, so someone else checks it. ${who}`;
  if (parties.submittedBy === user.id) return `You submitted this record, so someone else checks it. ${who}`;
  return null;
}
