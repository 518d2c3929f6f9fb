import "server-only";
import { db } from "@/lib/db/knex";
import type { CurrentUser } from "@/lib/auth/session";
import { getEngine, getUnitContext } from "@/lib/fleet/queries";
import { listInspections, listLiners } from "@/lib/history/queries";
import { loadProfiles, type ProfileRow } from "@/lib/profiles/queries";
import type { UnitDetail, UnitSummary } from "./compute";
import { recomputeUnits } from "./recompute";

export type UnitPageData = NonNullable<Awaited<ReturnType<typeof getUnitAnalysis>>>;

type StoredRow = { summary: unknown; detail: unknown; computed_at: Date | string };
const parsed = <T>(v: unknown): T => (typeof v === "string" ? JSON.parse(v) : v) as T;

async function readStored(unitId: number): Promise<StoredRow | undefined> {
  return db("unit_analysis").where({ unit_id: unitId }).first("summary", "detail", "computed_at");
}

/**
 * The analysis of one unit for its history screen and the JSON API, read from the stored
 * row in unit_analysis (kept current whenever an inspection, liner, profile or the hours log
 * changes), with the context, liners and inspections. A unit with no stored detail yet (a
 * row written before the detail was kept) is computed and stored once, in a transaction.
 * Null when the unit is outside the user's vessels (callers answer 404 so no one learns
 * which ids exist).
 */
export async function getUnitAnalysis(user: CurrentUser, unitId: number) {
  // One round trip's wait instead of four: the reads do not depend on each other (the route has
  // already checked the unit is on the caller's vessels; the context check below still decides).
  const [ctx, stored, liners, inspections] = await Promise.all([getUnitContext(user, unitId), readStored(unitId), listLiners(unitId), listInspections(unitId)]);
  if (!ctx) return null;
  let row = stored;
  if (!row?.detail) {
    await db.transaction((trx) => recomputeUnits(trx, { unitIds: [unitId] }));
    row = await readStored(unitId);
  }
  const profiles = await loadProfiles(db, [ctx.profileId]);
  const profile = profiles.get(ctx.profileId) as ProfileRow;
  const summary = parsed<UnitSummary>(row!.summary);
  const detail = parsed<UnitDetail>(row!.detail);
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
    summary,
    points: detail.points,
    fit: detail.fit,
    profileSeries: detail.profileSeries,
    latest: detail.latest,
    rings: detail.rings,
    linerIssues: detail.linerIssues,
    computedAt: new Date(row!.computed_at).toISOString(),
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
