import { describe, expect, it } from 'vitest';
import { COPPER_ALPHA_20, copperResistanceAt, decideReading, limitCrossedBy, meterUncertainty, resolveLimits } from '@shared/measure';
import type { Band, MeterSpec } from '@shared/schema';

const meter: MeterSpec = { percentOfReading: 0.9, counts: 2, resolution: 0.1 };
const limits = { kind: 'range' as const, min: 100, max: 200 };
const bands: Band[] = [
  { id: 'low', label: 'Below', upper: { value: 100, inclusive: false }, next: 'lowStep' },
  { id: 'ok', label: 'Within', lower: { value: 100, inclusive: true }, upper: { value: 200, inclusive: true }, next: 'okStep' },
  { id: 'high', label: 'Above', lower: { value: 200, inclusive: false }, next: 'highStep' },
];

describe('IEC 60028 copper temperature coefficient', () => {
  it('uses α20 = 0.00393 per °C (IEC 60028)', () => expect(COPPER_ALPHA_20).toBe(0.00393));

  it('1.000 Ω at 20 °C reads 1.1572 Ω at 60 °C (IEC 60028 worked value)', () => {
    expect(copperResistanceAt(1, 20, 60)).toBeCloseTo(1.1572, 4);
  });

  it('0.500 Ω read at 30 °C is 0.48109 Ω at 20 °C (IEC 60028 worked value)', () => {
    expect(copperResistanceAt(0.5, 30, 20)).toBeCloseTo(0.48109, 5);
  });

  it('corrects a copper-winding reading to the limits reference temperature before deciding', () => {
    // 0.5 Ω read hot at 30 °C is 0.481 Ω at 20 °C: inside 0.40–0.49 only after correction.
    const range = { kind: 'range' as const, min: 0.4, max: 0.49 };
    expect(decideReading({ value: 0.5, limits: range }).verdict).toBe('above');
    const hot = decideReading({ value: 0.5, limits: range, winding: { temperature: 30 } });
    expect(hot.verdict).toBe('within');
    expect(hot.value).toBeCloseTo(0.48109, 5);
  });
});

describe('JCGM 100:2008 (GUM) §4.3.7 rectangular distribution of a meter spec', () => {
  it('100.0 Ω at ±(0.9 % + 2 counts), 0.1 Ω resolution: a = 1.1 Ω, u = 0.635 Ω, U(k=2) = 1.270 Ω', () => {
    const u = meterUncertainty(100, meter);
    expect(u.halfWidth).toBeCloseTo(1.1, 10);
    expect(u.standard).toBeCloseTo(0.635, 3);
    expect(u.expanded).toBeCloseTo(1.27, 3);
  });
});

describe('ILAC-G8:09/2019 §4.2 and JCGM 106:2012 decision rules', () => {
  const guarded = (value: number) => decideReading({ value, limits, meter, rule: 'guarded', bands });

  it('197.0 Ω passes under guarded acceptance (U ≈ 2.278 Ω, ILAC-G8 worked value)', () => {
    const d = guarded(197);
    expect(d.uncertainty?.expanded).toBeCloseTo(2.278, 3);
    expect(d.zone).toBe('pass');
    expect(d.verdict).toBe('within');
  });

  it('199.0 Ω is a conditional pass: the interval straddles the upper limit (ILAC-G8 §4.2.3)', () => {
    const d = guarded(199);
    expect(d.zone).toBe('conditional-pass');
    expect(d.verdict).toBe('borderline-high');
    expect(d.interval!.low).toBeLessThan(200);
    expect(d.interval!.high).toBeGreaterThan(200);
  });

  it('203.0 Ω fails (ILAC-G8 worked value)', () => {
    expect(guarded(203).zone).toBe('fail');
    expect(guarded(203).verdict).toBe('above');
  });

  it('201.0 Ω is a conditional fail: above the limit but within U of it', () => {
    expect(guarded(201).zone).toBe('conditional-fail');
    expect(guarded(201).verdict).toBe('borderline-high');
  });

  it('under simple acceptance the limit itself decides: 199.0 Ω is within, 201.0 Ω above', () => {
    expect(decideReading({ value: 199, limits, meter, rule: 'simple' }).verdict).toBe('within');
    expect(decideReading({ value: 201, limits, meter, rule: 'simple' }).verdict).toBe('above');
  });

  it('near the lower limit the verdict is borderline-low', () => {
    expect(guarded(100.5).verdict).toBe('borderline-low');
    expect(guarded(99.5).zone).toBe('conditional-fail');
    expect(guarded(95).verdict).toBe('below');
  });
});

