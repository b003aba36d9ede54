import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { formatReading, parseReading, QUANTITIES, QUANTITY_INFO, roundToSignificant, type Quantity } from '@shared/measure';

function value(text: string, q: Quantity, unit?: string): number {
  const r = parseReading(text, q, unit);
  if (!r.ok) throw new Error(`${text}: ${r.error.message}`);
  return r.reading.value;
}
const close = (a: number, b: number) => expect(a).toBeCloseTo(b, 12 - Math.max(0, Math.floor(Math.log10(Math.abs(b) || 1))));

describe('IEC 60062:2016 letter-and-digit codes', () => {
  it.each([
    ['R47', 0.47], ['4R7', 4.7], ['4K7', 4700], ['2M2', 2.2e6], ['680R', 680], ['2k1', 2100], ['1G0', 1e9],
  ])('reads the resistor code %s as %d Ω (IEC 60062 worked values)', (text, ohms) => {
    close(value(text, 'resistance'), ohms);
  });

  it.each([['4n7', 4.7e-9], ['3u3', 3.3e-6], ['3µ3', 3.3e-6], ['1p5', 1.5e-12], ['15n', 15e-9]])(
    'reads the capacitor code %s as %d F (IEC 60062)', (text, farads) => close(value(text, 'capacitance'), farads),
  );

  it.each([['4L7', 0.0047], ['L47', 0.00047], ['4L7Ω', 0.0047]])(
    'reads the milliohm code %s as %d Ω (IEC 60062:2016 RKM code, L = mΩ)', (text, ohms) => {
      const r = parseReading(text, 'resistance');
      expect(r.ok).toBe(true);
      close(value(text, 'resistance'), ohms);
    },
  );

  it('keeps the two significant figures of 4L7 (IEC 60062)', () => {
    const r = parseReading('4L7', 'resistance');
    expect(r.ok && r.reading.significantDigits).toBe(2);
  });

  it('keeps L a resistance letter only: 4L7 for a capacitor is refused with a suggestion (IEC 60062)', () => {
    const r = parseReading('4L7', 'capacitance');
    expect(r.ok).toBe(false);
  });

  it('tells m (milli) from M (mega), as IEC 60062 and the SI Brochure do', () => {
    close(value('2m2', 'resistance'), 0.0022);
    close(value('2M2', 'resistance'), 2.2e6);
  });

  it('refuses M for a capacitor instead of guessing micro, and says to type u or µ', () => {
    const r = parseReading('3M3', 'capacitance');
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.error.code).toBe('ambiguous-unit');
      expect(r.error.suggestion).toMatch(/u or µ/);
    }
  });

  it('keeps the entered precision of a code: 4K7 has two significant figures', () => {
    const r = parseReading('4K7', 'resistance');
    expect(r.ok && r.reading.significantDigits).toBe(2);
    expect(r.ok && r.reading.understood).toBe('4.7 kΩ');
  });
});

describe('SI Brochure (9th ed., 2019) §3 prefixes and unit symbols', () => {
  it('reads 4.7 kΩ as 4 700 Ω and 330 mV as 0.33 V (SI Brochure worked values)', () => {
    close(value('4.7 kΩ', 'resistance'), 4700);
    close(value('330 mV', 'dc-voltage'), 0.33);
  });

  it('accepts µ as U+00B5 and U+03BC, and Ω as U+2126 and U+03A9 (SI Brochure symbols)', () => {
    close(value('3.3 \u00B5F', 'capacitance'), 3.3e-6);
    close(value('3.3 \u03BCF', 'capacitance'), 3.3e-6);
    close(value('4.7 k\u2126', 'resistance'), 4700);
    close(value('4.7 k\u03A9', 'resistance'), 4700);
  });

  it('refuses combined prefixes, which the SI Brochure forbids', () => {
    const r = parseReading('1 kkΩ', 'resistance');
    expect(!r.ok && r.error.code).toBe('combined-prefixes');
    expect(parseReading('1 mµF', 'capacitance').ok).toBe(false);
  });

  it('accepts digits grouped in threes by a space (SI Brochure §5.4.4)', () => {
    close(value('20 000 Ω', 'resistance'), 20000);
  });
});

