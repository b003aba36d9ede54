/** Bands route a value to the next step; together they must cover the whole number line once. */

export interface End {
  readonly value: number;
  readonly inclusive: boolean;
}
/** A band's interval; a missing end runs on to −∞ / +∞. */
export interface Interval {
  readonly id: string;
  readonly lower?: End | undefined;
  readonly upper?: End | undefined;
}

/** True when `value` lies in the band. Example: `bandContains({ id: 'ok', lower: { value: 1, inclusive: true } }, 1)` is true. */
export function bandContains(band: Interval, value: number): boolean {
  const { lower, upper } = band;
  if (lower && (value < lower.value || (value === lower.value && !lower.inclusive))) return false;
  if (upper && (value > upper.value || (value === upper.value && !upper.inclusive))) return false;
  return true;
}

/** The first band containing `value`, or undefined when no band does. */
export function bandFor<B extends Interval>(bands: readonly B[], value: number): B | undefined {
  return bands.find((b) => bandContains(b, value));
}

export type BandProblem =
  | { readonly kind: 'gap'; readonly lower?: End | undefined; readonly upper?: End | undefined }
  | { readonly kind: 'overlap'; readonly bands: readonly [string, string]; readonly lower?: End | undefined; readonly upper?: End | undefined }
  | { readonly kind: 'empty'; readonly band: string };

function isEmpty(b: Interval): boolean {
  if (!b.lower || !b.upper) return false;
  return b.lower.value > b.upper.value || (b.lower.value === b.upper.value && !(b.lower.inclusive && b.upper.inclusive));
}

/** Lower ends in order: −∞ first, then by value, a closed end before an open one at the same value. */
function compareLower(a: Interval, b: Interval): number {
  if (!a.lower || !b.lower) return (a.lower ? 1 : 0) - (b.lower ? 1 : 0);
  if (a.lower.value !== b.lower.value) return a.lower.value - b.lower.value;
  return (a.lower.inclusive ? 0 : 1) - (b.lower.inclusive ? 0 : 1);
}

/** Upper ends in order: an open end before a closed one at the same value, +∞ last. */
function upperBeyond(a: End | undefined, b: End | undefined): boolean {
  if (!a) return b !== undefined;
  if (!b) return false;
  return a.value > b.value || (a.value === b.value && a.inclusive && !b.inclusive);
}

/**
 * Finds gaps, overlaps and empty bands over the whole number line, open and closed ends
 * respected. One sort and one sweep: O(n log n) in the number of bands.
 * Example: bands (−∞, 1) and (1, +∞) leave a gap at exactly 1.
 */
export function checkBandCoverage(bands: readonly Interval[]): BandProblem[] {
  const problems: BandProblem[] = [];
  const live = bands.filter((b) => {
    if (isEmpty(b)) problems.push({ kind: 'empty', band: b.id });
    return !isEmpty(b);
  });
  if (live.length === 0) return [...problems, { kind: 'gap' }];
  const sorted = [...live].sort(compareLower);
  const first = sorted[0]!;
  if (first.lower) problems.push({ kind: 'gap', upper: { value: first.lower.value, inclusive: !first.lower.inclusive } });
  // `reach` is the furthest upper end covered so far; undefined with `open` means +∞.
  let reach = first.upper;
  let owner = first.id;
  for (const b of sorted.slice(1)) {
    const lo = b.lower;
    if (!reach || !lo || lo.value < reach.value || (lo.value === reach.value && lo.inclusive && reach.inclusive)) {
      const upper = upperBeyond(b.upper, reach) ? reach : b.upper;
      problems.push({ kind: 'overlap', bands: [owner, b.id], lower: lo, upper });
    } else if (lo.value > reach.value || (!lo.inclusive && !reach.inclusive)) {
      problems.push({
        kind: 'gap',
        lower: { value: reach.value, inclusive: !reach.inclusive },
        upper: { value: lo.value, inclusive: !lo.inclusive },
      });
    }
    if (reach && upperBeyond(b.upper, reach)) [reach, owner] = [b.upper, b.id];
  }
  if (reach) problems.push({ kind: 'gap', lower: { value: reach.value, inclusive: !reach.inclusive } });
  return problems;
}
