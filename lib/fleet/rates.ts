import { quantileSorted } from "simple-statistics";

/** Where the fleet's wear rates sit: the middle and the usual spread, in mm per 1000 h. */
export type RateSpread = { n: number; median: number; p10: number; p90: number };

/**
 * The median and the 10th and 90th percentiles of the units' wear rates (the trend slope, or
 * the last interval where there is no trend yet), so a superintendent can see whether one
 * engine wears unlike the rest. Percentiles by simple-statistics' quantileSorted, the linear
 * interpolation Hyndman & Fan call type 7 (R's default: index (n − 1)·p, interpolated between
 * neighbours; "Sample Quantiles in Statistical Packages", 1996). Non-finite rates are left out;
 * null with fewer than three rates, where a spread says nothing.
 */
export function rateSpread(rates: readonly (number | null)[]): RateSpread | null {
  const sorted = rates.filter((r): r is number => r !== null && Number.isFinite(r)).sort((a, b) => a - b);
  if (sorted.length < 3) return null;
  return { n: sorted.length, median: quantileSorted(sorted, 0.5), p10: quantileSorted(sorted, 0.1), p90: quantileSorted(sorted, 0.9) };
}
