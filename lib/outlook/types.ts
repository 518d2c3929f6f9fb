import type { BandKey } from "@/lib/wear/bands";
import type { ExceedProbability, NextOverhaul, Opportunity, Recommendation, SparePart } from "./numbers";

/*
 * The outlook's shapes and labels, free of server code so the browser's table and forms use them.
 */

export type PlanState = "pencilled" | "confirmed" | "closed" | "dropped";
export const OPEN_PLAN_STATES: readonly PlanState[] = ["pencilled", "confirmed"];
export const PLAN_STATE_LABELS: Record<PlanState, string> = {
  pencilled: "Pencilled in",
  confirmed: "Confirmed",
  closed: "Done",
  dropped: "Dropped",
};
export const PART_LABELS: Record<SparePart, string> = { liner: "Liner", ring_set: "Ring set" };

export type ScheduleEntry = {
  id: number;
  vesselId: number;
  kind: "port_stay" | "docking";
  place: string;
  startsOn: string;
  endsOn: string;
  note: string | null;
  revision: number;
};

export type PlanSummary = {
  id: number;
  unitId: number;
  part: SparePart;
  state: PlanState;
  plannedOn: string;
  opportunity: string | null;
  scheduleId: number | null;
  spareId: number | null;
  note: string | null;
  revision: number;
  /** Open, and its day has passed without the inspection that records the renewal. */
  missed: boolean;
};

export type OutlookRow = {
  unitId: number;
  companyId: number;
  vesselId: number;
  vesselName: string;
  engineId: number;
  engineSerial: string;
  profileId: number;
  profileName: string;
  cylinderNo: number;
  linerSerial: string | null;
  band: BandKey;
  bandLabel: string;
  linerHours: number | null;
  lastInspectedOn: string | null;
  maxWearMm: number | null;
  limitMm: number;
  wearRateMmPer1000h: number | null;
  /** Share of the units of the same profile, fleet-wide, wearing at or below this rate (0–1). */
  ratePercentile: number | null;
  limitOn: string | null;
  limitOnEarliest: string | null;
  limitOnLatest: string | null;
  overhauls: NextOverhaul[];
  /** Chance of passing the wear limit by each of the next two overhauls. */
  exceed: ExceedProbability[];
  nextOpportunity: Opportunity | null;
  recommendation: Recommendation;
  ringsDue: boolean;
  plans: PlanSummary[];
};

/** A stock line as the plan form offers it. */
export type StockOption = { id: number; profileId: number; part: SparePart; vesselId: number | null; vesselName: string | null; onHand: number; onOrder: number };
