import { tCritical } from "./t-quantile";

export type XY = { x: number; y: number };

export type FitModel = "intercept" | "through_origin";

/** An ordinary least-squares straight line with the statistics needed for intervals. */
export type LinearFit = {
  model: FitModel;
  n: number;
  /** Residual degrees of freedom: n − 2 with an intercept, n − 1 through the origin. */
  df: number;
  intercept: number;
  slope: number;
  /** Null through the origin, where the intercept is fixed at zero rather than estimated. */
  interceptSd: number | null;
  slopeSd: number;
  residualSd: number;
  mse: number;
  /** Centred R² with an intercept; uncentred R² (1 − SSE/Σy²) through the origin, as NIST StRD defines for NoInt. */
  rSquared: number;
  xMean: number;
  yMean: number;
  /** Σ(x − x̄)². */
  sxx: number;
  /** Σx², the spread that governs the through-origin intervals. */
  sumX2: number;
  /**
   * The residual standard deviation as computed, before any floor; `residualSd` (and `mse`,
   * which the intervals use) are floored at `minResidualSd` when one is given.
   */
  rawResidualSd: number;
  residuals: number[];
  /** Internally studentized residuals e / (s·√(1 − h)); null where the leverage h is 1. */
  standardizedResiduals: (number | null)[];
  /**
   * Externally studentized (deleted) residuals e / (s₍ᵢ₎·√(1 − h)), where s₍ᵢ₎ is the residual
   * standard deviation of the fit without point i; null where the leverage is 1 or no degree of
   * freedom is left once a point is deleted (n − params < 2).
   */
  deletedResiduals: (number | null)[];
};

/** What a prediction interval needs from a fit; a stored fit keeps only these. */
export type PredictionFit = Pick<LinearFit, "model" | "n" | "df" | "intercept" | "slope" | "mse" | "xMean" | "sxx" | "sumX2">;

export type FitResult =
  | { kind: "fit"; fit: LinearFit }
  | { kind: "insufficient_data"; needed: number; have: number }
  | { kind: "degenerate"; reason: "non_finite" | "no_x_spread" };

export type PredictionInterval = {
  x: number;
  yHat: number;
  lower: number;
  upper: number;
  /** t · s · √(1 + leverage term): the half-width of the interval. */
  halfWidth: number;
  t: number;
  confidence: number;
};

export type InversePrediction =
  | { kind: "bounded"; x: number; lower: number; upper: number; confidence: number }
  | { kind: "open_ended"; x: number; lower: number | null; upper: number | null; confidence: number }
  | { kind: "slope_not_positive"; slope: number };

export const DEFAULT_CONFIDENCE = 0.95;

/**
 * Fits y = b0 + b1·x (or y = b1·x with `throughOrigin`) by ordinary least squares.
 * Sums are taken about the means in two passes so that x values of tens of thousands of hours
 * do not cost precision (checked against NIST StRD Norris and NoInt1). Returns a typed
 * reason instead of a fit when there are too few points, no spread in x, or non-finite data,
 * so a caller never receives NaN.
 */
