import { useId, useRef, useState } from 'react';
import type { ReadingStep } from '@shared/schema/procedure';
import type { ReadingDecision } from '@shared/measure/verdict';
import { decideEntered } from '@shared/engine/reading-entry';
import { useFormat } from '../../../lib/format';
import type { FormulaValue } from '@shared/measure/formula';
import { VerdictPanel } from './verdict-panel';

const inputClass = 'w-full rounded-lg border-2 border-ink/70 bg-panel px-3 min-h-14 text-2xl font-semibold text-ink focus:border-signal focus:outline-none aria-[invalid=true]:border-stop';

export interface ReadingValue { entered: string; leadEntered: string; valid: boolean }

/**
 * The parsed value and the verdict it would get, live as the technician types: the same decision
 * the walker (and so the server's record) makes of this answer.
 */
function preview(step: ReadingStep, text: string, lead: string, values: Readonly<Record<string, FormulaValue>>, remeasured: number) {
  const r = decideEntered(step, { text, leadText: lead }, values, remeasured);
  if (r.ok) return { reading: r.reading, readingError: null, decision: r.decision as ReadingDecision | null, leadError: null as string | null };
  if (!r.reading) return { reading: null, readingError: r.readingError ?? null, decision: null, leadError: null };
  // Understood, but the test leads were not (or no engine temperature was measured on this path,
  // which the winding line below says): no verdict, and the answer cannot be sent.
  const leadError = r.code === 'bad-reading' ? `${r.message} ${r.readingError?.suggestion ?? ''}`.trim() : null;
  return { reading: r.reading, readingError: null, decision: null, leadError };
}

/** Reading entry: numeric keyboard by default, a letters toggle for codes such as 4K7. */
export function ReadingField({ step, values, remeasured, disabled, onChange }: {
  step: ReadingStep; values: Readonly<Record<string, FormulaValue>>; remeasured: number; disabled: boolean; onChange(v: ReadingValue): void;
}) {
  const id = useId();
  const fmt = useFormat();
  const [text, setText] = useState('');
  const [lead, setLead] = useState('');
  const [letters, setLetters] = useState(false);
  const input = useRef<HTMLInputElement>(null);
  const p = text.trim() ? preview(step, text, lead, values, remeasured) : null;
  const update = (t: string, l: string) => {
    setText(t); setLead(l);
    const r = t.trim() ? preview(step, t, l, values, remeasured) : null;
    onChange({ entered: t, leadEntered: l, valid: !!r?.decision });
  };
  const temp = step.winding ? values[step.winding.temperatureStep] : undefined;
  return (
    <div className="space-y-3">
      <label htmlFor={id} className="block text-lg font-bold">Reading ({step.unit})</label>
      <div className="flex items-stretch gap-2">
        <input ref={input} id={id} className={inputClass} inputMode={letters ? 'text' : 'decimal'} autoComplete="off" autoCapitalize="characters" spellCheck={false}
          value={text} disabled={disabled} aria-invalid={p ? !p.reading : undefined} aria-describedby={`${id}-feedback`}
          onChange={(e) => update(e.target.value, lead)} placeholder={`e.g. 0,4 or 4K7`} />
        <span className="flex min-w-14 items-center justify-center rounded-lg bg-ink px-3 text-xl font-bold text-white" aria-hidden>{step.unit}</span>
      </div>
      <button type="button" onClick={() => setLetters(!letters)} aria-pressed={letters}
        className="min-h-12 rounded-lg border-2 border-ink/60 bg-panel px-4 text-base font-semibold">
        {letters ? 'Number keypad' : 'Letters keypad (for 4K7, R47, 2k1)'}
      </button>
      <div id={`${id}-feedback`} aria-live="polite">
        {p?.readingError && <p className="rounded-lg bg-stop-soft p-3 text-lg text-ink"><strong className="text-stop">Not understood.</strong> {p.readingError.message} {p.readingError.suggestion}</p>}
        {p?.reading && <p className="text-lg">Understood as <strong data-testid="understood">{fmt.decimals(p.reading.understood)}</strong></p>}
      </div>
      {step.leadNull && (
        <div>
          <label htmlFor={`${id}-lead`} className="block text-base font-bold">Test leads shorted together (Ω) — subtracted from the reading</label>
          <input id={`${id}-lead`} className={inputClass} inputMode={letters ? 'text' : 'decimal'} autoComplete="off" value={lead} disabled={disabled}
            onChange={(e) => update(text, e.target.value)} placeholder="e.g. 0.3" />
          {p?.leadError && <p className="mt-1 text-stop">{p.leadError}</p>}
        </div>
      )}
      {step.winding && (
        <p className="text-base text-ink-soft">
          {temp ? `Corrected to ${step.winding.referenceTemperature} °C from the engine temperature ${fmt.reading({ value: temp.value, quantity: 'temperature' })} (copper winding).`
            : 'This reading is corrected for engine temperature, but no temperature was measured on this path.'}
        </p>
      )}
      {p?.decision && <VerdictPanel step={step} decision={p.decision} onRemeasure={() => { update('', lead); input.current?.focus(); }} />}
    </div>
  );
}
