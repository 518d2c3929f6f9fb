import type { XY } from "@/lib/stats/regression";

/** F. J. Anscombe, "Graphs in Statistical Analysis", The American Statistician 27 (1973) 17–21, table 1. */
const X123 = [10, 8, 13, 9, 11, 14, 6, 4, 12, 7, 5];
const X4 = [8, 8, 8, 8, 8, 8, 8, 19, 8, 8, 8];
const Y = {
  I: [8.04, 6.95, 7.58, 8.81, 8.33, 9.96, 7.24, 4.26, 10.84, 4.82, 5.68],
  II: [9.14, 8.14, 8.74, 8.77, 9.26, 8.1, 6.13, 3.1, 9.13, 7.26, 4.74],
  III: [7.46, 6.77, 12.74, 7.11, 7.81, 8.84, 6.08, 5.39, 8.15, 6.42, 5.73],
  IV: [6.58, 5.76, 7.71, 8.84, 8.47, 7.04, 5.25, 12.5, 5.56, 7.91, 6.89],
};

const pair = (xs: number[], ys: number[]): XY[] => xs.map((x, i) => ({ x, y: ys[i] }));

export const anscombe: Record<"I" | "II" | "III" | "IV", XY[]> = {
  I: pair(X123, Y.I),
  II: pair(X123, Y.II),
  III: pair(X123, Y.III),
  IV: pair(X4, Y.IV),
};

/** [src] Anscombe (1973): the same summary for every set, to the digits printed there. */
export const anscombePublished = { meanX: 9, varX: 11, meanY: 7.5, r: 0.816, intercept: 3.0, slope: 0.5, rSquared: 0.67 };
