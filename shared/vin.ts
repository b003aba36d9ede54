/**
 * VIN check digit per 49 CFR 565.15 (the same scheme as ISO 3779 for North-American VINs):
 * letters are transliterated to numbers, weighted by position, summed mod 11; 10 is written X.
 */
const TRANSLITERATION: Record<string, number> = {
  A: 1, B: 2, C: 3, D: 4, E: 5, F: 6, G: 7, H: 8,
  J: 1, K: 2, L: 3, M: 4, N: 5, P: 7, R: 9,
  S: 2, T: 3, U: 4, V: 5, W: 6, X: 7, Y: 8, Z: 9,
};
const WEIGHTS = [8, 7, 6, 5, 4, 3, 2, 10, 0, 9, 8, 7, 6, 5, 4, 3, 2];

export type VinCheck =
  | { kind: 'vin'; ok: true; vin: string }
  | { kind: 'vin'; ok: false; vin: string; message: string; expected?: string }
  | { kind: 'frame-number'; ok: true; value: string };

/** Computes the check digit of a 17-character VIN. Example: vinCheckDigit('1M8GDM9AXKP042788') === 'X' */
export function vinCheckDigit(vin: string): string | null {
  const v = vin.toUpperCase();
  if (v.length !== 17) return null;
  let sum = 0;
  for (let i = 0; i < 17; i++) {
    const ch = v[i]!;
    const n = /[0-9]/.test(ch) ? Number(ch) : TRANSLITERATION[ch];
    if (n === undefined) return null;
    sum += n * WEIGHTS[i]!;
  }
  const r = sum % 11;
  return r === 10 ? 'X' : String(r);
}

/**
 * Checks what was typed as a frame number: 17 characters are a VIN and must carry a valid check
 * digit; anything shorter is a frame number taken as typed.
 * Example: checkVin('1M8GDM9AXKP042788').ok === true
 */
export function checkVin(text: string): VinCheck {
  const value = text.trim().toUpperCase().replace(/[\s-]/g, '');
  if (value.length !== 17) return { kind: 'frame-number', ok: true, value: text.trim() };
  if (/[IOQ]/.test(value)) {
    return { kind: 'vin', ok: false, vin: value, message: 'A VIN never contains the letters I, O or Q: they are probably 1 or 0.' };
  }
  const expected = vinCheckDigit(value);
  if (expected === null) {
    return { kind: 'vin', ok: false, vin: value, message: 'A VIN has only letters and digits. Check what was typed.' };
  }
  if (value[8] !== expected) {
    return {
      kind: 'vin', ok: false, vin: value, expected,
      message: `This VIN's check digit (9th character) is ${value[8]}, but the other characters give ${expected}. One character is probably mistyped.`,
    };
  }
  return { kind: 'vin', ok: true, vin: value };
}

/** The problem with a 17-character VIN as a sentence, or null when it is fine or not a VIN. */
export function checkVinDigit(text: string): string | null {
  const r = checkVin(text);
  return r.kind === 'vin' && !r.ok ? r.message : null;
}
