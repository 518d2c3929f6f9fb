import type { StationRole, WearProfile } from "./types";
import { DEFAULT_MIN_POINTS_FOR_PROJECTION } from "./types";

/**
 * Problems with a profile that would make every result meaningless (no bore, no stations,
 * axes that are not two distinct keys, limits that are not positive). Profiles are typed in
 * by an admin from the maker's manual, so they are checked rather than trusted.
 */
export function checkProfile(profile: WearProfile): string[] {
  const known = checked.get(profile);
  if (known) return known;
  const problems = findProblems(profile);
  checked.set(profile, problems);
  return problems;
}

// Profiles are plain data loaded once and shared by every unit of an engine, so the check
// is remembered per profile object (a fleet recompute would otherwise repeat it per reading set).
const checked = new WeakMap<WearProfile, string[]>();

function findProblems(profile: WearProfile): string[] {
  const problems: string[] = [];
  const positive = (v: number) => Number.isFinite(v) && v > 0;
  if (!positive(profile.boreMm)) problems.push("The profile has no valid nominal bore.");
  if (profile.stations.length === 0) problems.push("The profile has no gauging stations.");
  const keys = new Set(profile.stations.map((s) => s.key));
  if (keys.size !== profile.stations.length) problems.push("Two gauging stations share a key.");
  if (profile.stations.some((s) => !Number.isFinite(s.depthMm))) problems.push("A gauging station has no valid depth.");
  if (profile.axes.length !== 2 || profile.axes[0].key === profile.axes[1].key) {
    problems.push("The profile needs two distinct gauging directions.");
  }
  if (!positive(profile.linerWearLimitMm)) problems.push("The profile has no valid liner wear limit.");
  if (!positive(profile.ovalityLimitMm)) problems.push("The profile has no valid ovality limit.");
  if (!Number.isFinite(profile.runningInHours) || profile.runningInHours < 0) problems.push("The running-in hours are not valid.");
  return problems;
}

/** Unworn bands, top and bottom, where wear should read about zero. */
export function isUnwornBand(role: StationRole): boolean {
  return role === "unworn_top" || role === "unworn_bottom";
}

/** Points needed for a projection: the profile's figure, never fewer than 3 (a fit with n − 2 ≥ 1). */
export function minPointsForProjection(profile: WearProfile): number {
  const wanted = profile.minPointsForProjection ?? DEFAULT_MIN_POINTS_FOR_PROJECTION;
  return Number.isFinite(wanted) ? Math.max(DEFAULT_MIN_POINTS_FOR_PROJECTION, Math.ceil(wanted)) : DEFAULT_MIN_POINTS_FOR_PROJECTION;
}