export function fitLine(points: readonly XY[], options: { throughOrigin?: boolean; minResidualSd?: number } = {}): FitResult {
  const model: FitModel = options.throughOrigin ? "through_origin" : "intercept";
  const params = model === "intercept" ? 2 : 1;
  const n = points.length;
  if (n < params + 1) return { kind: "insufficient_data", needed: params + 1, have: n };
  if (points.some((p) => !Number.isFinite(p.x) || !Number.isFinite(p.y))) return { kind: "degenerate", reason: "non_finite" };

  let xMean = 0;
  let yMean = 0;
  for (const p of points) {
    xMean += p.x;
    yMean += p.y;
  }
  xMean /= n;
  yMean /= n;
  let sxx = 0;
  let sxy = 0;
  let syy = 0;
  let sumX2 = 0;
  let sumXY = 0;
  let sumY2 = 0;
  for (const { x, y } of points) {
    const dx = x - xMean;
    const dy = y - yMean;
    sxx += dx * dx;
    sxy += dx * dy;
    syy += dy * dy;
    sumX2 += x * x;
    sumXY += x * y;
    sumY2 += y * y;
  }
  const spread = model === "intercept" ? sxx : sumX2;
  if (!(spread > 0)) return { kind: "degenerate", reason: "no_x_spread" };

  const slope = model === "intercept" ? sxy / sxx : sumXY / sumX2;
  const intercept = model === "intercept" ? yMean - slope * xMean : 0;
  const residuals = points.map((p) => p.y - (intercept + slope * p.x));
  const sse = residuals.reduce((s, e) => s + e * e, 0);
  const df = n - params;
  const rawResidualSd = Math.sqrt(sse / df);
  // No fit is surer than the instrument that read the points: a perfect line through three
  // readings would otherwise give a prediction band of zero width.
  const floor = options.minResidualSd !== undefined && Number.isFinite(options.minResidualSd) && options.minResidualSd > 0 ? options.minResidualSd : 0;
  const residualSd = Math.max(rawResidualSd, floor);
  const mse = residualSd * residualSd;
  const total = model === "intercept" ? syy : sumY2;
  const rSquared = sse === 0 || !(total > 0) ? 1 : 1 - sse / total;
  // Sums can overflow for extreme inputs even when every value is finite.
  if (![slope, intercept, mse, rSquared, sxx, sumX2].every(Number.isFinite)) return { kind: "degenerate", reason: "non_finite" };
  const standardizedResiduals: (number | null)[] = [];
  const deletedResiduals: (number | null)[] = [];
  for (let i = 0; i < n; i++) {
    const h = leverage(model, n, points[i].x, xMean, spread);
    const e = residuals[i];
    if (!(h < 1)) {
      standardizedResiduals.push(null);
      deletedResiduals.push(null);
      continue;
    }
    standardizedResiduals.push(residualSd === 0 ? 0 : e / (residualSd * Math.sqrt(1 - h)));
    // SSE without point i is SSE − e²/(1 − h), on one degree of freedom fewer.
    if (df < 2) {
      deletedResiduals.push(null);
      continue;
    }
    const sDeleted = Math.max(Math.sqrt(Math.max(0, sse - (e * e) / (1 - h)) / (df - 1)), floor);
    deletedResiduals.push(sDeleted === 0 ? (e === 0 ? 0 : Math.sign(e) * Infinity) : e / (sDeleted * Math.sqrt(1 - h)));
  }

  return {
    kind: "fit",
    fit: {
      model,
      n,
      df,
      intercept,
      slope,
      interceptSd: model === "intercept" ? residualSd * Math.sqrt(1 / n + (xMean * xMean) / sxx) : null,
      slopeSd: residualSd / Math.sqrt(spread),
      residualSd,
      rawResidualSd,
      mse,
      rSquared,
      xMean,
      yMean,
      sxx,
      sumX2,
      residuals,
      standardizedResiduals,
      deletedResiduals,
    },
  };
}

/**
 * The Bonferroni critical value for the outlier test on externally studentized residuals:
 * |tᵢ| > t(1 − α/(2n), n − params − 1) flags point i at family level α (Kutner, Nachtsheim,
 * Neter & Li, Applied Linear Statistical Models, 5th ed., "Bonferroni outlier test", section
 * 10.2 — section number from memory; Cook & Weisberg, Residuals and Influence in Regression,
 * 1982, ch. 2). The bound grows as n falls, because each of the n points is tested: with five
 * points it is 9.925, far above a fixed 2.5 that few points could ever exceed. Null when no
 * degree of freedom is left once a point is deleted.
 */
export function outlierCriticalValue(n: number, options: { alpha?: number; throughOrigin?: boolean } = {}): number | null {
  const alpha = options.alpha ?? 0.05;
  const df = n - (options.throughOrigin ? 1 : 2) - 1;
  if (!(df >= 1) || !(alpha > 0 && alpha < 1)) return null;
  return tCritical(1 - alpha / n, df);
}

/** Leverage of a point at x: 1/n + (x − x̄)²/Sxx with an intercept, x²/Σx² through the origin. */
function leverage(model: FitModel, n: number, x: number, xMean: number, spread: number): number {
  return model === "intercept" ? 1 / n + ((x - xMean) * (x - xMean)) / spread : (x * x) / spread;
}

/**
 * The fitted value at x with a prediction interval for one new observation:
 * ŷ ± t(1 − α/2, df)·√(MSE·(1 + 1/n + (x − x̄)²/Sxx)) (Draper & Smith, Applied Regression
 * Analysis, chapter 1; Penn State STAT 462 notes on the prediction interval for a new response), or with x²/Σx² in place of 1/n + (x − x̄)²/Sxx
 * through the origin. A new inspection is one new observation, so this, not the narrower
 * confidence interval for the mean line, is the honest band. Null for a non-finite x.
 */
