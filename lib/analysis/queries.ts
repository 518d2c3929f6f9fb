import "server-only";
import { db } from "@/lib/db/knex";
import type { CurrentUser } from "@/lib/auth/session";
import { getEngine, getUnitContext } from "@/lib/fleet/queries";
import { listInspections, listLiners } from "@/lib/history/queries";
import { computeUnitAnalysis, type UnitSummary } from "./compute";
import { loadUnitInputs, type ProfileRow } from "./load";
import type { LinearFit } from "@/lib/stats/regression";
import type { LinerPoint } from "@/lib/wear/liner";

export type ProfileDepthSeries = {
  inspectionId: string;
  date: string;
  linerHours: number;
  cells: { stationKey: string; depthMm: number; axisKey: string; wearMm: number; rawMm: number; correctedMm: number; usable: boolean }[];
  ovality: { stationKey: string; depthMm: number; ovalityMm: number | null }[];
};

export type UnitPageData = NonNullable<Awaited<ReturnType<typeof getUnitAnalysis>>>;

/**
 * The full analysis of one unit for its history screen and the JSON API: context,
 * liners, inspections, per-inspection wear by station, the trend with its fit, the
 * projections with dates, the rings and the band. Null when the unit is outside the
 * user's vessels (callers answer 404 so no one learns which ids exist).
 */
export async function getUnitAnalysis(user: CurrentUser, unitId: number) {
  const ctx = await getUnitContext(user, unitId);
  if (!ctx) return null;
  const [{ units, profiles }, liners, inspections] = await Promise.all([
    loadUnitInputs(db, { unitIds: [unitId] }),
    listLiners(unitId),
    listInspections(unitId),
  ]);
  const input = units[0];
  const profile = profiles.get(ctx.profileId) as ProfileRow;
  const analysis = computeUnitAnalysis(input);
  const depthOf = new Map(profile.stations.map((s) => [s.key, s.depthMm]));
  const series: ProfileDepthSeries[] = analysis.liner.inspections.map((ia) => {
    const point = analysis.liner.points.find((p) => p.inspectionId === ia.inspectionId);
    const insp = input.inspections.find((i) => i.id === ia.inspectionId)!;
    return {
      inspectionId: ia.inspectionId,
      date: insp.date,
      linerHours: point?.linerHours ?? insp.linerHours,
      cells: ia.cells.map((c) => ({ ...c, depthMm: depthOf.get(c.stationKey) ?? 0 })),
      ovality: ia.ovality,
    };
  });
  const fit: LinearFit | null = analysis.liner.wear.trend?.fit ?? null;
  return {
    context: ctx,
    profile: {
      name: profile.name,
      boreMm: profile.boreMm,
      linerWearLimitMm: profile.linerWearLimitMm,
      ovalityLimitMm: profile.ovalityLimitMm,
      runningInHours: profile.runningInHours,
      temperatureCorrection: profile.temperatureCorrection,
      wearReference: profile.wearReference,
      stations: profile.stations,
      axes: profile.axes,
      rings: profile.rings,
    },
    liners,
    inspections,
    summary: analysis.summary as UnitSummary,
    points: analysis.liner.points as LinerPoint[],
    fit: fit ? { ...fit, residuals: [], standardizedResiduals: [] } : null,
    series,
    rings: analysis.rings,
    linerIssues: analysis.liner.issues,
  };
}

/** The stored per-unit results of a whole engine, for the engine API. */
export async function getEngineAnalysis(user: CurrentUser, engineId: number) {
  const engine = await getEngine(user, engineId);
  if (!engine) return null;
  return {
    engine: { id: engine.id, serial: engine.serial, cylinderCount: engine.cylinderCount, vessel: engine.vessel, profile: engine.profile },
    latestHours: engine.latestHours,
    units: engine.units.map((u) => ({
      unitId: u.id,
      cylinderNo: u.cylinderNo,
      linerSerial: u.linerSerial,
      band: u.band,
      maxWearMm: u.maxWearMm,
      maxOvalityMm: u.maxOvalityMm,
      wearRateMmPer1000h: u.wearRate,
      limitOn: u.limitOn,
      limitOnEarliest: u.limitOnEarliest,
      limitOnLatest: u.limitOnLatest,
      lastInspectedOn: u.lastInspectedOn,
      summary: u.summary as UnitSummary | null,
    })),
  };
}
