import { QUANTITIES, type Quantity } from './quantities';

/**
 * What may follow the number in a typed reading, per quantity: unit symbols with SI prefixes
 * (SI Brochure, 9th ed., §3), unit words a technician types (`ohm`, `kohm`, `rpm`), and the
 * IEC 60062 letters. Everything maps to a factor to the quantity's base unit.
 */

/** SI prefixes; `u` is the common ASCII stand-in for µ, `K` the IEC 60062 letter for kilo. */
const PREFIX: Readonly<Record<string, number>> = {
  p: 1e-12, n: 1e-9, µ: 1e-6, u: 1e-6, m: 1e-3, c: 1e-2, '': 1, k: 1e3, K: 1e3, M: 1e6, G: 1e9,
};

interface UnitFamily {
  /** Unit symbols and words that take a prefix. */
  symbols: readonly string[];
  /** Prefixes allowed in front of those symbols. */
  prefixes: readonly string[];
  /** Prefixes allowed alone (`4.7k` for a resistance); the base unit is implied. */
  lonePrefixes: readonly string[];
  /** Fixed words with their own factor (`in`, `min`, `meg`). */
  words?: Readonly<Record<string, number>>;
}

const VOLT_PREFIXES = ['µ', 'u', 'm', 'k'];
const voltFamily = (extra: readonly string[]): UnitFamily => ({
  symbols: ['V', 'volt', 'volts', ...extra], prefixes: VOLT_PREFIXES, lonePrefixes: VOLT_PREFIXES,
});

const FAMILIES: Readonly<Record<Quantity, UnitFamily>> = {
  resistance: {
    symbols: ['Ω', 'ohm', 'ohms', 'Ohm', 'Ohms', 'OHM', 'OHMS'],
    prefixes: ['m', 'k', 'K', 'M', 'G'],
    lonePrefixes: ['m', 'k', 'K', 'M', 'G'],
    // `R` after the digits is the IEC 60062 code for ohms (680R); `meg` is shop talk for MΩ.
    words: { R: 1, r: 1, meg: 1e6, megohm: 1e6, megohms: 1e6 },
  },
  'dc-voltage': voltFamily(['VDC', 'Vdc', 'V=']),
  'ac-voltage': voltFamily(['VAC', 'Vac', 'Vrms', 'VRMS', 'V~']),
  'peak-voltage': voltFamily(['Vpk', 'VPK', 'Vpeak', 'Vp']),
  capacitance: { symbols: ['F'], prefixes: ['p', 'n', 'µ', 'u', 'm'], lonePrefixes: ['p', 'n', 'µ', 'u', 'm'] },
  current: { symbols: ['A', 'amp', 'amps'], prefixes: ['µ', 'u', 'm', 'k'], lonePrefixes: ['µ', 'u', 'm'] },
  temperature: { symbols: [], prefixes: [], lonePrefixes: [], words: { '°C': 1, 'ºC': 1, '℃': 1, degC: 1, C: 1 } },
  length: {
    symbols: ['m'], prefixes: ['µ', 'u', 'm', 'c'], lonePrefixes: [],
    words: { in: 0.0254, '"': 0.0254, inch: 0.0254, thou: 25.4e-6 },
  },
  time: { symbols: ['s', 'sec'], prefixes: ['n', 'µ', 'u', 'm'], lonePrefixes: [], words: { min: 60 } },
  speed: { symbols: [], prefixes: [], lonePrefixes: [], words: { rpm: 1, RPM: 1, 'r/min': 1, 'rev/min': 1, '/min': 1 } },
  energy: { symbols: ['J'], prefixes: ['µ', 'u', 'm', 'k'], lonePrefixes: ['µ', 'u', 'm', 'k'] },
  ratio: { symbols: [], prefixes: [], lonePrefixes: [], words: { '%': 0.01 } },
};

/**
 * Suffixes that must not be guessed: each maps to the sentence telling the technician what to
 * type instead. Checked before the tables so that, e.g., `mohm` never silently means milliohm.
 */
