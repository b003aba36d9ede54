import { useId, useState } from 'react';
import { localeFormat } from '@shared/format/locale';
import { Input, Select } from '../../../components/ui/field';
import { localeChoice, matchLocales } from '../lib/locales';

/** A date, a time, a count and a reading as the chosen locale writes them. */
function LocaleExample({ tag }: { tag: string | null }) {
  const fmt = localeFormat(tag);
  const now = new Date();
  return (
    <p data-testid="locale-example" className="rounded-lg border-2 border-line bg-paper p-3 text-base">
      <span className="block text-sm font-semibold uppercase tracking-wide text-ink-soft">Shown as</span>
      {fmt.date(now)} · {fmt.time(now)} · a cap reading of <strong>{fmt.reading({ value: 5950, quantity: 'resistance', significantDigits: 3 })}</strong> · {fmt.count(12345)} steps
    </p>
  );
}

/**
 * The shop's locale: a search over the offered locales (tag, own name, English name) and a list to
 * choose from, with each device's browser as the first choice, and a live example of the result.
 */
export function LocalePicker({ value, onChange, error }: { value: string | null; onChange(tag: string | null): void; error?: string | undefined }) {
  const id = useId();
  const [search, setSearch] = useState('');
  const choices = matchLocales(search, value);
  const browser = localeChoice(localeFormat(null).locale);
  return (
    <fieldset className="flex flex-col gap-2" aria-describedby={`${id}-hint`}>
      <legend className="font-semibold text-ink">Dates and numbers</legend>
      <p id={`${id}-hint`} className="text-sm text-ink-soft">How every screen, report and e-mail of this shop writes dates, times and readings (a decimal comma where the locale uses one).</p>
      <label htmlFor={`${id}-search`} className="text-sm font-semibold">Search languages and countries</label>
      <Input id={`${id}-search`} type="search" value={search} onChange={(e) => setSearch(e.target.value)} placeholder="e.g. Deutsch, Canada, pt-BR" autoComplete="off" />
      <label htmlFor={`${id}-list`} className="text-sm font-semibold">Locale</label>
      <Select id={`${id}-list`} size={7} value={value ?? ''} onChange={(e) => onChange(e.target.value || null)} className="py-1"
        aria-invalid={error ? true : undefined} aria-describedby={error ? `${id}-err` : undefined}>
        <option value="">Each device's browser (this one: {browser.english})</option>
        {choices.map((c) => <option key={c.tag} value={c.tag}>{c.native === c.english ? c.native : `${c.native} — ${c.english}`} · {c.tag}</option>)}
      </Select>
      {choices.length === 0 && <p className="text-sm text-ink-soft">No offered locale matches “{search}”.</p>}
      {error && <p id={`${id}-err`} role="alert" className="text-sm font-semibold text-stop">{error}</p>}
      <LocaleExample tag={value} />
    </fieldset>
  );
}