describe('routing a decided reading', () => {
  it('a borderline reading asks to re-measure once, then the value picks the band', () => {
    const first = decideReading({ value: 199, limits, meter, rule: 'guarded', bands });
    expect(first.route.kind).toBe('re-measure');
    const second = decideReading({ value: 199, limits, meter, rule: 'guarded', bands, remeasured: 1 });
    expect(second.route).toMatchObject({ kind: 'band', next: 'okStep' });
  });

  it('a borderline reading follows the author\'s branch when the step names one', () => {
    const d = decideReading({ value: 199, limits, meter, rule: 'guarded', bands, borderline: { action: 'branch', next: 'askSenior', label: 'Borderline' } });
    expect(d.route).toEqual({ kind: 'borderline-branch', next: 'askSenior' });
  });

  it('a clear reading routes to the band that contains it', () => {
    expect(decideReading({ value: 50, limits, bands }).route).toMatchObject({ kind: 'band', next: 'lowStep' });
    expect(decideReading({ value: 200, limits, bands }).route).toMatchObject({ kind: 'band', next: 'okStep' });
  });

  it('test-lead nulling subtracts the lead resistance before deciding', () => {
    const d = decideReading({ value: 0.6, leadResistance: 0.2, limits: { kind: 'range', min: 0.2, max: 0.5 } });
    expect(d.value).toBeCloseTo(0.4, 12);
    expect(d.verdict).toBe('within');
    expect(d.corrections.leadNull).toBe(0.2);
  });

  it('turns nominal ± percent into a range (5 kΩ ± 20 % is 4–6 kΩ)', () => {
    expect(resolveLimits({ kind: 'nominal', nominal: 5000, tolerancePercent: 20 })).toEqual({ min: 4000, max: 6000 });
  });

  it('gives no verdict when there are no limits', () => {
    expect(decideReading({ value: 1 }).verdict).toBeNull();
  });
});

describe('an interval that crosses a limit under simple acceptance (ILAC-G8:09/2019 §4.2.1; JCGM 106:2012 §8.2)', () => {
  it('199.0 Ω is within under simple acceptance, yet its interval (≈ 196.7–201.3 Ω) crosses the 200 Ω limit', () => {
    // Worked values of REFERENCES.md: limits 100–200 Ω, meter ±(0.9 % + 2 counts) at 0.1 Ω, U = 2·MPE/√3.
    const d = decideReading({ value: 199, limits, meter, rule: 'simple' });
    expect(d.verdict).toBe('within');
    expect(limitCrossedBy(d)).toBe(200);
  });
  it('197.0 Ω keeps its interval (U ≈ 2.278 Ω) inside the limits: nothing to explain', () => {
    expect(limitCrossedBy(decideReading({ value: 197, limits, meter, rule: 'simple' }))).toBeNull();
  });
  it('the demo cap reading 5,95 kΩ against 4–6 kΩ at ±(0.8 % + 2 counts) crosses 6 kΩ (demo meter, illustrative)', () => {
    const d = decideReading({ value: 5950, limits: { kind: 'range', min: 4000, max: 6000 }, meter: { percentOfReading: 0.8, counts: 2, resolution: 1 }, rule: 'simple' });
    expect(d.verdict).toBe('within');
    expect(d.interval!.high).toBeGreaterThan(6000);
    expect(limitCrossedBy(d)).toBe(6000);
  });
  it('under guarded acceptance the same reading is borderline, which the screen already explains', () => {
    expect(limitCrossedBy(decideReading({ value: 199, limits, meter, rule: 'guarded' }))).toBeNull();
  });
});
