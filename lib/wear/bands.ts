import type { RingAnalysis } from "../rings/rings";
import { hoursText as hours, mm, rateText as rate, trendWords } from "../format";
import type { LinerAnalysis, Projection } from "./liner";
import type { WearProfile } from "./types";
import { WEAR_RULES } from "./types";

export type BandKey = "over_limit" | "renew_before_next" | "watch" | "steady" | "unknown";

export const BAND_LABELS: Record<BandKey, string> = {
  over_limit: "Over limit",
  renew_before_next: "Renew before next overhaul",
  watch: "Watch",
  steady: "Steady",
  unknown: "Too few readings",
};

/** The next planned overhaul of the unit, as an engine-hours figure or as hours from the latest inspection. */
export type NextOverhaul = { engineHours: number } | { hoursAhead: number };

export type UnitBand = { band: BandKey; label: string; reasons: string[] };

/**
 * One status band for a cylinder unit, with the reasons in plain English, most severe first:
 * "Over limit" when wear, ovality or a ring is at or over its limit now; "Renew before next
 * overhaul" when the projection, or the early end of its 95 % interval, reaches a limit before
 * the next planned overhaul; "Watch" when the wear rate is above the 0.1 mm/1000 h usually taken
 * as abnormal (marineengineeringonline.com), wear or ovality is past 80 % of its limit, a ring is
 * flagged, or the projection is too uncertain to bound; "Too few readings" when no projection is
 * possible yet; otherwise "Steady". The reasons of the chosen band come first, lesser concerns
 * after. The maker's limits govern; this only orders the work.
 */
export function unitBand(input: { profile: WearProfile; liner: LinerAnalysis; rings?: RingAnalysis | null; nextOverhaul?: NextOverhaul | null }): UnitBand {
  const { profile, liner, rings, nextOverhaul } = input;
  const found: Record<Exclude<BandKey, "steady">, string[]> = { over_limit: [], renew_before_next: [], watch: [], unknown: [] };
  const latest = liner.latest;
  const hoursAhead =
    !nextOverhaul || !latest ? null : "hoursAhead" in nextOverhaul ? nextOverhaul.hoursAhead : nextOverhaul.engineHours - latest.engineHours;
  const ahead = hoursAhead !== null && Number.isFinite(hoursAhead) ? hoursAhead : null;

  const metrics = [
    { name: "Wear", projection: liner.wear.projection, value: latest?.maxWearMm ?? null, limit: profile.linerWearLimitMm },
    { name: "Ovality", projection: liner.ovality.projection, value: latest?.maxOvalityMm ?? null, limit: profile.ovalityLimitMm },
  ];
  for (const { name, projection, value, limit } of metrics) {
    checkProjection(name, projection, latest?.linerHours ?? null, ahead, found);
    if (projection.kind !== "already_over" && value !== null && value >= WEAR_RULES.watchFractionOfLimit * limit) {
      found.watch.push(`${name} ${mm(value)} is past ${WEAR_RULES.watchFractionOfLimit * 100} % of its ${mm(limit)} limit.`);
    }
  }

  const abnormal = WEAR_RULES.abnormalRateMmPer1000h;
  const trend = liner.wear.trend;
  if (trend && trend.slopeMmPer1000h > abnormal) {
    found.watch.push(`The wear trend of ${rate(trend.slopeMmPer1000h)} is above the ${rate(abnormal)} usually taken as abnormal.`);
  }
  const last = liner.lastIntervalRate;
  // Running-in wear is fast by nature, so only a steady-state interval counts here.
  if (last && last.steady && last.mmPer1000h > abnormal) {
    found.watch.push(`Wear over the last interval ran at ${rate(last.mmPer1000h)}, above the ${rate(abnormal)} usually taken as abnormal.`);
  }

  for (const ring of rings?.rings ?? []) {
    if (ring.overLimit) found.over_limit.push(...ring.reasons);
    else if (ring.renew) found.watch.push(...ring.reasons);
  }

  if (!latest) found.unknown.push("No usable liner readings yet.");

  const order: Exclude<BandKey, "steady">[] = ["over_limit", "renew_before_next", "watch", "unknown"];
  const band = order.find((key) => found[key].length > 0) ?? "steady";
  const reasons = order.slice(band === "steady" ? order.length : order.indexOf(band)).flatMap((key) => found[key]);
  if (band === "steady") reasons.push(steadyReason(liner));
  return { band, label: BAND_LABELS[band], reasons };
}

function checkProjection(name: string, projection: Projection, linerHours: number | null, ahead: number | null, found: Record<Exclude<BandKey, "steady">, string[]>) {
  switch (projection.kind) {
    case "already_over":
      found.over_limit.push(`${name} ${mm(projection.valueMm)} is at or over its ${mm(projection.limitMm)} limit.`);
      return;
    case "insufficient_data":
      if (name === "Wear") {
        found.unknown.push(`A projection needs ${projection.needed} readings past running-in; there ${projection.have === 1 ? "is" : "are"} ${projection.have}.`);
      }
      return;
    case "not_wearing":
      return;
    case "projected": {
      if (ahead === null || linerHours === null) {
        if (projection.lowerHours === null) found.watch.push(`${name} is rising but too scattered to say how soon it could reach its limit.`);
        return;
      }
      const at = `${name} is projected to reach its ${mm(projection.limitMm)} limit at about ${hours(projection.atLinerHours)} on the liner`;
      if (projection.hoursRemaining <= ahead) {
        found.renew_before_next.push(`${at}, ${hours(Math.max(0, projection.hoursRemaining))} from the latest inspection, before the next overhaul in ${hours(ahead)}.`);
      } else if (projection.lowerHours === null) {
        found.watch.push(`${name} is rising but too scattered to say how soon it could reach its limit.`);
      } else if (projection.lowerHours - linerHours <= ahead) {
        found.renew_before_next.push(`${at}; the early end of its ${projection.confidence * 100} % interval, ${hours(projection.lowerHours)}, falls before the next overhaul in ${hours(ahead)}.`);
      }
      return;
    }
  }
}

function steadyReason(liner: LinerAnalysis): string {
  const p = liner.wear.projection;
  const wear = liner.latest?.maxWearMm;
  const now = wear == null ? "Wear" : `Wear ${mm(wear)}`;
  if (p.kind === "not_wearing") return `${now}, with no measurable rise over the steady-state readings.`;
  if (p.kind === "projected") return `${now}, ${trendWords(liner.wear.trend?.slopeMmPer1000h ?? 0)}; projected to reach its limit at about ${hours(p.atLinerHours)} on the liner.`;
  return `${now}, within limits.`;
}