describe('what a technician types', () => {
  it.each<[string, Quantity, string | undefined, number]>([
    ['0.4', 'resistance', 'Ω', 0.4],
    ['0,4', 'resistance', 'Ω', 0.4],
    ['0.4', 'resistance', 'kΩ', 400],
    ['2.1k', 'resistance', 'Ω', 2100],
    ['4.7 kohm', 'resistance', undefined, 4700],
    ['12 ohms', 'resistance', undefined, 12],
    ['4.7 meg', 'resistance', undefined, 4.7e6],
    ['200 V', 'peak-voltage', 'V', 200],
    ['180 Vpk', 'peak-voltage', 'V', 180],
    ['3V3', 'dc-voltage', 'V', 3.3],
    ['0.55 mm', 'length', 'mm', 0.00055],
    ['0,55', 'length', 'mm', 0.00055],
    ['25 °C', 'temperature', '°C', 25],
    ['-5', 'temperature', '°C', -5],
    ['−5 °C', 'temperature', '°C', -5],
    ['1500 rpm', 'speed', 'rpm', 1500],
    ['20 mA', 'current', 'A', 0.02],
    ['2.5 ms', 'time', 's', 0.0025],
    ['50 %', 'ratio', '', 0.5],
    ['1e3', 'resistance', 'Ω', 1000],
  ])('reads "%s" as a %s (step unit %s) of %d in base units', (text, q, unit, expected) => {
    close(value(text, q, unit), expected);
  });

  it('keeps the reading exactly as typed beside its base value', () => {
    const r = parseReading(' 0,55 ', 'length', 'mm');
    expect(r.ok && r.reading.text).toBe(' 0,55 ');
  });

  it('refuses "1,200" instead of guessing thousands or a decimal comma, and offers both', () => {
    const r = parseReading('1,200', 'resistance', 'Ω');
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.error.code).toBe('ambiguous-number');
      expect(r.error.suggestion).toContain('1.200');
      expect(r.error.suggestion).toContain('1200');
    }
  });

  it('refuses "mohm" because shops use it for both milliohms and megohms', () => {
    const r = parseReading('4.7 mohm', 'resistance');
    expect(!r.ok && r.error.code).toBe('ambiguous-unit');
    expect(!r.ok && r.error.understood).toBe('the number 4.7');
  });

  it('says which quantity a unit belongs to when the meter was on the wrong range', () => {
    const r = parseReading('200 V', 'resistance');
    expect(!r.ok && r.error.code).toBe('wrong-quantity');
    expect(!r.ok && r.error.message).toMatch(/voltage/);
  });

  it('refuses a negative resistance and an empty entry with a sentence saying what to do', () => {
    const neg = parseReading('-3', 'resistance', 'Ω');
    expect(!neg.ok && neg.error.code).toBe('negative');
    const empty = parseReading('  ', 'resistance', 'Ω');
    expect(!empty.ok && empty.error.suggestion).toMatch(/Type the reading/);
  });

  it('refuses an unknown unit, saying what was understood and what to type', () => {
    const r = parseReading('5 X', 'resistance');
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.error.code).toBe('unknown-unit');
      expect(r.error.understood).toBe('the number 5');
      expect(r.error.suggestion).toMatch(/4K7/);
    }
  });

  it('refuses text that is not a number', () => {
    expect(parseReading('open', 'resistance').ok).toBe(false);
  });
});

describe('formatReading', () => {
  it('writes engineering notation with the entered significant figures', () => {
    expect(formatReading({ value: 4700, quantity: 'resistance', significantDigits: 2 })).toBe('4.7 kΩ');
    expect(formatReading({ value: 0.4, quantity: 'resistance', significantDigits: 2 })).toBe('0.40 Ω');
    expect(formatReading({ value: 4.7e-9, quantity: 'capacitance', significantDigits: 2 })).toBe('4.7 nF');
    expect(formatReading({ value: 0.02, quantity: 'energy', significantDigits: 2 })).toBe('20 mJ');
  });

  it('moves to the next prefix when rounding carries over (999.96 Ω to 4 figures is 1.000 kΩ)', () => {
    expect(formatReading({ value: 999.96, quantity: 'resistance', significantDigits: 4 })).toBe('1.000 kΩ');
  });

  it('shows a plug gap in the step unit (mm), not in µm', () => {
    expect(formatReading({ value: 0.00055, quantity: 'length', significantDigits: 2 })).toBe('0.55 mm');
    expect(formatReading({ value: 0.00055, quantity: 'length' }, { unit: 'mm' })).toBe('0.550 mm');
  });

  it('round-trips: parsing what was formatted gives the value rounded to the shown precision (property)', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(...QUANTITIES),
        fc.double({ min: -12, max: 12, noNaN: true }),
        fc.integer({ min: 1, max: 6 }),
        fc.boolean(),
        (q, exp, digits, negative) => {
          const sign = negative && QUANTITY_INFO[q].allowNegative ? -1 : 1;
          const v = sign * 10 ** exp;
          const text = formatReading({ value: v, quantity: q, significantDigits: digits });
          const back = parseReading(text, q);
          if (!back.ok) throw new Error(`${text}: ${back.error.message}`);
          const expected = roundToSignificant(v, digits);
          expect(Math.abs(back.reading.value - expected)).toBeLessThanOrEqual(Math.abs(expected) * 1e-9);
        },
      ),
      { numRuns: 2000 },
    );
  });

  it('round-trips what a technician typed: format(parse(text)) parses to the same value (property)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 9999 }), fc.integer({ min: 0, max: 3 }), fc.constantFrom('', 'k', 'M'), (n, dp, prefix) => {
        const text = `${(n / 10 ** dp).toFixed(dp)}${prefix}`;
        const first = parseReading(text, 'resistance');
        if (!first.ok) throw new Error(first.error.message);
        const again = parseReading(formatReading(first.reading), 'resistance');
        expect(again.ok && again.reading.value).toBeCloseTo(first.reading.value, 6);
      }),
    );
  });
});
