import { formatLimit, formatReading, type FormatOptions } from '../measure/format';
import type { Quantity } from '../measure/quantities';

/**
 * The one place where dates, times and numbers become text for a person, in the shop's locale
 * (a BCP 47 tag; null follows the runtime's own: the browser's on a phone, the server's on the
 * server). Conventions come from Unicode CLDR through `Intl`.
 *
 * Digits are always Latin (0–9), even for a locale whose own digits differ, because the Bench
 * keypad and the reading parser work in Latin digits; a reading is shown back with the locale's
 * decimal sign when that is a comma, else a point — the two signs the reading parser accepts.
 */
export interface LocaleFormat {
  /** The tag in use, resolved (e.g. "de-DE"; the runtime's default when the shop set none). */
  readonly locale: string;
  /** The sign readings are shown with. */
  readonly decimal: ',' | '.';
  /** A reading in engineering notation: "5,95 kΩ" in de-DE, "5.95 kΩ" in en-US. */
  reading(reading: Parameters<typeof formatReading>[0], options?: FormatOptions): string;
  /** A limit an author set: "0,55 mm". */
  limit(value: number, quantity: Quantity, unit?: string): string;
  /**
   * Puts the locale's decimal sign into a text made by the measure formatters (limits texts such as
   * "0.2 – 1 Ω", stored "limits shown"), whose only points are decimal points.
   */
  decimals(text: string): string;
  /** A count, grouped as the locale groups: 12,345 (en-US), 12.345 (de-DE). */
  count(n: number): string;
  /** A number with a fixed count of decimals: `fixed(3.25, 1)` is "3.3" or "3,3". */
  fixed(n: number, digits: number): string;
  /** A share 0…1 as a percentage: "12%" (en-US), "12 %" (de-DE); "–" when there is none. */
  percent(share: number | null | undefined, digits?: number): string;
  /** A calendar day: "Dec 2, 2026" (en-US), "2. Dez. 2026" (de-DE). */
  date(at: string | number | Date): string;
  /** A day and time of day: "Dec 2, 2026, 10:42 AM" (en-US), "2. Dez. 2026, 10:42" (de-DE). */
  dateTime(at: string | number | Date): string;
  /** The time of day: "10:42 AM" (en-US, 12-hour), "10:42" (de-DE, 24-hour). */
  time(at: string | number | Date): string;
  /** The time of day with seconds: "10:42:07 AM", "10:42:07". */
  timeWithSeconds(at: string | number | Date): string;
  /** The time of day alone when `at` falls on the same calendar day as `now`, else day and time. */
  sameDayTime(at: string | number | Date, now?: string | number | Date): string;
}

export interface LocaleFormatOptions {
  /** Add the time zone's short name to dates with a time ("10:42 UTC"): for texts read elsewhere, such as e-mail. */
  withTimeZone?: boolean;
  /** An IANA time zone ("Europe/Berlin"); the runtime's own when absent. */
  timeZone?: string;
}

/**
 * The canonical form of a BCP 47 tag the runtime can format for, or null when it is not one.
 * Example: `canonicalLocale('de-de')` is "de-DE"; `canonicalLocale('xx')` and `canonicalLocale('not a tag')` are null.
 */
export function canonicalLocale(tag: string): string | null {
  let canonical: string | undefined;
  try {
    canonical = Intl.getCanonicalLocales(tag.trim())[0];
  } catch {
    return null;
  }
  if (!canonical) return null;
  // A well-formed tag for a language the runtime has no data for (say "xx") would quietly fall back.
  return Intl.DateTimeFormat.supportedLocalesOf([canonical]).length > 0 && Intl.NumberFormat.supportedLocalesOf([canonical]).length > 0 ? canonical : null;
}

const cache = new Map<string, LocaleFormat>();

const toDate = (at: string | number | Date) => (at instanceof Date ? at : new Date(at));

