/**
 * Sample quantiles, Hyndman & Fan (1996) type 7: the default of R and NumPy, PERCENTILE.INC in
 * spreadsheets, and what PostgreSQL's percentile_cont computes. For sorted x₁..xₙ and 0 ≤ p ≤ 1:
 * h = (n − 1)·p + 1, Q(p) = x⌊h⌋ + (h − ⌊h⌋)·(x⌊h⌋+1 − x⌊h⌋).
 * Debrief states this definition on screen; the server computes the same with percentile_cont.
 */
export const QUANTILE_DEFINITION =
  'Quartiles and medians are sample quantiles of type 7 (Hyndman & Fan 1996): with n sorted values, ' +
  'Q(p) lies at position (n − 1)·p + 1, interpolated linearly between neighbours (PostgreSQL percentile_cont).';

/**
 * The type 7 quantile of values already sorted ascending; NaN for an empty list.
 * Example: `quantileSorted([1,2,3,4,5,6,7,8,9,10], 0.25)` is 3.25.
 */
export function quantileSorted(sorted: readonly number[], p: number): number {
  if (!(p >= 0 && p <= 1)) throw new RangeError(`p must lie in [0, 1], got ${p}`);
  const n = sorted.length;
  if (n === 0) return Number.NaN;
  const h = (n - 1) * p;
  const lo = Math.floor(h);
  const hi = Math.min(lo + 1, n - 1);
  return sorted[lo]! + (h - lo) * (sorted[hi]! - sorted[lo]!);
}

/** The type 7 quantile of unsorted values. Example: `quantile([3, 1, 2], 0.5)` is 2. */
export function quantile(values: readonly number[], p: number): number {
  return quantileSorted([...values].sort((a, b) => a - b), p);
}

export interface Quartiles {
  readonly n: number;
  readonly q1: number;
  readonly median: number;
  readonly q3: number;
}

/**
 * First quartile, median and third quartile (type 7).
 * Example: `quartiles([1,2,3,4,5,6,7,8,9,10])` is `{ n: 10, q1: 3.25, median: 5.5, q3: 7.75 }`.
 */
export function quartiles(values: readonly number[]): Quartiles {
  const sorted = [...values].sort((a, b) => a - b);
  return { n: sorted.length, q1: quantileSorted(sorted, 0.25), median: quantileSorted(sorted, 0.5), q3: quantileSorted(sorted, 0.75) };
}
