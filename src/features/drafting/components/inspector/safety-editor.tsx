import { HAZARDS, SIGNAL_WORDS, type Hazard, type SafetyNote } from '@shared/schema';
import { Button } from '../../../../components/ui/button';
import { Select, Textarea } from '../../../../components/ui/field';

const HAZARD_LABELS: Record<Hazard, string> = {
  'high-voltage': 'High voltage', 'fuel-vapour': 'Fuel vapour', 'moving-parts': 'Moving parts', 'hot-surface': 'Hot surface',
};

/** Safety notes with their ANSI Z535 / ISO 3864 signal word, and the hazards that call for them. */
export function SafetyEditor({ notes, hazards, disabled, onChange }: {
  notes: SafetyNote[]; hazards: Hazard[]; disabled: boolean; onChange: (v: { safety: SafetyNote[]; hazards: Hazard[] }) => void;
}) {
  const setNote = (i: number, patch: Partial<SafetyNote>) => onChange({ hazards, safety: notes.map((n, j) => (j === i ? { ...n, ...patch } : n)) });
  return (
    <fieldset disabled={disabled} className="flex flex-col gap-2">
      <legend className="font-semibold">Safety</legend>
      <div className="flex flex-wrap gap-x-3 gap-y-1">
        {HAZARDS.map((h) => (
          <label key={h} className="flex min-h-9 items-center gap-1 text-sm">
            <input type="checkbox" checked={hazards.includes(h)} onChange={(e) => onChange({ safety: notes, hazards: e.target.checked ? [...hazards, h] : hazards.filter((x) => x !== h) })} />
            {HAZARD_LABELS[h]}
          </label>
        ))}
      </div>
      {notes.map((n, i) => (
        <div key={i} className="flex flex-col gap-1 rounded-lg border border-line p-2">
          <div className="flex items-center gap-2">
            <Select aria-label={`Signal word of note ${i + 1}`} value={n.signal} onChange={(e) => setNote(i, { signal: e.target.value as SafetyNote['signal'] })} className="w-36 font-bold">
              {SIGNAL_WORDS.map((w) => <option key={w} value={w}>{w}</option>)}
            </Select>
            <Button variant="ghost" aria-label={`Remove safety note ${i + 1}`} onClick={() => onChange({ hazards, safety: notes.filter((_, j) => j !== i) })}>✕</Button>
          </div>
          <Textarea aria-label={`Text of safety note ${i + 1}`} value={n.text} rows={2} onChange={(e) => setNote(i, { text: e.target.value })} />
        </div>
      ))}
      <Button variant="secondary" onClick={() => onChange({ hazards, safety: [...notes, { signal: 'WARNING', text: 'Say what the hazard is and how to avoid it' }] })}>Add safety note</Button>
    </fieldset>
  );
}
