import { describe, expect, it } from 'vitest';
import { checkVin, vinCheckDigit } from '@shared/vin';

describe('VIN check digit (49 CFR 565.15; ISO 3779)', () => {
  it('1M8GDM9AXKP042788 has check digit X (49 CFR 565 worked example)', () => {
    expect(vinCheckDigit('1M8GDM9AXKP042788')).toBe('X');
    expect(checkVin('1M8GDM9AXKP042788')).toEqual({ kind: 'vin', ok: true, vin: '1M8GDM9AXKP042788' });
  });

  it('says which digit was expected when one character is mistyped', () => {
    const r = checkVin('1M8GDM9A1KP042788');
    expect(r.ok).toBe(false);
    expect(r.kind === 'vin' && !r.ok && r.expected).toBe('X');
    expect(r.kind === 'vin' && !r.ok && r.message).toMatch(/X/);
  });

  it('refuses I, O and Q, which a VIN never uses', () => {
    const r = checkVin('1M8GDM9AXKP04278O');
    expect(r.ok).toBe(false);
  });

  it('accepts a shorter frame number exactly as typed', () => {
    expect(checkVin('HRN125-00417')).toEqual({ kind: 'frame-number', ok: true, value: 'HRN125-00417' });
  });
});
