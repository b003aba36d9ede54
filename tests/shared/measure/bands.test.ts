import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { bandContains, checkBandCoverage, type End, type Interval } from '@shared/measure';

const end = (value: number, inclusive: boolean): End => ({ value, inclusive });

/** Brute-force oracle: count covering bands at every edge value and between and beyond them. */
function bruteForce(bands: Interval[]): { gap: boolean; overlap: boolean } {
  const edges = [...new Set(bands.flatMap((b) => [b.lower?.value, b.upper?.value]).filter((v): v is number => v !== undefined))].sort((a, b) => a - b);
  const points = edges.length === 0 ? [0] : [edges[0]! - 1, ...edges.flatMap((e, i) => [e, i + 1 < edges.length ? (e + edges[i + 1]!) / 2 : e + 1])];
  let gap = false;
  let overlap = false;
  for (const p of points) {
    const n = bands.filter((b) => bandContains(b, p)).length;
    if (n === 0) gap = true;
    if (n > 1) overlap = true;
  }
  return { gap, overlap };
}

const arbEnd = fc.record({ value: fc.integer({ min: -5, max: 5 }), inclusive: fc.boolean() });
const arbBand = fc.record({ lower: fc.option(arbEnd, { nil: undefined }), upper: fc.option(arbEnd, { nil: undefined }) });

describe('band coverage over the whole number line', () => {
  it('accepts the three usual bands below, within and above the limits', () => {
    const bands: Interval[] = [
      { id: 'low', upper: end(0.2, false) },
      { id: 'ok', lower: end(0.2, true), upper: end(1, true) },
      { id: 'high', lower: end(1, false) },
    ];
    expect(checkBandCoverage(bands)).toEqual([]);
  });

  it('finds a gap of a single point where two open ends meet', () => {
    const p = checkBandCoverage([{ id: 'a', upper: end(1, false) }, { id: 'b', lower: end(1, false) }]);
    expect(p).toEqual([{ kind: 'gap', lower: end(1, true), upper: end(1, true) }]);
  });

  it('finds an overlap of a single point where two closed ends meet', () => {
    const p = checkBandCoverage([{ id: 'a', upper: end(1, true) }, { id: 'b', lower: end(1, true) }]);
    expect(p).toMatchObject([{ kind: 'overlap', bands: ['a', 'b'] }]);
  });

  it('finds the gaps towards minus and plus infinity', () => {
    const p = checkBandCoverage([{ id: 'a', lower: end(0, true), upper: end(1, true) }]);
    expect(p.map((x) => x.kind)).toEqual(['gap', 'gap']);
  });

  it('reports a band that contains no value', () => {
    const p = checkBandCoverage([{ id: 'all' }, { id: 'none', lower: end(2, false), upper: end(2, true) }]);
    expect(p).toEqual([{ kind: 'empty', band: 'none' }]);
  });

  it('a partition cut at random points, with each cut closed on one side, always covers the line once (property)', () => {
    fc.assert(
      fc.property(
        fc.uniqueArray(fc.double({ min: -1e6, max: 1e6, noNaN: true }), { maxLength: 8 }),
        fc.array(fc.boolean(), { minLength: 8, maxLength: 8 }),
        fc.array(fc.nat(), { minLength: 9, maxLength: 9 }),
        (cuts, sides, order) => {
        const sorted = [...cuts].sort((a, b) => a - b);
        const bands: Interval[] = [];
        let lower: End | undefined;
        sorted.forEach((c, i) => {
          const closedBelow = sides[i]!;
          bands.push({ id: `b${i}`, lower, upper: end(c, closedBelow) });
          lower = end(c, !closedBelow);
        });
        bands.push({ id: 'last', lower });
        // The author may list bands in any order.
        const shuffled = bands.map((b, i) => [order[i]!, b] as const).sort((x, y) => x[0] - y[0]).map(([, b]) => b);
        expect(checkBandCoverage(shuffled)).toEqual([]);
      }),
    );
  });

  it('finds a gap or an overlap exactly when a brute-force count over sample points does (property)', () => {
    fc.assert(
      fc.property(fc.array(arbBand, { minLength: 1, maxLength: 6 }), (raw) => {
        const bands = raw.map((b, i) => ({ id: `b${i}`, ...b }));
        const live = bands.filter((b) => !checkBandCoverage([b]).some((p) => p.kind === 'empty'));
        const expected = bruteForce(live);
        const problems = checkBandCoverage(bands);
        expect(problems.some((p) => p.kind === 'gap')).toBe(expected.gap);
        expect(problems.some((p) => p.kind === 'overlap')).toBe(expected.overlap);
      }),
      { numRuns: 3000 },
    );
  });
});
