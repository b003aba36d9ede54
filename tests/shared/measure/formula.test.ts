import { describe, expect, it } from 'vitest';
import { evaluateFormula, parseFormula, parseReading, type FormulaValue } from '@shared/measure';

const r = (value: number): FormulaValue => ({ value, quantity: 'resistance' });
const ok = (expr: string, values: Record<string, FormulaValue>) => {
  const res = evaluateFormula(expr, values);
  if (!res.ok) throw new Error(res.error.message);
  return res;
};

describe('formula facts of the trade (common practice; circuit laws from any physics text)', () => {
  it('two 680 Ω in parallel make 340 Ω (common practice)', () => {
    expect(ok('parallel(a, b)', { a: r(680), b: r(680) }).value).toBeCloseTo(340, 10);
  });

  it('4K7 ∥ 4K7 = 2 350 Ω, with the values typed as IEC 60062 codes (common practice)', () => {
    const k = parseReading('4K7', 'resistance');
    if (!k.ok) throw new Error('parse');
    expect(ok('parallel(a, a)', { a: r(k.reading.value) }).value).toBeCloseTo(2350, 9);
  });

  it('1 µF charged to 200 V stores 20 mJ, E = ½CV² (common practice)', () => {
    const values = { c: { value: 1e-6, quantity: 'capacitance' as const }, v: { value: 200, quantity: 'peak-voltage' as const } };
    const e = ok('0.5 * c * v ** 2', values);
    expect(e.value).toBeCloseTo(0.02, 12);
    expect(e.quantity).toBe('energy');
    expect(ok('energy(c, v)', values).value).toBeCloseTo(0.02, 12);
  });

  it('1 µF at 300 V stores 45 mJ (REFERENCES.md circuit laws)', () => {
    const values = { c: { value: 1e-6, quantity: 'capacitance' as const }, v: { value: 300, quantity: 'dc-voltage' as const } };
    expect(ok('energy(c, v)', values).value).toBeCloseTo(0.045, 12);
  });

  it('1 µF × 1 MΩ = 1 s, τ = RC (common practice)', () => {
    const t = ok('c * rr', { c: { value: 1e-6, quantity: 'capacitance' }, rr: r(1e6) });
    expect(t.value).toBeCloseTo(1, 12);
    expect(t.quantity).toBe('time');
  });

  it('series, ratio, min, max, abs and sqrt work with units', () => {
    const v = { a: r(100), b: r(300) };
    expect(ok('series(a, b)', v).value).toBe(400);
    expect(ok('ratio(a, b)', v).quantity).toBe('ratio');
    expect(ok('min(a, b)', v).value).toBe(100);
    expect(ok('max(a, b)', v).value).toBe(300);
    expect(ok('abs(a - b)', v).value).toBe(200);
    expect(ok('sqrt(a * b)', v).quantity).toBe('resistance');
  });

  it('copper() corrects a winding to 20 °C with the IEC 60028 coefficient (0.500 Ω at 30 °C is 0.48109 Ω)', () => {
    const v = { w: r(0.5), t: { value: 30, quantity: 'temperature' as const } };
    expect(ok('copper(w, t)', v).value).toBeCloseTo(0.48109, 5);
  });

  it('a quantity in quotes carries its unit: w - "0.2 Ω"', () => {
    expect(ok('w - "0.2 Ω"', { w: r(0.7) }).value).toBeCloseTo(0.5, 12);
  });
});

describe('formula safety and errors', () => {
  it('points at the position of a syntax error', () => {
    const p = parseFormula('a + * b');
    expect(p.ok).toBe(false);
    if (!p.ok) {
      expect(p.error.code).toBe('syntax');
      expect(p.error.position).toBe(4);
    }
  });

  it('lists the step ids a formula reads, not the functions it calls', () => {
    const p = parseFormula('parallel(primaryOhms, capOhms) * 2');
    expect(p.ok && p.references.sort()).toEqual(['capOhms', 'primaryOhms']);
  });

  it.each(['a.constructor', 'this', 'a[0]', 'a ? b : c', 'a == b', 'a || b', '[a, b]', 'x = 1', 'true'])(
    'refuses %s: only arithmetic over step ids is allowed', (expr) => {
      expect(evaluateFormula(expr, { a: r(1), b: r(2) }).ok).toBe(false);
    },
  );

  it('refuses a function that is not on the list and names the allowed ones', () => {
    const res = evaluateFormula('eval(a)', { a: r(1) });
    expect(!res.ok && res.error.code).toBe('unknown-function');
    expect(!res.ok && res.error.message).toMatch(/parallel/);
  });

  it('does not reach object prototypes through step ids', () => {
    const res = evaluateFormula('constructor + 1', {});
    expect(!res.ok && res.error.code).toBe('unknown-step');
  });

  it('refuses adding a plain number to a resistance and says to write the unit', () => {
    const res = evaluateFormula('a + 1', { a: r(1) });
    expect(!res.ok && res.error.code).toBe('unit-mismatch');
    expect(!res.ok && res.error.message).toMatch(/"0.2 Ω"/);
  });

  it('refuses parallel() over a resistance and a voltage', () => {
    const res = evaluateFormula('parallel(a, v)', { a: r(1), v: { value: 1, quantity: 'dc-voltage' } });
    expect(!res.ok && res.error.code).toBe('unit-mismatch');
  });

  it('checks the result against the quantity the step expects', () => {
    const res = evaluateFormula('a * 2', { a: r(1) }, { expect: 'energy' });
    expect(!res.ok && res.error.code).toBe('unit-mismatch');
  });

  it('reports division by zero as a math error, not Infinity', () => {
    const res = evaluateFormula('a / (a - a)', { a: r(1) });
    expect(!res.ok && res.error.code).toBe('math');
  });

  it('refuses a quoted value that could be more than one quantity', () => {
    expect(evaluateFormula('"4.7k"', {}).ok).toBe(false);
  });

  it('says which value is missing when a step has not been measured', () => {
    const res = evaluateFormula('parallel(a, b)', { a: r(1) });
    expect(!res.ok && res.error.message).toMatch(/"b"/);
  });
});
