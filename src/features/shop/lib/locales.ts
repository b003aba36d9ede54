/**
 * Locales offered in Shop settings: the regions where small-engine and powersports shops are
 * common, each a BCP 47 tag. The server accepts any tag it can format for; this is only the list.
 */
export const OFFERED_LOCALES = [
  'en-US', 'en-GB', 'en-CA', 'en-AU', 'en-NZ', 'en-IE', 'en-ZA', 'en-IN',
  'de-DE', 'de-AT', 'de-CH', 'fr-FR', 'fr-BE', 'fr-CA', 'fr-CH', 'it-IT', 'it-CH', 'es-ES', 'es-MX', 'es-AR', 'es-CL',
  'pt-PT', 'pt-BR', 'nl-NL', 'nl-BE', 'sv-SE', 'nb-NO', 'da-DK', 'fi-FI', 'is-IS', 'et-EE', 'lv-LV', 'lt-LT',
  'pl-PL', 'cs-CZ', 'sk-SK', 'hu-HU', 'ro-RO', 'sl-SI', 'hr-HR', 'el-GR', 'tr-TR', 'uk-UA',
  'ja-JP', 'ko-KR', 'zh-CN', 'zh-TW', 'th-TH', 'id-ID', 'ms-MY', 'vi-VN',
] as const;

export interface LocaleChoice { tag: string; native: string; english: string }

const names = new Map<string, LocaleChoice>();

/** A tag with its name in its own language and in English: de-DE → "Deutsch (Deutschland)", "German (Germany)". */
export function localeChoice(tag: string): LocaleChoice {
  let c = names.get(tag);
  if (!c) {
    const of = (inLocale: string) => {
      try { return new Intl.DisplayNames([inLocale], { type: 'language' }).of(tag) ?? tag; } catch { return tag; }
    };
    c = { tag, native: of(tag), english: of('en') };
    names.set(tag, c);
  }
  return c;
}

/** The offered locales (and the current one, if it is not among them) whose tag or names contain the search. */
export function matchLocales(search: string, current: string | null): LocaleChoice[] {
  const all = [...(current && !(OFFERED_LOCALES as readonly string[]).includes(current) ? [current] : []), ...OFFERED_LOCALES].map(localeChoice);
  const q = search.trim().toLocaleLowerCase();
  if (!q) return all;
  return all.filter((c) => c.tag === current || [c.tag, c.native, c.english].some((s) => s.toLocaleLowerCase().includes(q)));
}
