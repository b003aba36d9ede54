import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { quantile, quantileSorted, quartiles, binSpec, binOf, binEdges } from '@shared/stats';

// Hyndman & Fan, "Sample quantiles in statistical packages", The American Statistician 50(4), 1996:
// type 7 puts Q(p) at h = (n − 1)p + 1 and interpolates between x⌊h⌋ and x⌊h⌋+1.
describe('type 7 sample quantiles (Hyndman & Fan 1996)', () => {
  it('for 1..10 the quartiles are 3.25, 5.5 and 7.75 (worked by hand from h = (n − 1)p + 1)', () => {
    // Q1: h = 9·0.25 + 1 = 3.25 → x3 + 0.25·(x4 − x3) = 3 + 0.25 = 3.25
    // median: h = 5.5 → 5 + 0.5·1 = 5.5; Q3: h = 7.75 → 7 + 0.75·1 = 7.75
    expect(quartiles([10, 9, 8, 7, 6, 5, 4, 3, 2, 1])).toEqual({ n: 10, q1: 3.25, median: 5.5, q3: 7.75 });
  });

  it('for an odd count the median is the middle value and the quartiles interpolate (h = 2 and 4 for n = 5)', () => {
    expect(quartiles([2, 4, 8, 16, 32])).toEqual({ n: 5, q1: 4, median: 8, q3: 16 });
    // n = 4: Q1 at h = 1.75 → 10 + 0.75·(20 − 10) = 17.5
    expect(quantile([10, 20, 40, 80], 0.25)).toBeCloseTo(17.5, 12);
  });

  it('the 0 and 1 quantiles are the minimum and the maximum, and a single value is every quantile', () => {
    expect(quantile([5, 3, 9], 0)).toBe(3);
    expect(quantile([5, 3, 9], 1)).toBe(9);
    expect(quartiles([42])).toEqual({ n: 1, q1: 42, median: 42, q3: 42 });
    expect(quantile([], 0.5)).toBeNaN();
  });

  it('a p outside 0..1 is refused', () => {
    expect(() => quantile([1, 2], 1.5)).toThrow(RangeError);
  });

  it('every quantile agrees with the definition computed independently with 1-based positions', () => {
    fc.assert(fc.property(
      fc.array(fc.double({ min: -1e6, max: 1e6, noNaN: true }), { minLength: 1, maxLength: 40 }),
      fc.double({ min: 0, max: 1, noNaN: true }),
      (xs, p) => {
        const x = [...xs].sort((a, b) => a - b);
        const h = (x.length - 1) * p + 1;
        const j = Math.floor(h);
        const expected = j >= x.length ? x[x.length - 1]! : x[j - 1]! + (h - j) * (x[j]! - x[j - 1]!);
        expect(quantileSorted(x, p)).toBeCloseTo(expected, 6);
      },
    ));
  });
});

describe('histogram bins against the limits', () => {
  it('the bins span both the values and the limits', () => {
    expect(binSpec({ min: 1, max: 9 }, { min: 2, max: 12 }, 10)).toEqual({ lo: 1, hi: 12, count: 10 });
    expect(binSpec({ min: 300, max: 310 }, { min: 100 }, 4)).toEqual({ lo: 100, hi: 310, count: 4 });
  });

  it('bins are numbered from 1 like width_bucket and the top edge falls in the last bin', () => {
    const spec = { lo: 0, hi: 10, count: 5 };
    expect([0, 1.99, 2, 9.99, 10].map((v) => binOf(spec, v))).toEqual([1, 1, 2, 5, 5]);
    expect(binEdges(spec, 2)).toEqual([2, 4]);
  });

  it('a single repeated value still gets a range of non-zero width', () => {
    const s = binSpec({ min: 5, max: 5 }, {}, 3);
    expect(s.hi).toBeGreaterThan(s.lo);
  });
});

describe('Debrief date filters', () => {
  it('a day that does not exist (30 February, month 99) is refused as input, not passed on to the date arithmetic', async () => {
    const { diagnosisListQuerySchema, analyticsQuerySchema } = await import('@shared/stats/debrief-schema');
    for (const to of ['2026-02-30', '9999-99-99', '2026-13-01', '2026-00-10']) {
      expect(diagnosisListQuerySchema.safeParse({ to }).success, to).toBe(false);
      expect(analyticsQuerySchema.safeParse({ procedureId: '00000000-0000-4000-8000-000000000000', from: to }).success, to).toBe(false);
    }
    // 2028 is a leap year (Gregorian calendar rule): 29 February exists
    expect(diagnosisListQuerySchema.safeParse({ from: '2028-02-29', to: '2026-11-30' }).success).toBe(true);
  });
});
