// Small statistics shared by the leveling, drift, wheel and throughput numbers. Kept here rather than taken from a
// library because packages/core has no runtime dependency but zod; the tests check these against one.

export function assertFiniteValues(values: readonly number[], what: string): void {
  for (const value of values) {
    if (!Number.isFinite(value)) throw new RangeError(`${what} must be finite numbers`);
  }
}

/** Arithmetic mean; NaN for an empty list, so that callers decide what "no data" means. */
export function mean(values: readonly number[]): number {
  if (values.length === 0) return Number.NaN;
  let sum = 0;
  for (const v of values) sum += v;
  return sum / values.length;
}

/** Sample standard deviation (n − 1 in the denominator); null below two values, where it is undefined. */
export function sampleStdDev(values: readonly number[]): number | null {
  if (values.length < 2) return null;
  const m = mean(values);
  let ss = 0;
  for (const v of values) ss += (v - m) ** 2;
  return Math.sqrt(ss / (values.length - 1));
}

/** Middle value (the mean of the two middle values for an even count); null for an empty list. */
export function median(values: readonly number[]): number | null {
  return percentile(values, 50);
}

/**
 * The p-th percentile, p from 0 to 100, by linear interpolation between closest ranks: the value at rank
 * (n − 1)·p/100 counted from 0 (Hyndman and Fan's definition 7, the default of R and NumPy, Excel's
 * PERCENTILE.INC). Chosen because it is the most widely reproduced definition, so a report figure can be
 * checked in a spreadsheet. Null for an empty list.
 */
export function percentile(values: readonly number[], p: number): number | null {
  if (!Number.isFinite(p) || p < 0 || p > 100) throw new RangeError('A percentile lies between 0 and 100');
  assertFiniteValues(values, 'Values');
  if (values.length === 0) return null;
  const sorted = [...values].sort((a, b) => a - b);
  const rank = ((sorted.length - 1) * p) / 100;
  const lower = Math.floor(rank);
  const upper = Math.ceil(rank);
  const low = sorted[lower] as number;
  const high = sorted[upper] as number;
  return low + (rank - lower) * (high - low);
}

export interface LinearFit {
  slope: number;
  intercept: number;
  n: number;
  /** Standard error of the slope, sqrt(SSE/(n − 2) / Σ(x − x̄)²); null when n < 3, where SSE/(n − 2) is undefined. */
  stdErrSlope: number | null;
  /** Residual standard deviation sqrt(SSE/(n − 2)); null when n < 3. */
  residualStdDev: number | null;
  meanX: number;
  meanY: number;
  /** Σ(x − x̄)², the spread of x that the slope rests on. */
  sxx: number;
}

/**
 * Ordinary least squares of y on x with an intercept. Null when no line is defined: fewer than two points, or
 * every x the same (any slope fits equally well). Sums are taken about the means, which keeps them small when the
 * coordinates are large (nanometres, epoch days).
 */
export function linearFit(points: readonly { x: number; y: number }[]): LinearFit | null {
  const n = points.length;
  if (n < 2) return null;
  assertFiniteValues(
    points.flatMap((p) => [p.x, p.y]),
    'Fit coordinates',
  );
  const meanX = mean(points.map((p) => p.x));
  const meanY = mean(points.map((p) => p.y));
  let sxx = 0;
  let sxy = 0;
  for (const p of points) {
    sxx += (p.x - meanX) ** 2;
    sxy += (p.x - meanX) * (p.y - meanY);
  }
  if (sxx === 0) return null;
  const slope = sxy / sxx;
  const intercept = meanY - slope * meanX;
  let sse = 0;
  for (const p of points) sse += (p.y - (intercept + slope * p.x)) ** 2;
  const residualStdDev = n >= 3 ? Math.sqrt(sse / (n - 2)) : null;
  const stdErrSlope = residualStdDev === null ? null : residualStdDev / Math.sqrt(sxx);
  return { slope, intercept, n, stdErrSlope, residualStdDev, meanX, meanY, sxx };
}
