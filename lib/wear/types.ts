import type { RingPositionSpec } from "../rings/rings";

export type StationRole = "unworn_top" | "ring_tdc" | "intermediate" | "lubricator" | "above_ports" | "unworn_bottom";

/** A gauging station: a fixed depth from the liner top face where both diameters are read. */
export type Station = { key: string; label: string; depthMm: number; role: StationRole };

/** A gauging direction; profiles name their own two, e.g. fore–aft and athwartships. */
export type Axis = { key: string; label: string };

export type WearReference = "nominal" | "as_fitted";

/** What the computations need from an engine profile (values from the maker's manual). */
export type WearProfile = {
  /** Nominal (as-new) bore. */
  boreMm: number;
  stations: Station[];
  axes: readonly [Axis, Axis];
  linerWearLimitMm: number;
  ovalityLimitMm: number;
  wearReference: WearReference;
  temperatureCorrection: boolean;
  alphaLinerPerK: number;
  alphaGaugePerK: number;
  /** Readings taken before the liner has run this many hours are left out of the steady-state fit. */
  runningInHours: number;
  /** Fewest steady-state points for a projection; at least 3, so a prediction interval exists. */
  minPointsForProjection?: number;
  /** The smallest step the bore gauge reads; 0.01 mm (WEAR_RULES.gaugeResolutionMm) when not given. */
  gaugeResolutionMm?: number;
  rings: RingPositionSpec[];
};

/** One diameter reading, in SI millimetres, as read on the gauge (before temperature correction). */
export type LinerReading = { stationKey: string; axisKey: string; diameterMm: number };

export type Inspection = {
  id: string;
  /** ISO calendar date, yyyy-mm-dd. */
  date: string;
  engineHours: number;
  linerHours: number;
  gaugeTempC: number | null;
  linerTempC: number | null;
  readings: LinerReading[];
};

export const DEFAULT_AXES: readonly [Axis, Axis] = [
  { key: "fa", label: "Fore–aft" },
  { key: "ath", label: "Athwartships" },
];

export const DEFAULT_MIN_POINTS_FOR_PROJECTION = 3;

/**
 * Thresholds behind the typed issues and bands, kept in one place so the entry form, the
 * inspection analysis and the bands agree. Sources: BrightHub Engineering articles on liner wear
 * (normal rate 0.025–0.05 mm/1000 h for slow-speed two-strokes), marineengineeringonline.com
 * (above 0.1 mm/1000 h is abnormal); the outlier test is the Bonferroni test named below; each
 * other figure is marked "common practice" where no published source backs it.
 */
export const WEAR_RULES = {
  /** Wear at an unworn band should be about zero; more suggests a gauge or nominal-bore problem. */
  unwornBandToleranceMm: 0.05,
  /** A liner cannot shrink: a reading this far below nominal is a gauge or typing error. */
  belowNominalMarginMm: 0.2,
  /** Wear beyond this fraction of the bore is far past any limit (0.4–0.8 %) and so a typing error. */
  aboveNominalFractionOfBore: 0.02,
  /** A step up since the previous inspection larger than this (or than the abnormal rate over the hours between) is suspicious. */
  jumpSinceLastMm: 0.15,
  /** Wear does not go backwards: a drop larger than this since last time is suspicious. */
  decreaseSinceLastMm: 0.05,
  abnormalRateMmPer1000h: 0.1,
  /** Common practice: a unit past 80 % of a limit is watched; no published source sets the figure. */
  watchFractionOfLimit: 0.8,
  /**
   * Family level of the Bonferroni outlier test on externally studentized residuals
   * (Kutner et al., Applied Linear Statistical Models, section 10.2; Cook & Weisberg 1982):
   * a point is flagged when |tᵢ| > t(1 − α/(2n), n − 3). The threshold depends on n; a fixed
   * 2.5 on internally studentized residuals could never fire with eight or fewer points,
   * because those cannot exceed √(n − 2).
   */
  outlierFamilyAlpha: 0.05,
  /** Inside-micrometer resolution, common practice for liner gauging (0.01 mm); a profile may give its own. */
  gaugeResolutionMm: 0.01,
  confidence: 0.95,
} as const;
