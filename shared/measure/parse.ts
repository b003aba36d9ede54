import { QUANTITY_INFO, unitFactor, type Measured, type Quantity } from './quantities';
import { CODE_LETTERS, lookupSuffix, normaliseSymbols } from './unit-words';
import { formatReading } from './format';

/** A reading as typed and as a value in the quantity's base unit. */
export interface Reading<Q extends Quantity = Quantity> {
  /** Exactly what the technician typed. */
  readonly text: string;
  readonly quantity: Q;
  /** The value in the base unit (Ω, V, F, A, °C, m, s, rpm, J). */
  readonly value: Measured<Q>;
  /** Significant digits the technician entered; formatting keeps this precision. */
  readonly significantDigits: number;
  /** The value as the app understood it, for the technician to confirm ("4.7 kΩ"). */
  readonly understood: string;
}

export type ReadingErrorCode =
  | 'empty'
  | 'too-long'
  | 'not-a-number'
  | 'ambiguous-number'
  | 'ambiguous-unit'
  | 'unknown-unit'
  | 'wrong-quantity'
  | 'combined-prefixes'
  | 'negative';

/** Why a reading was refused, what was understood, and what to type instead. */
export interface ReadingError {
  readonly code: ReadingErrorCode;
  readonly message: string;
  /** The part that was understood, if any ("the number 4.7"). */
  readonly understood?: string;
  /** What to type instead, e.g. "Type 4.7k, 4K7 or 4700 Ω". */
  readonly suggestion: string;
}

export type ParseReadingResult<Q extends Quantity = Quantity> =
  | { ok: true; reading: Reading<Q> }
  | { ok: false; error: ReadingError };

const EXAMPLES: Readonly<Record<Quantity, string>> = {
  resistance: '0.5, 4.7k, 4K7, R47 or 4700 Ω',
  'dc-voltage': '12.6 or 12.6 V',
  'ac-voltage': '14 or 14 V',
  'peak-voltage': '180 or 180 V',
  capacitance: '1 µF, 1u0, 470n or 4n7',
  current: '0.5 A or 20 mA',
  temperature: '25 or 25 °C',
  length: '0.6 or 0.6 mm',
  time: '2.5 ms or 1 s',
  speed: '1500 or 1500 rpm',
  energy: '20 mJ',
  ratio: '0.5 or 50 %',
};

// Digits may be grouped by spaces in threes (SI Brochure §5.4.4); the decimal sign is . or ,.
const NUMBER = /^([+-]?)((?:\d{1,3}(?: \d{3})+|\d+)(?:[.,]\d*)?|[.,]\d+)(?:[eE]([+-]?\d+))?\s*(.*)$/;

/** The longest reading accepted (after trimming), and the longest raw text looked at at all. */
export const MAX_READING_LENGTH = 64;
const MAX_RAW_LENGTH = 256;

interface NumberPart {
  sign: number;
  mantissa: string; // digits with a '.' decimal point
  exponent: number;
  rest: string;
}

function fail(code: ReadingErrorCode, message: string, suggestion: string, understood?: string): ParseReadingResult<never> {
  return { ok: false, error: understood === undefined ? { code, message, suggestion } : { code, message, suggestion, understood } };
}

function significantDigits(digits: string): number {
  const d = digits.replace(/[^0-9]/g, '').replace(/^0+/, '');
  return Math.max(1, d.length);
}

/** Reads the number; refuses `1,200` (thousands or decimal?) instead of guessing. */
function readNumber(text: string, q: Quantity): NumberPart | ParseReadingResult<never> {
  const m = NUMBER.exec(text);
  if (!m) return fail('not-a-number', `"${text}" does not start with a number.`, `Type a number, e.g. ${EXAMPLES[q]}.`);
  const [, sign, body = '', exp, rest = ''] = m;
  const compact = body.replace(/ /g, '');
  const seps = compact.match(/[.,]/g) ?? [];
  if (seps.length > 1) {
    return fail('ambiguous-number', `"${body}" has more than one decimal sign.`, 'Type the number without thousands separators, e.g. 1200.5.');
  }
  // "1,200" could be 1.2 (decimal comma) or 1200 (thousands): ask rather than guess.
  if (/^[1-9]\d{0,2},\d{3}$/.test(compact)) {
    const [int, frac] = compact.split(',');
    return fail(
      'ambiguous-number',
      `"${compact}" could be ${int}.${frac} or ${int}${frac}.`,
      `Type ${int}.${frac} for a decimal or ${int}${frac} for a whole number.`,
    );
  }
  // No reading needs an exponent past a few hundred; 1e999999 is a typing slip, not a value.
  if (exp && Math.abs(Number(exp)) > 300) {
    return fail('not-a-number', `The exponent in "${body}e${exp.length > 6 ? `${exp.slice(0, 6)}…` : exp}" is far outside any reading.`, `Type the value with a prefix instead, e.g. ${EXAMPLES[q]}.`);
  }
  return { sign: sign === '-' ? -1 : 1, mantissa: compact.replace(',', '.'), exponent: exp ? Number(exp) : 0, rest: rest.replace(/\s+/g, '') };
}

