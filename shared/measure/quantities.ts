/**
 * The quantities a step can measure or compute, their base units and display units.
 *
 * Values are always stored in the quantity's base unit (Ω, V, F, A, °C, m, s, rpm, J, ratio 1);
 * a step's `unit` is only how the value is shown and what a bare number means.
 */

/** Quantities a technician can measure at a Reading step. */
export const READING_QUANTITIES = [
  'resistance',
  'dc-voltage',
  'ac-voltage',
  'peak-voltage',
  'capacitance',
  'current',
  'temperature',
  'length',
  'time',
  'speed',
] as const;

/** Quantities a Formula may also produce (stored energy, a plain ratio). */
export const QUANTITIES = [...READING_QUANTITIES, 'energy', 'ratio'] as const;

export type ReadingQuantity = (typeof READING_QUANTITIES)[number];
export type Quantity = (typeof QUANTITIES)[number];

declare const quantityBrand: unique symbol;
/**
 * A number in the base unit of quantity Q. Branded so that passing a voltage where a resistance
 * is expected is a compile error; create one with `measured(q, n)` or the helpers below.
 */
export type Measured<Q extends Quantity = Quantity> = number & { readonly [quantityBrand]: Q };

/** Brands a number already in the base unit of `quantity`. Example: `measured('resistance', 680)`. */
export function measured<Q extends Quantity>(_quantity: Q, value: number): Measured<Q> {
  return value as Measured<Q>;
}
export type Ohms = Measured<'resistance'>;
export type Farads = Measured<'capacitance'>;
export type Celsius = Measured<'temperature'>;
export type Volts = Measured<'dc-voltage' | 'ac-voltage' | 'peak-voltage'>;
export const ohms = (n: number): Ohms => n as Ohms;
export const farads = (n: number): Farads => n as Farads;
export const celsius = (n: number): Celsius => n as Celsius;

/** SI dimension exponents: kg, m, s, A, K, and rev (revolutions, kept apart so rpm stays rpm). */
export type Dimension = readonly [number, number, number, number, number, number];

export interface QuantityInfo {
  /** Symbol of the base unit in which values are stored. */
  readonly base: string;
  /** Words for a person: "resistance", "peak voltage". */
  readonly label: string;
  /** Display units an author may choose for a step, with the factor to the base unit. */
  readonly displayUnits: Readonly<Record<string, number>>;
  /** The display unit used when a step names none. */
  readonly defaultUnit: string;
  readonly dimension: Dimension;
  /** Whether a negative value makes physical sense for this quantity. */
  readonly allowNegative: boolean;
  /** Whether values are shown in engineering notation (4.7 kΩ) or always in the default unit. */
  readonly engineering: boolean;
}

const VOLT: Dimension = [1, 2, -3, -1, 0, 0];
const volts = { mV: 1e-3, V: 1, kV: 1e3 };

export const QUANTITY_INFO: Readonly<Record<Quantity, QuantityInfo>> = {
  resistance: {
    base: 'Ω', label: 'resistance', defaultUnit: 'Ω', allowNegative: false, engineering: true,
    displayUnits: { 'mΩ': 1e-3, 'Ω': 1, 'kΩ': 1e3, 'MΩ': 1e6 },
    dimension: [1, 2, -3, -2, 0, 0],
  },
  'dc-voltage': {
    base: 'V', label: 'DC voltage', defaultUnit: 'V', allowNegative: true, engineering: true,
    displayUnits: volts, dimension: VOLT,
  },
  'ac-voltage': {
    base: 'V', label: 'AC voltage', defaultUnit: 'V', allowNegative: false, engineering: true,
    displayUnits: volts, dimension: VOLT,
  },
  'peak-voltage': {
    base: 'V', label: 'peak voltage', defaultUnit: 'V', allowNegative: false, engineering: true,
    displayUnits: volts, dimension: VOLT,
  },
  capacitance: {
    base: 'F', label: 'capacitance', defaultUnit: 'µF', allowNegative: false, engineering: true,
    displayUnits: { pF: 1e-12, nF: 1e-9, 'µF': 1e-6, F: 1 },
    dimension: [-1, -2, 4, 2, 0, 0],
  },
  current: {
    base: 'A', label: 'current', defaultUnit: 'A', allowNegative: true, engineering: true,
    displayUnits: { 'µA': 1e-6, mA: 1e-3, A: 1 },
    dimension: [0, 0, 0, 1, 0, 0],
  },
  temperature: {
    base: '°C', label: 'temperature', defaultUnit: '°C', allowNegative: true, engineering: false,
    displayUnits: { '°C': 1 },
    dimension: [0, 0, 0, 0, 1, 0],
  },
  length: {
    base: 'm', label: 'length', defaultUnit: 'mm', allowNegative: false, engineering: false,
    displayUnits: { 'µm': 1e-6, mm: 1e-3, m: 1 },
    dimension: [0, 1, 0, 0, 0, 0],
  },
  time: {
    base: 's', label: 'time', defaultUnit: 's', allowNegative: false, engineering: true,
    displayUnits: { 'µs': 1e-6, ms: 1e-3, s: 1, min: 60 },
    dimension: [0, 0, 1, 0, 0, 0],
  },
  speed: {
    base: 'rpm', label: 'speed', defaultUnit: 'rpm', allowNegative: false, engineering: false,
    displayUnits: { rpm: 1 },
    dimension: [0, 0, -1, 0, 0, 1],
  },
  energy: {
    base: 'J', label: 'energy', defaultUnit: 'mJ', allowNegative: false, engineering: true,
    displayUnits: { 'µJ': 1e-6, mJ: 1e-3, J: 1 },
    dimension: [1, 2, -2, 0, 0, 0],
  },
  ratio: {
    base: '', label: 'ratio', defaultUnit: '', allowNegative: true, engineering: false,
    displayUnits: { '': 1, '%': 0.01 },
    dimension: [0, 0, 0, 0, 0, 0],
  },
};

/** True when `unit` is a display unit the quantity offers. */
export function isDisplayUnit(quantity: Quantity, unit: string): boolean {
  return Object.hasOwn(QUANTITY_INFO[quantity].displayUnits, unit);
}

/** Factor from a display unit to the base unit, e.g. `unitFactor('resistance', 'kΩ')` is 1000. */
export function unitFactor(quantity: Quantity, unit: string | undefined): number {
  const info = QUANTITY_INFO[quantity];
  return info.displayUnits[unit ?? info.defaultUnit] ?? 1;
}

/** Quantities with the same dimension as `dimension` (several voltages share one). */
export function quantitiesWithDimension(dimension: Dimension): Quantity[] {
  return QUANTITIES.filter((q) => sameDimension(QUANTITY_INFO[q].dimension, dimension));
}

export function sameDimension(a: Dimension, b: Dimension): boolean {
  return a.every((e, i) => Math.abs(e - (b[i] ?? 0)) < 1e-9);
}
