import { MM_PER_INCH } from "@/lib/units/length";
import type { ContextProfile, ContextStation } from "@/lib/inspections/context";
import { mm } from "@/lib/format";
import { DEPTH_TOLERANCE_MM, normaliseHeader } from "./layout";

/*
 * Matching a file's words and depths to the engine profile: a station by its key, its label
 * or its depth from the liner top (within DEPTH_TOLERANCE_MM); a direction by its key, its
 * label or a plain word for it. Pure.
 */

export type StationMatch = { kind: "ok"; station: ContextStation } | { kind: "none"; message: string };

/** The station at a depth (mm below the liner top): the nearest one, if within the tolerance. */
export function stationAtDepth(profile: Pick<ContextProfile, "stations">, depthMm: number, toleranceMm = DEPTH_TOLERANCE_MM): StationMatch {
  const sorted = [...profile.stations].sort((a, b) => Math.abs(a.depthMm - depthMm) - Math.abs(b.depthMm - depthMm));
  const nearest = sorted[0];
  if (nearest && Math.abs(nearest.depthMm - depthMm) <= toleranceMm + 1e-9) return { kind: "ok", station: nearest };
  const above = [...profile.stations].filter((s) => s.depthMm < depthMm).sort((a, b) => b.depthMm - a.depthMm)[0];
  const below = [...profile.stations].filter((s) => s.depthMm > depthMm).sort((a, b) => a.depthMm - b.depthMm)[0];
  const around = [above, below].filter(Boolean).map((s) => `${s!.label} at ${mm(s!.depthMm, 0)}`);
  return {
    kind: "none",
    message: `No station within ${mm(toleranceMm, 0)} of the depth ${mm(depthMm, 1)}${around.length ? ` (nearest: ${around.join(" and ")})` : ""}. Check the depth, or map the station column instead.`,
  };
}

/** The station a cell names by key or label (case and punctuation ignored). */
export function stationByName(profile: Pick<ContextProfile, "stations">, text: string): StationMatch {
  const n = normaliseHeader(text);
  const found = profile.stations.find((s) => normaliseHeader(s.key) === n) ?? profile.stations.find((s) => normaliseHeader(s.label) === n);
  if (found) return { kind: "ok", station: found };
  return { kind: "none", message: `"${text.trim().slice(0, 30)}" is not a station of this engine's profile (${profile.stations.map((s) => s.key).join(", ")}).` };
}

// Plain words for the two directions (our own list; the profile's own keys and labels come first).
const FIRST_AXIS_WORDS = ["fa", "foreaft", "fore", "fwdaft", "longitudinal", "long", "x"];
const SECOND_AXIS_WORDS = ["ath", "athw", "athwart", "athwartships", "transverse", "trans", "ps", "portstbd", "portstarboard", "y"];

/** The profile direction a cell names, or null. */
export function axisByName(profile: Pick<ContextProfile, "axes">, text: string): string | null {
  const n = normaliseHeader(text);
  if (!n) return null;
  for (const a of profile.axes) if (normaliseHeader(a.key) === n || normaliseHeader(a.label) === n) return a.key;
  if (FIRST_AXIS_WORDS.includes(n)) return profile.axes[0].key;
  if (SECOND_AXIS_WORDS.includes(n)) return profile.axes[1].key;
  return null;
}

/**
 * The length unit a file's diameters are most likely in, from the bore: a median near the
 * bore in inches (bore ÷ 25.4) means inches. Null when there is nothing to judge.
 */
export function likelyLengthUnit(diameters: readonly number[], boreMm: number): "mm" | "in" | null {
  const values = diameters.filter((d) => Number.isFinite(d) && d > 0).sort((a, b) => a - b);
  if (!values.length) return null;
  const median = values[Math.floor(values.length / 2)];
  const near = (target: number) => Math.abs(Math.log(median / target)) < Math.log(1.05);
  if (near(boreMm)) return "mm";
  if (near(boreMm / MM_PER_INCH)) return "in";
  return null;
}

/** A length in the given unit, in millimetres. */
export const toMm = (value: number, unit: "mm" | "in") => (unit === "in" ? value * MM_PER_INCH : value);
