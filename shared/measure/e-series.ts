/**
 * IEC 60063:2015 preferred number series, kept as the published tables: computing
 * round(10^(i/n)) gives wrong members (2.7, 3.3, 4.7, 8.2 among them), so never derive them.
 */
export const E_SERIES = {
  E6: [1.0, 1.5, 2.2, 3.3, 4.7, 6.8],
  E12: [1.0, 1.2, 1.5, 1.8, 2.2, 2.7, 3.3, 3.9, 4.7, 5.6, 6.8, 8.2],
  E24: [
    1.0, 1.1, 1.2, 1.3, 1.5, 1.6, 1.8, 2.0, 2.2, 2.4, 2.7, 3.0,
    3.3, 3.6, 3.9, 4.3, 4.7, 5.1, 5.6, 6.2, 6.8, 7.5, 8.2, 9.1,
  ],
} as const;

export type ESeriesName = keyof typeof E_SERIES;

export interface PreferredValue {
  /** The nearest member of the series, scaled to the value's decade. */
  readonly value: number;
  readonly series: ESeriesName;
  /** (value − preferred) / preferred, in percent. */
  readonly deviationPercent: number;
}

/**
 * The nearest preferred value on a logarithmic scale (how tolerance bands are laid out).
 * Example: `nearestPreferred(4600, 'E12')` → `{ value: 4700, deviationPercent: -2.13, ... }`.
 */
export function nearestPreferred(value: number, series: ESeriesName): PreferredValue | null {
  if (!(value > 0) || !Number.isFinite(value)) return null;
  const decade = Math.floor(Math.log10(value));
  let best = 0;
  let bestDistance = Infinity;
  for (const d of [decade - 1, decade, decade + 1]) {
    for (const member of E_SERIES[series]) {
      // Rounding to 12 significant figures keeps 4.7 × 1000 from reading 4700.000000000001.
      const candidate = Number((member * 10 ** d).toPrecision(12));
      const distance = Math.abs(Math.log(value / candidate));
      if (distance < bestDistance) [best, bestDistance] = [candidate, distance];
    }
  }
  return { value: best, series, deviationPercent: ((value - best) / best) * 100 };
}