function build(locale: string | undefined, options: LocaleFormatOptions): LocaleFormat {
  const latn = { numberingSystem: 'latn' } as const;
  const numbers = new Intl.NumberFormat(locale, latn);
  const resolved = numbers.resolvedOptions().locale;
  const decimal = numbers.formatToParts(1.5).find((p) => p.type === 'decimal')?.value === ',' ? ',' : '.';
  const zone = { ...(options.withTimeZone ? { timeZoneName: 'short' } as const : {}), ...(options.timeZone ? { timeZone: options.timeZone } : {}) };
  const dates = {
    date: new Intl.DateTimeFormat(locale, { ...latn, day: 'numeric', month: 'short', year: 'numeric', ...(options.timeZone ? { timeZone: options.timeZone } : {}) }),
    dateTime: new Intl.DateTimeFormat(locale, { ...latn, day: 'numeric', month: 'short', year: 'numeric', hour: 'numeric', minute: '2-digit', ...zone }),
    time: new Intl.DateTimeFormat(locale, { ...latn, hour: 'numeric', minute: '2-digit', ...zone }),
    timeWithSeconds: new Intl.DateTimeFormat(locale, { ...latn, hour: 'numeric', minute: '2-digit', second: '2-digit', ...zone }),
  };
  const fixedFormats = new Map<number, Intl.NumberFormat>();
  const fixedFormat = (digits: number) => {
    let f = fixedFormats.get(digits);
    if (!f) fixedFormats.set(digits, (f = new Intl.NumberFormat(locale, { ...latn, minimumFractionDigits: digits, maximumFractionDigits: digits })));
    return f;
  };
  const percentFormats = new Map<number, Intl.NumberFormat>();
  const percentFormat = (digits: number) => {
    let f = percentFormats.get(digits);
    if (!f) percentFormats.set(digits, (f = new Intl.NumberFormat(locale, { ...latn, style: 'percent', minimumFractionDigits: digits, maximumFractionDigits: digits })));
    return f;
  };
  const decimals = (text: string) => (decimal === '.' ? text : text.replaceAll('.', decimal));
  return {
    locale: resolved, decimal,
    reading: (reading, opts) => decimals(formatReading(reading, opts)),
    limit: (value, quantity, unit) => decimals(formatLimit(value, quantity, unit)),
    decimals,
    count: (n) => numbers.format(n),
    fixed: (n, digits) => fixedFormat(Math.max(0, Math.min(20, Math.round(digits)))).format(n),
    percent: (share, digits = 0) =>
      share === null || share === undefined || !Number.isFinite(share) ? '–' : percentFormat(Math.max(0, Math.min(20, Math.round(digits)))).format(share),
    date: (at) => dates.date.format(toDate(at)),
    dateTime: (at) => dates.dateTime.format(toDate(at)),
    time: (at) => dates.time.format(toDate(at)),
    timeWithSeconds: (at) => dates.timeWithSeconds.format(toDate(at)),
    sameDayTime: (at, now = Date.now()) =>
      dates.date.format(toDate(at)) === dates.date.format(toDate(now)) ? dates.time.format(toDate(at)) : dates.dateTime.format(toDate(at)),
  };
}

/**
 * The formatter for a shop's locale, made once per tag and kept (building `Intl` formatters is the
 * slow part, so a screen never builds its own). An unusable tag falls back to the runtime's default.
 * Example: `localeFormat('de-DE').reading({ value: 5950, quantity: 'resistance', significantDigits: 3 })` is "5,95 kΩ".
 */
export function localeFormat(locale?: string | null, options: LocaleFormatOptions = {}): LocaleFormat {
  const key = `${locale ?? ''}|${options.withTimeZone ? 'tz' : ''}|${options.timeZone ?? ''}`;
  let f = cache.get(key);
  if (!f) {
    const usable = locale ? canonicalLocale(locale) ?? undefined : undefined;
    f = build(usable, options);
    cache.set(key, f);
  }
  return f;
}