const AMBIGUOUS: Readonly<Partial<Record<Quantity, Readonly<Record<string, string>>>>> = {
  resistance: { mohm: 'type mΩ for milliohms or MΩ (or meg) for megohms', mohms: 'type mΩ for milliohms or MΩ (or meg) for megohms' },
  capacitance: { M: 'M means mega; for micro type u or µ (3u3, 3.3 µF)', MF: 'MF means megafarad; for microfarads type µF or uF' },
  length: { mil: '"mil" can mean a thousandth of an inch or a millimetre; type thou or mm' },
  temperature: { F: 'type the temperature in °C', '°F': 'type the temperature in °C' },
};

export interface SuffixMeaning {
  factor: number;
  /** `unit` when a unit was named, `prefix` when only a prefix was (`4.7k`). */
  kind: 'unit' | 'prefix';
}

function buildTable(q: Quantity): Map<string, SuffixMeaning> {
  const f = FAMILIES[q];
  const table = new Map<string, SuffixMeaning>();
  for (const s of f.symbols) {
    table.set(s, { factor: 1, kind: 'unit' });
    for (const p of f.prefixes) table.set(p + s, { factor: PREFIX[p]!, kind: 'unit' });
  }
  for (const p of f.lonePrefixes) if (!table.has(p)) table.set(p, { factor: PREFIX[p]!, kind: 'prefix' });
  for (const [w, factor] of Object.entries(f.words ?? {})) table.set(w, { factor, kind: 'unit' });
  return table;
}

const TABLES = new Map<Quantity, Map<string, SuffixMeaning>>();
function tableFor(q: Quantity): Map<string, SuffixMeaning> {
  let t = TABLES.get(q);
  if (!t) TABLES.set(q, (t = buildTable(q)));
  return t;
}

/** Normalises look-alike code points so that both µ (U+00B5/U+03BC) and both Ω (U+2126/U+03A9) work. */
export function normaliseSymbols(text: string): string {
  return text
    .replace(/[\u03BC]/g, 'µ')
    .replace(/[\u2126]/g, 'Ω')
    .replace(/[\u2212\u2012\u2013]/g, '-')
    .replace(/[\u00A0\u2009\u202F]/g, ' ');
}

export type SuffixLookup =
  | { ok: true; meaning: SuffixMeaning }
  | { ok: false; reason: 'ambiguous'; hint: string }
  | { ok: false; reason: 'combined-prefixes' }
  | { ok: false; reason: 'other-quantity'; quantity: Quantity }
  | { ok: false; reason: 'unknown' };

/** What a (space-free, normalised) suffix means for a quantity. */
export function lookupSuffix(q: Quantity, suffix: string): SuffixLookup {
  const hint = AMBIGUOUS[q]?.[suffix];
  if (hint) return { ok: false, reason: 'ambiguous', hint };
  const meaning = tableFor(q).get(suffix);
  if (meaning) return { ok: true, meaning };
  // SI Brochure §3: prefixes do not combine (no `kkΩ`, no `mµF`).
  const f = FAMILIES[q];
  const bare = [...f.symbols].sort((a, b) => b.length - a.length).find((s) => suffix.endsWith(s));
  if (bare && suffix.length > bare.length && /^[pnuµmkKMG]+$/.test(suffix.slice(0, -bare.length))) {
    return { ok: false, reason: 'combined-prefixes' };
  }
  const other = QUANTITIES.find((o) => o !== q && tableFor(o).get(suffix)?.kind === 'unit');
  if (other) return { ok: false, reason: 'other-quantity', quantity: other };
  return { ok: false, reason: 'unknown' };
}

/** IEC 60062 letters that stand in the place of the decimal point, per quantity, with their factor. */
export const CODE_LETTERS: Readonly<Partial<Record<Quantity, Readonly<Record<string, number>>>>> = {
  // IEC 60062: L, R, K, M, G, T for resistors (L for milliohms, as in 4L7 = 4.7 mΩ, shunts and
  // coil primaries); lowercase k is common practice; m is milli too (case matters: M is mega).
  resistance: { L: 1e-3, R: 1, r: 1, m: 1e-3, k: 1e3, K: 1e3, M: 1e6, G: 1e9, T: 1e12 },
  // IEC 60062: p, n, µ, m for capacitors (u is the common ASCII stand-in for µ).
  capacitance: { p: 1e-12, n: 1e-9, µ: 1e-6, u: 1e-6, m: 1e-3 },
  // 3V3 for 3.3 V is common practice on schematics and meters' labels.
  'dc-voltage': { V: 1 },
  'ac-voltage': { V: 1 },
  'peak-voltage': { V: 1 },
};
