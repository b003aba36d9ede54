/**
 * Equal-width bins for a reading histogram that always shows the limits: the range spans the
 * values and the limits, so a reader sees how far the readings sit from them.
 */
export interface BinSpec {
  readonly lo: number;
  readonly hi: number;
  readonly count: number;
}

/**
 * Bin edges covering every value and every limit, `count` bins of equal width.
 * Example: `binSpec({ min: 1, max: 9 }, { min: 2, max: 12 }, 10)` is `{ lo: 1, hi: 12, count: 10 }`.
 */
export function binSpec(values: { min: number; max: number }, limits: { min?: number; max?: number }, count = 20): BinSpec {
  const ends = [values.min, values.max, limits.min, limits.max].filter((v): v is number => v !== undefined && Number.isFinite(v));
  let lo = Math.min(...ends);
  let hi = Math.max(...ends);
  if (!(hi > lo)) {
    const pad = Math.abs(lo) * 0.05 || 1;
    lo -= pad;
    hi += pad;
  }
  return { lo, hi, count };
}

/**
 * The 1-based bin of a value, like PostgreSQL's width_bucket; the top edge belongs to the last bin.
 * Example: `binOf({ lo: 0, hi: 10, count: 5 }, 10)` is 5.
 */
export function binOf(spec: BinSpec, value: number): number {
  if (value >= spec.hi) return spec.count;
  if (value < spec.lo) return 1;
  return Math.floor(((value - spec.lo) / (spec.hi - spec.lo)) * spec.count) + 1;
}

/** The lower and upper edge of bin `i` (1-based). Example: bin 2 of `{ lo: 0, hi: 10, count: 5 }` is [2, 4]. */
export function binEdges(spec: BinSpec, i: number): [number, number] {
  const w = (spec.hi - spec.lo) / spec.count;
  return [spec.lo + (i - 1) * w, spec.lo + i * w];
}
