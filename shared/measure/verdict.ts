import type { Band, BorderlineAction, DecisionRule, Limits, MeterSpec } from '../schema/procedure';
import { bandFor } from './bands';
import type { Measured, Quantity } from './quantities';

/** IEC 60028 (International Annealed Copper Standard): temperature coefficient of copper at 20 °C, per °C. */
export const COPPER_ALPHA_20 = 0.00393;

/**
 * The resistance a copper winding reading `ohms` at `at` °C would read at `to` °C:
 * R_t = R20·(1 + α20·(t − 20)). Copper windings only, never carbon resistors.
 * Example: `copperResistanceAt(0.5, 30, 20)` is 0.48109 (Ω at 20 °C).
 */
export function copperResistanceAt(ohms: number, at: number, to = 20): number {
  return (ohms * (1 + COPPER_ALPHA_20 * (to - 20))) / (1 + COPPER_ALPHA_20 * (at - 20));
}

/** The uncertainty a meter spec gives a reading (JCGM 100:2008 §4.3.7, rectangular distribution). */
export interface MeterUncertainty {
  /** Half-width a of the ± bound: |reading|·% + counts·resolution. */
  readonly halfWidth: number;
  /** Standard uncertainty u = a/√3. */
  readonly standard: number;
  /** Expanded uncertainty U = k·u with k = 2. */
  readonly expanded: number;
}

/**
 * Uncertainty of a reading from a meter spec ±(% of reading + counts).
 * Example: 100.0 Ω at ±(0.9 % + 2 counts), 0.1 Ω resolution → a = 1.1, u = 0.635, U = 1.270.
 */
export function meterUncertainty(reading: number, meter: MeterSpec): MeterUncertainty {
  const halfWidth = (Math.abs(reading) * meter.percentOfReading) / 100 + meter.counts * meter.resolution;
  const standard = halfWidth / Math.sqrt(3);
  return { halfWidth, standard, expanded: 2 * standard };
}

/** Limits as a closed range; a nominal ± % becomes its two ends. */
export function resolveLimits(limits: Limits): { min?: number; max?: number } {
  if (limits.kind === 'range') return { ...(limits.min === undefined ? {} : { min: limits.min }), ...(limits.max === undefined ? {} : { max: limits.max }) };
  const d = Math.abs(limits.nominal * limits.tolerancePercent) / 100;
  return { min: limits.nominal - d, max: limits.nominal + d };
}

export type Verdict = 'within' | 'below' | 'above' | 'borderline-low' | 'borderline-high';
/** ILAC-G8:09/2019 §4.2.3 non-binary decision zones. */
export type Zone = 'pass' | 'conditional-pass' | 'conditional-fail' | 'fail';

export type Route =
  | { readonly kind: 'band'; readonly band: Band; readonly next: string }
  | { readonly kind: 'borderline-branch'; readonly next: string }
  | { readonly kind: 're-measure' }
  | { readonly kind: 'no-band' };

/**
 * The branch a route took as the record stores it (`band_id`): the band's id, `'borderline'` for
 * the author's borderline branch, null when the reading took no branch (re-measure, no band).
 * Example: recordedBranch({ kind: 'borderline-branch', next: 'capReplace' }) === 'borderline'
 */
export function recordedBranch(route: Route | undefined): string | null {
  if (route?.kind === 'band') return route.band.id;
  if (route?.kind === 'borderline-branch') return 'borderline';
  return null;
}

export interface DecideInput {
  /** The value as measured, in base units. */
  readonly value: number;
  readonly limits?: Limits | undefined;
  readonly meter?: MeterSpec | undefined;
  readonly rule?: DecisionRule | undefined;
  /** Test-lead null in Ω, subtracted from a resistance reading. */
  readonly leadResistance?: number | undefined;
  /** Copper winding: the temperature at measurement and the limits' reference temperature (°C). */
  readonly winding?: { readonly temperature: number; readonly referenceTemperature?: number | undefined } | undefined;
  readonly bands?: readonly Band[] | undefined;
  readonly borderline?: BorderlineAction | undefined;
  /** How many borderline readings were already re-measured at this step. */
  readonly remeasured?: number | undefined;
}

export interface ReadingDecision<Q extends Quantity = Quantity> {
  /** The value the decision used: after lead null and temperature correction. */
  readonly value: Measured<Q>;
  readonly measured: Measured<Q>;
  /** Null when the step has no limits (a lint error for Readings). */
  readonly verdict: Verdict | null;
  readonly zone: Zone | null;
  /** value ± U; null without a meter spec. */
  readonly interval: { readonly low: number; readonly high: number } | null;
  readonly uncertainty: MeterUncertainty | null;
  readonly limits: { readonly min?: number; readonly max?: number };
  readonly route: Route;
  readonly corrections: { readonly leadNull?: number; readonly temperatureFactor?: number };
}

