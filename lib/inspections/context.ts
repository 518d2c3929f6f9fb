import type { RunningHoursEntry } from "@/lib/wear/calendar";
import type { Inspection, LinerReading, StationRole, WearProfile } from "@/lib/wear/types";

/*
 * What the entry form and the server's checks need to know about the unit being
 * inspected: its engine profile, the liner in it, the previous approved inspection and
 * the running-hours log. Plain data, no server imports, so the browser can run the same
 * checks the server runs.
 */

export type ContextStation = { id: number; key: string; label: string; depthMm: number; role: StationRole };

export type ContextRing = {
  position: number;
  label: string;
  gapNewMinMm: number;
  gapNewMaxMm: number;
  gapLimitMm: number;
  grooveNewMinMm: number;
  grooveNewMaxMm: number;
  grooveLimitMm: number;
};

export type ContextProfile = {
  id: number;
  name: string;
  designation: string;
  boreMm: number;
  linerWearLimitMm: number;
  ovalityLimitMm: number;
  wearReference: "nominal" | "as_fitted";
  temperatureCorrection: boolean;
  alphaLinerPerK: number;
  alphaGaugePerK: number;
  runningInHours: number;
  minPointsForProjection: number;
  axes: readonly [{ key: string; label: string }, { key: string; label: string }];
  stations: ContextStation[];
  rings: ContextRing[];
  rodNutPressureBar: number | null;
  /** How far (in %) the rod nut pressure may be off the figure above before submission is blocked; null: the default ±10 %. */
  rodNutTolerancePct?: number | null;
};

export type ContextLiner = {
  id: number;
  serial: string;
  installedOn: string;
  installedEngineHours: number;
  linerHoursAtInstall: number;
};

export type PreviousInspection = {
  id: number;
  inspectedOn: string;
  engineHours: number;
  linerHours: number;
  linerId: number;
  gaugeTempC: number | null;
  linerTempC: number | null;
  readings: LinerReading[];
};

export type InspectionContext = {
  unit: { id: number; cylinderNo: number; engineId: number; engineSerial: string; vesselId: number; vesselName: string };
  profile: ContextProfile;
  liner: ContextLiner;
  /** The latest approved inspection of this unit before this one (not the one an amendment replaces). */
  previous: PreviousInspection | null;
  /** Recent running-hours log entries, oldest first. */
  hoursLog: RunningHoursEntry[];
  /**
   * When the profile measures wear from the as-fitted bore: the liner's earliest approved
   * gauging other than this one and the version it amends. The as-fitted rule
   * (lib/wear/as-fitted.ts, through lib/analysis/input.ts) chooses between it and this gauging.
   */
  asFitted: Inspection | null;
};

/** The pure wear computations' view of a profile. */
export function toWearProfile(p: ContextProfile): WearProfile {
  return {
    boreMm: p.boreMm,
    stations: p.stations.map((s) => ({ key: s.key, label: s.label, depthMm: s.depthMm, role: s.role })),
    axes: p.axes,
    linerWearLimitMm: p.linerWearLimitMm,
    ovalityLimitMm: p.ovalityLimitMm,
    wearReference: p.wearReference,
    temperatureCorrection: p.temperatureCorrection,
    alphaLinerPerK: p.alphaLinerPerK,
    alphaGaugePerK: p.alphaGaugePerK,
    runningInHours: p.runningInHours,
    minPointsForProjection: p.minPointsForProjection,
    rings: p.rings.map((r) => ({
      position: r.position,
      gapNewMinMm: r.gapNewMinMm,
      gapNewMaxMm: r.gapNewMaxMm,
      gapLimitMm: r.gapLimitMm,
      grooveNewMinMm: r.grooveNewMinMm,
      grooveNewMaxMm: r.grooveNewMaxMm,
      grooveLimitMm: r.grooveLimitMm,
    })),
  };
}

export const cellKey = (stationKey: string, axisKey: string) => `${stationKey}|${axisKey}`;
