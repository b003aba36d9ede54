import { describe, expect, it } from 'vitest';
import { E_SERIES, nearestPreferred } from '@shared/measure';

describe('IEC 60063:2015 preferred number series', () => {
  it('E6 is 1.0 1.5 2.2 3.3 4.7 6.8 (IEC 60063)', () => {
    expect(E_SERIES.E6).toEqual([1.0, 1.5, 2.2, 3.3, 4.7, 6.8]);
  });

  it('E12 adds 1.2 1.8 2.7 3.9 5.6 8.2 to E6 (IEC 60063)', () => {
    const added = E_SERIES.E12.filter((v) => !(E_SERIES.E6 as readonly number[]).includes(v));
    expect(added).toEqual([1.2, 1.8, 2.7, 3.9, 5.6, 8.2]);
  });

  it('E24 has 24 members and contains E12 (IEC 60063)', () => {
    expect(E_SERIES.E24).toHaveLength(24);
    for (const v of E_SERIES.E12) expect(E_SERIES.E24).toContain(v);
  });

  it('the published tables differ from rounding 10^(i/n) at 2.7, 3.3, 4.7 and 8.2 (why they are tables)', () => {
    const computed = Array.from({ length: 12 }, (_, i) => Number((10 ** (i / 12)).toFixed(1)));
    const differ = E_SERIES.E12.filter((v, i) => v !== computed[i]);
    expect(differ).toEqual(expect.arrayContaining([2.7, 3.3, 4.7, 8.2]));
  });

  it('finds the nearest preferred value across decades', () => {
    expect(nearestPreferred(4600, 'E12')?.value).toBe(4700);
    expect(nearestPreferred(9.6, 'E12')?.value).toBe(10);
    expect(nearestPreferred(0.00047, 'E6')?.value).toBe(0.00047);
    expect(nearestPreferred(1.27, 'E12')?.value).toBe(1.2);
    expect(nearestPreferred(-1, 'E12')).toBeNull();
  });
});