function combinedUncertainty(input: DecideInput, factor: number): MeterUncertainty | null {
  if (!input.meter) return null;
  const r = meterUncertainty(input.value, input.meter);
  // The lead reading comes from the same meter; independent errors add in quadrature.
  const l = input.leadResistance === undefined ? null : meterUncertainty(input.leadResistance, input.meter);
  const a = l ? Math.hypot(r.halfWidth, l.halfWidth) : r.halfWidth;
  const u = l ? Math.hypot(r.standard, l.standard) : r.standard;
  return { halfWidth: a * factor, standard: u * factor, expanded: 2 * u * factor };
}

/** Verdict and zone for a value with expanded uncertainty U against limits. */
export function classify(value: number, limits: { min?: number; max?: number }, U: number, rule: DecisionRule): { verdict: Verdict; zone: Zone } {
  const { min, max } = limits;
  const guard = rule === 'guarded' ? U : 0;
  if (min !== undefined && value < min) {
    return guard > 0 && value + guard >= min ? { verdict: 'borderline-low', zone: 'conditional-fail' } : { verdict: 'below', zone: 'fail' };
  }
  if (max !== undefined && value > max) {
    return guard > 0 && value - guard <= max ? { verdict: 'borderline-high', zone: 'conditional-fail' } : { verdict: 'above', zone: 'fail' };
  }
  const nearLow = min !== undefined && value - guard < min;
  const nearHigh = max !== undefined && value + guard > max;
  if (!nearLow && !nearHigh) return { verdict: 'within', zone: 'pass' };
  const low = nearLow && (!nearHigh || value - min! <= max! - value);
  return { verdict: low ? 'borderline-low' : 'borderline-high', zone: 'conditional-pass' };
}

function route(input: DecideInput, value: number, verdict: Verdict | null): Route {
  const borderline = verdict === 'borderline-low' || verdict === 'borderline-high';
  const action = input.borderline ?? { action: 're-measure', attempts: 1 };
  if (borderline && action.action === 'branch') return { kind: 'borderline-branch', next: action.next };
  if (borderline && action.action === 're-measure' && (input.remeasured ?? 0) < action.attempts) return { kind: 're-measure' };
  // After the allowed re-measurements the measured value itself picks the band.
  const band = bandFor(input.bands ?? [], value);
  return band ? { kind: 'band', band, next: band.next } : { kind: 'no-band' };
}

/**
 * Decides a reading against limits with the meter's uncertainty (JCGM 106:2012; ILAC-G8 §4.2).
 * Example: limits 100–200 Ω, meter ±(0.9 % + 2 counts) at 0.1 Ω, guarded rule: 199.0 Ω →
 * `{ verdict: 'borderline-high', zone: 'conditional-pass', interval: { low: 196.70, high: 201.30 } }`.
 */
export function decideReading<Q extends Quantity = Quantity>(input: DecideInput): ReadingDecision<Q> {
  const nulled = input.value - (input.leadResistance ?? 0);
  const factor = input.winding ? copperResistanceAt(1, input.winding.temperature, input.winding.referenceTemperature ?? 20) : 1;
  const value = nulled * factor;
  const uncertainty = combinedUncertainty(input, factor);
  const limits = input.limits ? resolveLimits(input.limits) : {};
  const decided = input.limits ? classify(value, limits, uncertainty?.expanded ?? 0, input.rule ?? 'simple') : null;
  const U = uncertainty?.expanded;
  return {
    value: value as Measured<Q>,
    measured: input.value as Measured<Q>,
    verdict: decided?.verdict ?? null,
    zone: decided?.zone ?? null,
    interval: U === undefined ? null : { low: value - U, high: value + U },
    uncertainty,
    limits,
    route: route(input, value, decided?.verdict ?? null),
    corrections: {
      ...(input.leadResistance === undefined ? {} : { leadNull: input.leadResistance }),
      ...(input.winding ? { temperatureFactor: factor } : {}),
    },
  };
}

/**
 * The limit that the meter's uncertainty interval straddles while the reading alone decided the
 * verdict (simple acceptance, ILAC-G8:09/2019 §4.2.1), or null. The screen then says why the
 * verdict stands and offers a re-measure. Example: limits 4–6 kΩ, 5.95 kΩ read ± 0.057 kΩ → 6000.
 */
export function limitCrossedBy(d: Pick<ReadingDecision, 'interval' | 'verdict' | 'limits'>): number | null {
  if (!d.interval || d.verdict === null || d.verdict === 'borderline-low' || d.verdict === 'borderline-high') return null;
  for (const limit of [d.limits.min, d.limits.max]) {
    if (limit !== undefined && d.interval.low < limit && d.interval.high > limit) return limit;
  }
  return null;
}
