import { QUANTITY_INFO, unitFactor, type Quantity } from './quantities';

/** Prefixes used when showing values in engineering notation, per quantity (exponent → symbol). */
const ENGINEERING: Readonly<Partial<Record<Quantity, readonly (readonly [number, string])[]>>> = {
  // Below 1 Ω the trade reads ohms (0.40 Ω), not milliohms.
  resistance: [[0, ''], [3, 'k'], [6, 'M'], [9, 'G']],
  'dc-voltage': [[-6, 'µ'], [-3, 'm'], [0, ''], [3, 'k']],
  'ac-voltage': [[-6, 'µ'], [-3, 'm'], [0, ''], [3, 'k']],
  'peak-voltage': [[-6, 'µ'], [-3, 'm'], [0, ''], [3, 'k']],
  capacitance: [[-12, 'p'], [-9, 'n'], [-6, 'µ'], [-3, 'm'], [0, '']],
  current: [[-6, 'µ'], [-3, 'm'], [0, ''], [3, 'k']],
  time: [[-9, 'n'], [-6, 'µ'], [-3, 'm'], [0, '']],
  energy: [[-6, 'µ'], [-3, 'm'], [0, ''], [3, 'k']],
};

/** Rounds to `digits` significant figures. Example: `roundToSignificant(4712, 2)` is 4700. */
export function roundToSignificant(value: number, digits: number): number {
  if (value === 0 || !Number.isFinite(value)) return value;
  return Number(value.toPrecision(Math.min(Math.max(1, Math.round(digits)), 17)));
}

/**
 * Writes a number with `digits` significant figures without exponent notation where practical.
 * Example: `formatSignificant(0.4, 2)` is "0.40"; `formatSignificant(4700, 2)` is "4700".
 */
export function formatSignificant(value: number, digits: number): string {
  const d = Math.min(Math.max(1, Math.round(digits)), 17);
  const rounded = roundToSignificant(value, d);
  if (rounded === 0) return d > 1 ? (0).toFixed(d - 1) : '0';
  const magnitude = Math.floor(Math.log10(Math.abs(rounded)));
  const decimals = d - 1 - magnitude;
  if (decimals > 20 || magnitude > 20) return rounded.toExponential(d - 1);
  return rounded.toFixed(Math.max(0, decimals));
}

function withUnit(number: string, unit: string): string {
  return unit === '' ? number : `${number} ${unit}`;
}

/** Picks the engineering prefix for a (rounded) value: the exponent is a multiple of 3 within range. */
function engineeringPrefix(q: Quantity, value: number): readonly [number, string] {
  const table = ENGINEERING[q] ?? [[0, '']];
  if (value === 0) return table.find(([e]) => e === 0) ?? table[0]!;
  const e = Math.floor(Math.log10(Math.abs(value)) / 3) * 3;
  let pick = table[0]!;
  for (const entry of table) if (entry[0] <= e) pick = entry;
  return pick;
}

export interface FormatOptions {
  /** Show in this display unit (e.g. the step's `mm`) instead of engineering notation. */
  unit?: string;
  /** Significant figures; defaults to the reading's own, or 3. */
  significantDigits?: number;
}

/**
 * Formats a value in base units for a person, keeping the entered precision.
 * Example: `formatReading({ value: 4700, quantity: 'resistance', significantDigits: 2 })` is "4.7 kΩ";
 * `formatReading({ value: 0.00055, quantity: 'length' }, { unit: 'mm' })` is "0.550 mm".
 */
export function formatReading(
  reading: { readonly value: number; readonly quantity: Quantity; readonly significantDigits?: number },
  options: FormatOptions = {},
): string {
  const info = QUANTITY_INFO[reading.quantity];
  const digits = options.significantDigits ?? reading.significantDigits ?? 3;
  const rounded = roundToSignificant(reading.value, digits);
  if (options.unit !== undefined || !info.engineering) {
    const unit = options.unit ?? info.defaultUnit;
    return withUnit(formatSignificant(rounded / unitFactor(reading.quantity, unit), digits), unit);
  }
  const [exp, prefix] = engineeringPrefix(reading.quantity, rounded);
  return withUnit(formatSignificant(rounded / 10 ** exp, digits), prefix + info.base);
}

/**
 * Writes a limit an author set (no entered precision) in a display unit, without noise digits.
 * Example: `formatLimit(0.00055, 'length', 'mm')` is "0.55 mm".
 */
export function formatLimit(value: number, quantity: Quantity, unit?: string): string {
  const u = unit ?? QUANTITY_INFO[quantity].defaultUnit;
  return withUnit(String(Number((value / unitFactor(quantity, u)).toPrecision(6))), u);
}
