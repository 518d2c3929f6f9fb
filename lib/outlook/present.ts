import { z } from "zod";
import { BAND_LABELS, type BandKey } from "@/lib/wear/bands";
import { toCsv } from "./csv";
import { PLAN_STATE_LABELS, type OutlookRow } from "./load";
import { horizonEnd, probabilityText, RECOMMENDATION_LABELS, type RecommendationKind } from "./numbers";
import { horizonSchema } from "./schemas";

/*
 * The outlook's filters (shared by the screen's address, the JSON and the CSV) and its rows
 * flattened for a spreadsheet. No server imports: the table in the browser filters the same way.
 */

const BANDS = Object.keys(BAND_LABELS) as [BandKey, ...BandKey[]];
const RECOMMENDATIONS = Object.keys(RECOMMENDATION_LABELS) as [RecommendationKind, ...RecommendationKind[]];

const optionalId = z.coerce.number({ error: "Unknown vessel." }).int("Unknown vessel.").positive("Unknown vessel.").max(4_294_967_295, "Unknown vessel.");

/** The outlook's query: horizon in months (when given, only units due within it), vessel, status band, recommendation, format. */
export const outlookQuerySchema = z.object({
  horizon: horizonSchema.optional(),
  vessel: optionalId.optional(),
  status: z.enum(BANDS, { error: `Choose a status: ${BANDS.join(", ")}.` }).optional(),
  recommendation: z.enum(RECOMMENDATIONS, { error: `Choose a recommendation: ${RECOMMENDATIONS.join(", ")}.` }).optional(),
  format: z.enum(["json", "csv"], { error: "The format is json or csv." }).optional(),
});

export type OutlookQuery = z.infer<typeof outlookQuerySchema>;

/** Reads the query from an address's search parameters; empty values count as absent. */
export function parseOutlookQuery(params: URLSearchParams | Record<string, string | string[] | undefined>) {
  const entries = params instanceof URLSearchParams ? [...params.entries()] : Object.entries(params).map(([k, v]) => [k, Array.isArray(v) ? v[0] : v] as const);
  return outlookQuerySchema.safeParse(Object.fromEntries(entries.filter(([, v]) => v !== undefined && v !== "")));
}

/** The day a unit needs its liner or rings renewed by: now, the recommended opportunity, an open plan, or the early end of the limit interval. */
export function dueOn(row: OutlookRow, today: string): string | null {
  const days = [
    row.recommendation.kind === "renew_now" ? today : null,
    row.recommendation.kind === "renew_at" ? (row.recommendation.opportunity?.date ?? null) : null,
    ...row.plans.map((p) => p.plannedOn),
    row.limitOnEarliest ?? row.limitOn,
  ].filter((d): d is string => d !== null);
  return days.sort()[0] ?? null;
}

/** Keeps the rows the query asks for. The horizon keeps units due on or before its last day. */
export function filterOutlook(rows: readonly OutlookRow[], q: OutlookQuery, today: string): OutlookRow[] {
  const until = q.horizon ? horizonEnd(today, q.horizon) : null;
  return rows.filter((r) => {
    if (q.vessel !== undefined && r.vesselId !== q.vessel) return false;
    if (q.status !== undefined && r.band !== q.status) return false;
    if (q.recommendation !== undefined && r.recommendation.kind !== q.recommendation) return false;
    if (until !== null) {
      const due = dueOn(r, today);
      if (due === null || due > until) return false;
    }
    return true;
  });
}

const chance = (row: OutlookRow, i: number) => {
  const e = row.exceed[i];
  return !e ? "not enough data" : e.kind === "probability" ? Number(e.p.toFixed(4)) : "not enough data";
};

export const OUTLOOK_CSV_HEADER = [
  "vessel", "engine", "cylinder", "liner", "status", "liner_hours", "max_wear_mm", "limit_mm", "wear_rate_mm_per_1000h",
  "rate_percentile_in_profile", "limit_on", "limit_on_earliest", "limit_on_latest", "overhaul_1_on", "p_over_limit_by_overhaul_1",
  "overhaul_2_on", "p_over_limit_by_overhaul_2", "next_opportunity", "next_opportunity_on", "recommendation", "recommendation_words",
  "plan_state", "plan_on", "plan_opportunity",
] as const;

/** The rows as a CSV file (UTF-8, header, ISO dates, chances as fractions 0–1 or "not enough data"). */
export function outlookCsv(rows: readonly OutlookRow[]): string {
  return toCsv(
    OUTLOOK_CSV_HEADER,
    rows.map((r) => {
      const plan = r.plans[0];
      return [
        r.vesselName, r.engineSerial, r.cylinderNo, r.linerSerial, r.bandLabel, r.linerHours, r.maxWearMm, r.limitMm,
        r.wearRateMmPer1000h === null ? null : Number(r.wearRateMmPer1000h.toFixed(4)),
        r.ratePercentile === null ? null : Number(r.ratePercentile.toFixed(3)),
        r.limitOn, r.limitOnEarliest, r.limitOnLatest, r.overhauls[0]?.date ?? null, chance(r, 0), r.overhauls[1]?.date ?? null, chance(r, 1),
        r.nextOpportunity?.label ?? null, r.nextOpportunity?.date ?? null, RECOMMENDATION_LABELS[r.recommendation.kind], r.recommendation.text,
        plan ? `${PLAN_STATE_LABELS[plan.state]}${plan.missed ? " (opportunity passed)" : ""}` : null, plan?.plannedOn ?? null, plan?.opportunity ?? null,
      ];
    }),
  );
}

export { probabilityText };