/** IEC 60062 code: a letter in the place of the decimal point (4K7, R47, 2M2, 4n7, 3u3). */
function readCode(text: string, q: Quantity): { digits: string; factor?: number; letter: string; unit: string } | null {
  const m = /^(\d*)([A-DF-Za-df-zµΩ])(\d+)(.*)$/.exec(text.replace(/\s+/g, ''));
  if (!m) return null;
  const [, int = '', letter = '', frac = '', unit = ''] = m;
  const factor = CODE_LETTERS[q]?.[letter];
  return { digits: `${int || '0'}.${frac}`, letter, unit, ...(factor === undefined ? {} : { factor }) };
}

function unitProblem(q: Quantity, suffix: string, understood: string): ParseReadingResult<never> | { factor: number } {
  const r = lookupSuffix(q, suffix);
  if (r.ok) return { factor: r.meaning.factor };
  const label = QUANTITY_INFO[q].label;
  switch (r.reason) {
    case 'ambiguous':
      return fail('ambiguous-unit', `"${suffix}" is ambiguous here.`, `${r.hint[0]!.toUpperCase()}${r.hint.slice(1)}.`, understood);
    case 'combined-prefixes':
      return fail('combined-prefixes', `"${suffix}" stacks two prefixes; prefixes do not combine.`, `Use one prefix, e.g. ${EXAMPLES[q]}.`, understood);
    case 'other-quantity':
      return fail(
        'wrong-quantity',
        `"${suffix}" is a unit of ${QUANTITY_INFO[r.quantity].label}, but this step measures ${label}.`,
        `Check the meter's function switch, then type the ${label}, e.g. ${EXAMPLES[q]}.`,
        understood,
      );
    case 'unknown':
      return fail('unknown-unit', `"${suffix}" is not a unit of ${label} that Sparkwright knows.`, `Type e.g. ${EXAMPLES[q]}.`, understood);
  }
}

function finish<Q extends Quantity>(text: string, q: Q, value: number, digits: string): ParseReadingResult<Q> {
  const info = QUANTITY_INFO[q];
  if (!Number.isFinite(value)) return fail('not-a-number', `"${text}" is too large to be a reading.`, `Type e.g. ${EXAMPLES[q]}.`);
  if (value < 0 && !info.allowNegative) {
    return fail('negative', `A ${info.label} cannot be negative.`, 'Check the meter leads and type the value without a minus sign.');
  }
  const significant = significantDigits(digits);
  const reading = { text, quantity: q, value: value as Measured<Q>, significantDigits: significant, understood: '' };
  return { ok: true, reading: { ...reading, understood: formatReading(reading) } };
}

/**
 * Parses what a technician typed for a quantity. A bare number means the step's `unit`.
 * Never guesses: ambiguous input returns an error saying what to type instead.
 *
 * Example: `parseReading('4K7', 'resistance')` → `{ ok: true, reading: { value: 4700, understood: '4.7 kΩ', ... } }`;
 * `parseReading('0,55', 'length', 'mm')` → value 0.00055 (m).
 */
export function parseReading<Q extends Quantity>(text: string, quantity: Q, unit?: string): ParseReadingResult<Q> {
  // Length first, so that no work below grows with what was pasted in.
  const tooLong = () => fail('too-long', `That is too long for a reading (at most ${MAX_READING_LENGTH} characters).`, `Type just the value, e.g. ${EXAMPLES[quantity]}.`);
  if (text.length > MAX_RAW_LENGTH) return tooLong();
  const input = normaliseSymbols(text).trim();
  if (input === '') return fail('empty', 'Nothing was typed.', `Type the reading, e.g. ${EXAMPLES[quantity]}.`);
  if (input.length > MAX_READING_LENGTH) return tooLong();

  const code = readCode(input, quantity);
  if (code && code.factor === undefined) {
    const letter = unitProblem(quantity, code.letter, `the digits ${code.digits.replace(/^0\./, '.')}`);
    if ('ok' in letter) return letter;
    return fail('unknown-unit', `"${input}" is not a value code for ${QUANTITY_INFO[quantity].label}.`, `Type e.g. ${EXAMPLES[quantity]}.`);
  }
  if (code && code.factor !== undefined) {
    const base = code.unit === '' ? { factor: 1 } : unitProblem(quantity, code.unit, `the code ${input}`);
    if ('ok' in base) return base;
    // A trailing unit after a code may only be the bare unit (4K7Ω, 4n7F), never a second prefix.
    if (base.factor !== 1) return fail('combined-prefixes', `"${input}" has a prefix in the code and another in the unit.`, `Type e.g. ${EXAMPLES[quantity]}.`);
    return finish(text, quantity, Number((Number(code.digits) * code.factor).toPrecision(15)), code.digits);
  }

  const num = readNumber(input, quantity);
  if ('ok' in num) return num;
  const understood = `the number ${num.sign < 0 ? '-' : ''}${num.mantissa}`;
  let factor = unitFactor(quantity, unit);
  if (num.rest !== '') {
    const u = unitProblem(quantity, num.rest, understood);
    if ('ok' in u) return u;
    factor = u.factor;
  }
  const value = num.sign * Number(num.mantissa) * 10 ** num.exponent * factor;
  // Rounding noise from the factor (0.1 * 1e-3) would make 0.1 mm read as 0.00010000000000000002 m.
  return finish(text, quantity, Number(value.toPrecision(15)), num.mantissa);
}