export function predict(fit: PredictionFit, x: number, confidence = DEFAULT_CONFIDENCE): PredictionInterval | null {
  const t = tCritical(confidence, fit.df);
  if (t === null || !Number.isFinite(x)) return null;
  const spread = fit.model === "intercept" ? fit.sxx : fit.sumX2;
  const yHat = fit.intercept + fit.slope * x;
  const halfWidth = t * Math.sqrt(fit.mse * (1 + leverage(fit.model, fit.n, x, fit.xMean, spread)));
  if (!Number.isFinite(yHat) || !Number.isFinite(halfWidth)) return null;
  return { x, yHat, lower: yHat - halfWidth, upper: yHat + halfWidth, halfWidth, t, confidence };
}

/**
 * Inverse prediction (calibration): the x at which the fitted line reaches y0, with the interval
 * for x found by inverting the prediction bands (Draper & Smith, Applied Regression Analysis,
 * "Inverse regression (straight line case)"). The interval is the set of x for which y0
 * lies inside the prediction band, i.e. (y0 − ŷ(x))² ≤ t²·MSE·(1 + leverage(x)): its lower end is
 * where the upper band reaches y0, its upper end where the lower band does.
 * The quadratic's leading coefficient b1² − t²·MSE/Sxx is positive exactly when the slope is
 * significant at the chosen level (Draper & Smith's g < 1); then the interval is bounded.
 * Otherwise the set is unbounded: the ray that contains the point estimate is kept, the other
 * ray (an artefact of the hyperbolic bands far on the wrong side) is dropped, and the missing
 * end is null. Only rising lines are inverted, because a wear limit is approached from below.
 */
export function inversePredict(fit: LinearFit, y0: number, confidence = DEFAULT_CONFIDENCE): InversePrediction | null {
  if (!(fit.slope > 0)) return { kind: "slope_not_positive", slope: fit.slope };
  const t = tCritical(confidence, fit.df);
  if (t === null || !Number.isFinite(y0)) return null;

  const intercept = fit.model === "intercept";
  const centre = intercept ? fit.xMean : 0;
  const spread = intercept ? fit.sxx : fit.sumX2;
  const d = y0 - (fit.intercept + fit.slope * centre);
  const b = fit.slope;
  const t2s2 = t * t * fit.mse;
  // In u = x − centre: A·u² + B·u + C ≤ 0 is the set where y0 is inside the prediction band.
  const A = b * b - t2s2 / spread;
  const B = -2 * b * d;
  const C = d * d - t2s2 * (1 + (intercept ? 1 / fit.n : 0));
  const uHat = d / b;
  const x = centre + uHat;
  if (!Number.isFinite(x)) return null;

  const disc = B * B - 4 * A * C;
  const finite = (v: number) => (Number.isFinite(v) ? v : null);
  if (A > 0) {
    const root = Math.sqrt(Math.max(disc, 0));
    const q = -0.5 * (B + Math.sign(B || 1) * root);
    const r1 = q / A;
    const r2 = q !== 0 ? C / q : -r1;
    const lower = centre + Math.min(r1, r2);
    const upper = centre + Math.max(r1, r2);
    if (!Number.isFinite(lower) || !Number.isFinite(upper)) return null;
    return { kind: "bounded", x, lower, upper, confidence };
  }
  if (A === 0) {
    if (B === 0) return { kind: "open_ended", x, lower: null, upper: null, confidence };
    const edge = centre - C / B;
    return x >= edge
      ? { kind: "open_ended", x, lower: finite(edge), upper: null, confidence }
      : { kind: "open_ended", x, lower: null, upper: finite(edge), confidence };
  }
  if (disc <= 0) return { kind: "open_ended", x, lower: null, upper: null, confidence };
  const root = Math.sqrt(disc);
  const r1 = (-B + root) / (2 * A);
  const r2 = (-B - root) / (2 * A);
  const lo = Math.min(r1, r2);
  const hi = Math.max(r1, r2);
  return uHat >= hi
    ? { kind: "open_ended", x, lower: finite(centre + hi), upper: null, confidence }
    : { kind: "open_ended", x, lower: null, upper: finite(centre + lo), confidence };
}

/**
 * Least-squares slope through two or more points, for short series such as a ring set's gap
 * readings since renewal where a full fit with intervals would need more points than exist.
 * Null without two distinct finite x values.
 */
export function leastSquaresSlope(points: readonly XY[]): number | null {
  if (points.length < 2 || points.some((p) => !Number.isFinite(p.x) || !Number.isFinite(p.y))) return null;
  const xMean = points.reduce((s, p) => s + p.x, 0) / points.length;
  const yMean = points.reduce((s, p) => s + p.y, 0) / points.length;
  let sxx = 0;
  let sxy = 0;
  for (const p of points) {
    sxx += (p.x - xMean) ** 2;
    sxy += (p.x - xMean) * (p.y - yMean);
  }
  return sxx > 0 ? sxy / sxx : null;
}
