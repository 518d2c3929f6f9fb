import type { RingPositionSpec } from "@/lib/rings/rings";
import type { Inspection, LinerReading, WearProfile } from "@/lib/wear/types";
import { DEFAULT_AXES } from "@/lib/wear/types";

/**
 * An invented 900 mm bore profile for tests. Wear limit 0.6 % of the bore and ovality limit 1 mm
 * follow the figures BrightHub Engineering gives for large bores [src]. The groove clearances are
 * a maker's published clearance table for a 720 mm bore [src] (new range and upper maximum), used
 * as a check value; the closed gaps and station depths are invented.
 */
export const RINGS: RingPositionSpec[] = [
  { position: 1, gapNewMinMm: 3.0, gapNewMaxMm: 3.6, gapLimitMm: 6.0, grooveNewMinMm: 0.5, grooveNewMaxMm: 0.58, grooveLimitMm: 1.0 },
  { position: 2, gapNewMinMm: 3.0, gapNewMaxMm: 3.6, gapLimitMm: 6.0, grooveNewMinMm: 0.45, grooveNewMaxMm: 0.53, grooveLimitMm: 0.95 },
];

export function testProfile(overrides: Partial<WearProfile> = {}): WearProfile {
  return {
    boreMm: 900,
    stations: [
      { key: "s1", label: "Unworn top band", depthMm: 80, role: "unworn_top" },
      { key: "s2", label: "Top ring at TDC", depthMm: 220, role: "ring_tdc" },
      { key: "s3", label: "Third ring at TDC", depthMm: 400, role: "ring_tdc" },
      { key: "s4", label: "Mid stroke", depthMm: 1200, role: "intermediate" },
      { key: "s5", label: "Lubricator level", depthMm: 1500, role: "lubricator" },
      { key: "s6", label: "Above scavenge ports", depthMm: 2600, role: "above_ports" },
      { key: "s7", label: "Unworn bottom band", depthMm: 2900, role: "unworn_bottom" },
    ],
    axes: DEFAULT_AXES,
    linerWearLimitMm: 5.4,
    ovalityLimitMm: 1.0,
    wearReference: "nominal",
    temperatureCorrection: false,
    alphaLinerPerK: 10.5e-6,
    alphaGaugePerK: 11.5e-6,
    runningInHours: 3000,
    minPointsForProjection: 3,
    rings: RINGS,
    ...overrides,
  };
}

/** Wear of each non-unworn station as a fraction of the top-ring station's wear (a typical profile shape). */
const SHAPE: Record<string, number> = { s1: 0, s2: 1, s3: 0.8, s4: 0.4, s5: 0.3, s6: 0.15, s7: 0 };

/** Readings for a liner whose top-ring station has worn `topWearMm`, with `ovalityMm` between the axes there. */
export function readingsFor(topWearMm: number, ovalityMm = 0, boreMm = 900): LinerReading[] {
  return Object.entries(SHAPE).flatMap(([stationKey, f]) => [
    { stationKey, axisKey: "fa", diameterMm: boreMm + f * topWearMm + f * ovalityMm },
    { stationKey, axisKey: "ath", diameterMm: boreMm + f * topWearMm },
  ]);
}

let counter = 0;

/** An inspection at `linerHours` with the given top-ring wear; dates advance with hours at 18 h a day. */
export function inspectionAt(linerHours: number, topWearMm: number, overrides: Partial<Inspection> = {}): Inspection {
  const days = Number.isFinite(linerHours) ? Math.round(linerHours / 18) : 0;
  const date = new Date(Date.UTC(2018, 0, 1) + days * 86_400_000).toISOString().slice(0, 10);
  return {
    id: `i${++counter}`,
    date,
    engineHours: 50_000 + linerHours,
    linerHours,
    gaugeTempC: null,
    linerTempC: null,
    readings: readingsFor(topWearMm),
    ...overrides,
  };
}
