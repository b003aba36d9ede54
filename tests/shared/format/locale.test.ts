import { describe, expect, it } from 'vitest';
import { canonicalLocale, localeFormat } from '@shared/format/locale';
import { QUANTITIES, QUANTITY_INFO } from '@shared/measure';

// The expected texts are Unicode CLDR's conventions (cldr.unicode.org, common/main/<language>.xml,
// the data ICU carries into Node and Chromium): number symbols (decimal and group signs), the
// percent pattern, and the short time pattern ("HH:mm" in de and en-GB, "h:mm a" in en-US).
// Times are shown in UTC here so that the machine's own time zone does not change them.
const at = '2026-12-02T17:42:07Z';
const utc = (locale: string | null) => localeFormat(locale, { timeZone: 'UTC' });
const cap = { value: 5950, quantity: 'resistance', significantDigits: 3 } as const;

describe('readings in the shop locale', () => {
  it('shows a reading with the decimal comma in de-DE (CLDR de: decimal sign ",")', () => {
    expect(utc('de-DE').decimal).toBe(',');
    expect(utc('de-DE').reading(cap)).toBe('5,95 kΩ');
  });

  it('shows a reading with the decimal point in en-US (CLDR en: decimal sign ".")', () => {
    expect(utc('en-US').reading(cap)).toBe('5.95 kΩ');
  });

  it('shows a reading with the decimal comma in fr-FR (CLDR fr: decimal sign ",")', () => {
    expect(utc('fr-FR').reading({ value: 0.00055, quantity: 'length' }, { unit: 'mm' })).toBe('0,550 mm');
  });

  it('keeps the point for a locale whose decimal sign is neither comma nor point, since the reading parser reads only those two', () => {
    // CLDR ar-EG writes Arabic-Indic digits with U+066B; readings stay in Latin digits with a point.
    expect(utc('ar-EG').reading(cap)).toBe('5.95 kΩ');
  });

  it('puts the decimal comma into limits texts and limits written by the author', () => {
    const de = utc('de-DE');
    expect(de.limit(0.00055, 'length', 'mm')).toBe('0,55 mm');
    expect(de.decimals('0.2 – 1.5 Ω')).toBe('0,2 – 1,5 Ω');
    expect(utc('en-US').decimals('0.2 – 1.5 Ω')).toBe('0.2 – 1.5 Ω');
  });

  it('no unit symbol holds a point, so every point in a formatted reading is a decimal point', () => {
    const symbols = QUANTITIES.flatMap((q) => [QUANTITY_INFO[q].base, ...Object.keys(QUANTITY_INFO[q].displayUnits)]);
    expect(symbols.filter((s) => s.includes('.'))).toEqual([]);
  });
});

describe('counts, decimals and shares in the shop locale (CLDR number symbols and percent patterns)', () => {
  it('groups thousands with a point in de-DE and a comma in en-US', () => {
    expect(utc('de-DE').count(12345)).toBe('12.345');
    expect(utc('en-US').count(12345)).toBe('12,345');
  });

  it('groups thousands with a narrow no-break space in fr-FR (CLDR fr group sign U+202F)', () => {
    expect(utc('fr-FR').count(12345)).toBe('12\u202f345');
  });

  it('rounds to a fixed count of decimals with the locale decimal sign', () => {
    expect(utc('de-DE').fixed(3.25, 1)).toBe('3,3');
    expect(utc('en-US').fixed(3.25, 1)).toBe('3.3');
  });

  it('writes a share with a no-break space before % in de-DE ("#,##0 %") and none in en-US ("#,##0%")', () => {
    expect(utc('de-DE').percent(0.125, 1)).toBe('12,5\u00a0%');
    expect(utc('en-US').percent(0.125, 1)).toBe('12.5%');
    expect(utc('en-US').percent(null)).toBe('–');
    expect(utc('en-US').percent(Number.NaN)).toBe('–');
  });
});

describe('dates and times in the shop locale (CLDR date and time patterns)', () => {
  it('writes the day before the month in de-DE and the time of day on the 24-hour clock', () => {
    const de = utc('de-DE');
    expect(de.date(at)).toBe('2. Dez. 2026');
    expect(de.time(at)).toBe('17:42');
    expect(de.dateTime(at)).toBe('2. Dez. 2026, 17:42');
    expect(de.timeWithSeconds(at)).toBe('17:42:07');
  });

  it('writes the month before the day in en-US and the time of day on the 12-hour clock', () => {
    const us = utc('en-US');
    expect(us.date(at)).toBe('Dec 2, 2026');
    // CLDR 42 put a narrow no-break space before AM/PM; some ICU builds (Node's) keep a plain space.
    expect(us.time(at)).toMatch(/^5:42[ \u202f]PM$/);
    expect(us.dateTime(at)).toMatch(/^Dec 2, 2026, 5:42[ \u202f]PM$/);
  });

  it('writes en-GB day first on the 24-hour clock', () => {
    expect(utc('en-GB').dateTime(at)).toBe('2 Dec 2026, 17:42');
  });

  it('names the time zone when asked, for texts read away from the shop such as e-mail', () => {
    expect(localeFormat('en-GB', { timeZone: 'UTC', withTimeZone: true }).dateTime(at)).toBe('2 Dec 2026, 17:42 UTC');
  });

  it('gives the time of day alone on the same day, and the day too when it was another day', () => {
    expect(utc('de-DE').sameDayTime(at, '2026-12-02T23:59:00Z')).toBe('17:42');
    expect(utc('de-DE').sameDayTime(at, '2026-12-03T08:00:00Z')).toBe('2. Dez. 2026, 17:42');
  });

  it('accepts a Date or epoch milliseconds as well as an ISO text', () => {
    expect(utc('de-DE').time(new Date(at))).toBe('17:42');
    expect(utc('de-DE').time(Date.parse(at))).toBe('17:42');
  });
});

describe('which locale is in use', () => {
  it('follows the runtime default when the shop set none', () => {
    expect(localeFormat(null).locale).toBe(new Intl.NumberFormat().resolvedOptions().locale);
  });

  it('falls back to the runtime default for an unusable tag instead of failing to draw', () => {
    expect(localeFormat('not a tag').locale).toBe(localeFormat(null).locale);
  });

  it('makes each formatter once per tag', () => {
    expect(localeFormat('de-DE')).toBe(localeFormat('de-DE'));
  });

  it('canonicalises well-formed tags (BCP 47 case conventions, Intl.getCanonicalLocales)', () => {
    expect(canonicalLocale('de-de')).toBe('de-DE');
    expect(canonicalLocale(' EN-gb ')).toBe('en-GB');
  });

  it('refuses text that is no BCP 47 tag, an empty tag, and a language the runtime has no data for', () => {
    expect(canonicalLocale('not a tag')).toBeNull();
    expect(canonicalLocale('')).toBeNull();
    expect(canonicalLocale('xx')).toBeNull();
  });
});
