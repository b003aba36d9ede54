import { describe, it, expect, vi, beforeEach } from 'vitest';
import fc from 'fast-check';

// Count what the inner parsers are handed: the bound on work is the bound on their input, which a
// test can check on any machine (no wall time). The real functions still do the work.
const seen = vi.hoisted(() => ({ jsep: [] as number[], normalise: [] as number[] }));
vi.mock('jsep', async (importOriginal) => {
  const real = (await importOriginal<{ default: (text: string) => unknown }>()).default;
  return { default: Object.assign((text: string) => { seen.jsep.push(text.length); return real(text); }, real) };
});
vi.mock('../../../shared/measure/unit-words', async (importOriginal) => {
  const real = await importOriginal<typeof import('../../../shared/measure/unit-words')>();
  return { ...real, normaliseSymbols: (text: string) => { seen.normalise.push(text.length); return real.normaliseSymbols(text); } };
});

const { parseReading, MAX_READING_LENGTH } = await import('../../../shared/measure/parse');
const { evaluateFormula, parseFormula, MAX_FORMULA_LENGTH, MAX_FORMULA_DEPTH } = await import('../../../shared/measure/formula');

const TEN_THOUSAND_DIGITS = '9'.repeat(10_000);
const TEN_THOUSAND_PARENS = `${'('.repeat(10_000)}1${')'.repeat(10_000)}`;
const ohms = (value: number) => ({ value, quantity: 'resistance' as const });

beforeEach(() => { seen.jsep.length = 0; seen.normalise.length = 0; });

describe('pathological readings', () => {
  it('10 000 digits answer "too long" before any parsing looks at them', () => {
    const r = parseReading(TEN_THOUSAND_DIGITS, 'resistance');
    expect(r).toMatchObject({ ok: false, error: { code: 'too-long', message: expect.stringContaining(`${MAX_READING_LENGTH} characters`) } });
    expect(seen.normalise).toEqual([]);
  });

  it('10 000 nested parentheses answer "too long" the same way', () => {
    expect(parseReading(TEN_THOUSAND_PARENS, 'resistance')).toMatchObject({ ok: false, error: { code: 'too-long' } });
    expect(seen.normalise).toEqual([]);
  });

  it('1e999999 is refused for its exponent, not read as a unit "999" or as infinity', () => {
    const r = parseReading('1e999999', 'resistance');
    expect(r).toMatchObject({ ok: false, error: { code: 'not-a-number', message: expect.stringMatching(/exponent/) } });
    expect(parseReading('1e-999999', 'resistance')).toMatchObject({ ok: false, error: { code: 'not-a-number' } });
  });

  it('a reading padded with spaces up to the limit still parses', () => {
    expect(parseReading(`   ${'0'.repeat(MAX_READING_LENGTH - 4)}4K7   `, 'resistance')).toMatchObject({ ok: true, reading: { value: 4700 } });
  });

  it('whatever is pasted in, the parser looks at a bounded number of characters', () => {
    fc.assert(fc.property(fc.string({ maxLength: 20_000 }), fc.nat(20_000), (text, pad) => {
      const r = parseReading(text + ' '.repeat(pad), 'peak-voltage');
      expect(typeof (r.ok ? r.reading.understood : r.error.message)).toBe('string');
    }), { numRuns: 200 });
    expect(Math.max(0, ...seen.normalise)).toBeLessThanOrEqual(256);
  });
});

describe('pathological formulas', () => {
  it('10 000 digits answer "too long" without reaching the parser', () => {
    expect(evaluateFormula(TEN_THOUSAND_DIGITS, {})).toMatchObject({ ok: false, error: { code: 'too-long', message: expect.stringContaining(`${MAX_FORMULA_LENGTH} characters`) } });
    expect(seen.jsep).toEqual([]);
  });

  it('10 000 nested parentheses answer "too long", and 21 within the length "too deep", without reaching the parser', () => {
    expect(parseFormula(TEN_THOUSAND_PARENS)).toMatchObject({ ok: false, error: { code: 'too-long' } });
    const deep = `${'('.repeat(MAX_FORMULA_DEPTH + 1)}a${')'.repeat(MAX_FORMULA_DEPTH + 1)}`;
    expect(parseFormula(deep)).toMatchObject({ ok: false, error: { code: 'too-deep', message: expect.stringContaining(`${MAX_FORMULA_DEPTH} deep`) } });
    expect(seen.jsep).toEqual([]);
  });

  it('brackets nested to the limit still evaluate', () => {
    const atLimit = `${'('.repeat(MAX_FORMULA_DEPTH)}a${')'.repeat(MAX_FORMULA_DEPTH)} * 2`;
    expect(evaluateFormula(atLimit, { a: ohms(2350) })).toMatchObject({ ok: true, value: 4700, quantity: 'resistance' });
  });

  it('1e999999 is "too large", and 1e-999999 "too small", not infinity or zero', () => {
    expect(evaluateFormula('1e999999 * a', { a: ohms(1) })).toMatchObject({ ok: false, error: { code: 'math', message: expect.stringMatching(/1e999999 is too large/) } });
    expect(evaluateFormula('a + 1e-999999 * a', { a: ohms(1) })).toMatchObject({ ok: false, error: { code: 'math', message: expect.stringMatching(/too small/) } });
    // a plain 0 is still a number: 4K7 ∥ 4K7 = 2 350 Ω (Ohm's law, any physics text)
    expect(evaluateFormula('parallel(a, a) + 0 * a', { a: ohms(4700) })).toMatchObject({ ok: true, value: 2350 });
  });

  it('whatever is typed, the parser is handed at most the longest formula allowed', () => {
    const brackets = fc.array(fc.constantFrom('(', ')', '1', '+', 'a', '9', 'e', '[', ']', '-'), { maxLength: 3_000 }).map((a) => a.join(''));
    fc.assert(fc.property(fc.oneof(brackets, fc.string({ maxLength: 3_000 })), (text) => {
      const r = evaluateFormula(text, { a: ohms(1) });
      expect(typeof (r.ok ? r.value : r.error.message)).toBe(r.ok ? 'number' : 'string');
    }), { numRuns: 300 });
    expect(Math.max(0, ...seen.jsep)).toBeLessThanOrEqual(MAX_FORMULA_LENGTH);
  });
});
