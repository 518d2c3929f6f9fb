const LANCZOS_G = 7;
const LANCZOS = [
  0.99999999999980993, 676.5203681218851, -1259.1392167224028, 771.32342877765313, -176.61502916214059,
  12.507343278686905, -0.13857109526572012, 9.9843695780195716e-6, 1.5056327351493116e-7,
];

/** ln Γ(z) for z > 0 by the Lanczos approximation (g = 7, nine terms), good to about 1e-15. */
function lnGamma(z: number): number {
  if (z < 0.5) return Math.log(Math.PI / Math.sin(Math.PI * z)) - lnGamma(1 - z);
  const w = z - 1;
  let sum = LANCZOS[0];
  for (let i = 1; i < LANCZOS_G + 2; i++) sum += LANCZOS[i] / (w + i);
  const t = w + LANCZOS_G + 0.5;
  return 0.5 * Math.log(2 * Math.PI) + (w + 0.5) * Math.log(t) - t + Math.log(sum);
}

/** Continued fraction for the incomplete beta function, by the modified Lentz method. */
function betaContinuedFraction(x: number, a: number, b: number): number | null {
  const tiny = 1e-300;
  let c = 1;
  let d = 1 - ((a + b) * x) / (a + 1);
  if (Math.abs(d) < tiny) d = tiny;
  d = 1 / d;
  let h = d;
  for (let m = 1; m <= 20000; m++) {
    const m2 = 2 * m;
    let aa = (m * (b - m) * x) / ((a + m2 - 1) * (a + m2));
    d = 1 + aa * d;
    if (Math.abs(d) < tiny) d = tiny;
    c = 1 + aa / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    h *= d * c;
    aa = (-(a + m) * (a + b + m) * x) / ((a + m2) * (a + m2 + 1));
    d = 1 + aa * d;
    if (Math.abs(d) < tiny) d = tiny;
    c = 1 + aa / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    const delta = d * c;
    h *= delta;
    if (Math.abs(delta - 1) < 1e-15) return h;
  }
  return null;
}

/**
 * Regularized incomplete beta I_x(a, b), with 1 − x passed separately so that x close to 1
 * keeps its precision. Uses the symmetry I_x(a,b) = 1 − I_{1−x}(b,a) where the continued
 * fraction converges slowly.
 */
function regularizedBeta(x: number, oneMinusX: number, a: number, b: number): number | null {
  if (x <= 0) return 0;
  if (oneMinusX <= 0) return 1;
  const lnFront = a * Math.log(x) + b * Math.log(oneMinusX) + lnGamma(a + b) - lnGamma(a) - lnGamma(b);
  if (x < (a + 1) / (a + b + 2)) {
    const cf = betaContinuedFraction(x, a, b);
    return cf === null ? null : (Math.exp(lnFront) * cf) / a;
  }
  const cf = betaContinuedFraction(oneMinusX, b, a);
  return cf === null ? null : 1 - (Math.exp(lnFront) * cf) / b;
}

/** P(T > t) for t ≥ 0: ½·I_{ν/(ν+t²)}(ν/2, ½). */
function upperTail(t: number, df: number): number | null {
  const t2 = t * t;
  const ib = regularizedBeta(df / (df + t2), t2 / (df + t2), df / 2, 0.5);
  return ib === null ? null : 0.5 * ib;
}

function validDf(df: number): boolean {
  return Number.isFinite(df) && df > 0 && df <= 1e7;
}

/**
 * Student t cumulative distribution P(T ≤ t) with ν = df degrees of freedom (df may be
 * fractional), from the regularized incomplete beta function (Abramowitz & Stegun 26.5.27,
 * 26.7.1). Null for invalid arguments, so no NaN reaches a caller.
 */
export function studentTCdf(t: number, df: number): number | null {
  if (!validDf(df) || Number.isNaN(t)) return null;
  if (t === Infinity) return 1;
  if (t === -Infinity) return 0;
  const tail = upperTail(Math.abs(t), df);
  if (tail === null) return null;
  return t >= 0 ? 1 - tail : tail;
}

/**
 * Student t inverse CDF: the t with P(T ≤ t) = p. simple-statistics has no t quantile, and the
 * prediction intervals need one for small n where the normal quantile is far too narrow.
 * Solved by bracketing and bisection on the upper tail, which is monotone and computed
 * without cancellation, so far tails keep their relative precision.
 * Null for p outside (0, 1) or an invalid df.
 */
export function studentTQuantile(p: number, df: number): number | null {
  if (!validDf(df) || !(p > 0 && p < 1)) return null;
  if (p === 0.5) return 0;
  const q = Math.min(p, 1 - p);
  let lo = 0;
  let hi = 1;
  for (let tail = upperTail(hi, df); ; tail = upperTail(hi, df)) {
    if (tail === null) return null;
    if (tail <= q) break;
    lo = hi;
    hi *= 2;
    if (!Number.isFinite(hi)) return null;
  }
  for (let i = 0; i < 400 && hi - lo > 1e-15 * hi; i++) {
    const mid = 0.5 * (lo + hi);
    const tail = upperTail(mid, df);
    if (tail === null) return null;
    if (tail > q) lo = mid;
    else hi = mid;
  }
  const t = 0.5 * (lo + hi);
  return p > 0.5 ? t : -t;
}

const criticalCache = new Map<string, number | null>();

/**
 * The two-sided critical value t(1 − α/2, df) for a confidence level such as 0.95.
 * Memoised: a fleet recompute asks for the same few (confidence, df) pairs thousands of
 * times, and each answer costs a bisection on the incomplete beta function.
 */
export function tCritical(confidence: number, df: number): number | null {
  if (!(confidence > 0 && confidence < 1)) return null;
  const key = `${confidence}|${df}`;
  const cached = criticalCache.get(key);
  if (cached !== undefined) return cached;
  const t = studentTQuantile(1 - (1 - confidence) / 2, df);
  if (criticalCache.size < 10_000) criticalCache.set(key, t);
  return t;
}
