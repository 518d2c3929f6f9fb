import type { XY } from "@/lib/stats/regression";

/**
 * NIST Statistical Reference Datasets, linear regression: Norris.dat (36 observations, calibration
 * of ozone monitors, y = B0 + B1·x). Data table as published by NIST StRD and carried in the
 * GNU Scientific Library's fit tests; certified values from NIST StRD Norris.dat.
 */
const NORRIS_Y = [
  0.1, 338.8, 118.1, 888.0, 9.2, 228.1, 668.5, 998.5, 449.1, 778.9, 559.2, 0.3, 0.1, 778.1, 668.8, 339.3, 448.9, 10.8,
  557.7, 228.3, 998.0, 888.8, 119.6, 0.3, 0.6, 557.6, 339.3, 888.0, 998.5, 778.9, 10.2, 117.6, 228.9, 668.4, 449.2, 0.2,
];
const NORRIS_X = [
  0.2, 337.4, 118.2, 884.6, 10.1, 226.5, 666.3, 996.3, 448.6, 777.0, 558.2, 0.4, 0.6, 775.5, 666.9, 338.0, 447.5, 11.6,
  556.0, 228.1, 995.8, 887.6, 120.2, 0.3, 0.3, 556.8, 339.1, 887.2, 999.0, 779.0, 11.1, 118.3, 229.2, 669.1, 448.9, 0.5,
];

export const norris: XY[] = NORRIS_X.map((x, i) => ({ x, y: NORRIS_Y[i] }));

/** [src] NIST StRD Norris.dat, certified regression statistics. */
export const norrisCertified = {
  b0: -0.262323073774029,
  b0Sd: 0.232818234301152,
  b1: 1.00211681802045,
  b1Sd: 0.429796848199937e-3,
  residualSd: 0.884796396144373,
  rSquared: 0.999993745883712,
};

/** NIST StRD NoInt1.dat: x = 60…70, y = 130…140, model y = B1·x (no intercept). */
export const noInt1: XY[] = Array.from({ length: 11 }, (_, i) => ({ x: 60 + i, y: 130 + i }));

/** [src] NIST StRD NoInt1.dat, certified values (R² uncentred, as NIST defines it for no-intercept models). */
export const noInt1Certified = {
  b1: 2.07438016528926,
  b1Sd: 0.0165289256198347,
  residualSd: 3.56753034006338,
  rSquared: 0.999365492298663,
};
