import type { Limits } from '../schema/procedure';
import { formatLimit } from '../measure/format';
import type { Quantity } from '../measure/quantities';
import { resolveLimits } from '../measure/verdict';

/** Limits as the technician sees them, in the step's display unit. */
export interface LimitsView {
  readonly min?: string;
  readonly max?: string;
  /** "0.2 – 1 Ω", "at least 150 V", "5 kΩ ± 20 % (4 – 6 kΩ)". */
  readonly text: string;
}

/** Limits in display units. Example: range 0.2–1 Ω → `{ min: '0.2 Ω', max: '1 Ω', text: '0.2 – 1 Ω' }`. */
export function limitsView(limits: Limits, quantity: Quantity, unit: string): LimitsView {
  const { min, max } = resolveLimits(limits);
  const f = (v: number) => formatLimit(v, quantity, unit);
  const bare = (v: number) => f(v).replace(` ${unit}`, '');
  const ends = { ...(min === undefined ? {} : { min: f(min) }), ...(max === undefined ? {} : { max: f(max) }) };
  let text: string;
  if (min !== undefined && max !== undefined) text = `${bare(min)} – ${f(max)}`;
  else if (min !== undefined) text = `at least ${f(min)}`;
  else text = `at most ${f(max!)}`;
  if (limits.kind === 'nominal') text = `${f(limits.nominal)} ± ${limits.tolerancePercent} % (${text})`;
  return { ...ends, text };
}
