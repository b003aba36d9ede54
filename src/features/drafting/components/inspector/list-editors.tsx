import type { Answer, Part } from '@shared/schema';
import { Button } from '../../../../components/ui/button';
import { Input } from '../../../../components/ui/field';
import { UNCONNECTED } from '../../lib/edits';
import { freeId } from '../../lib/free-id';
import { TargetSelect } from './target-select';

/** The answers of an Observation: each is a branch. */
export function AnswersEditor({ answers, stepIds, disabled, onChange }: { answers: Answer[]; stepIds: string[]; disabled: boolean; onChange: (a: Answer[]) => void }) {
  const set = (i: number, patch: Partial<Answer>) => onChange(answers.map((a, j) => (j === i ? { ...a, ...patch } : a)));
  return (
    <fieldset disabled={disabled} className="flex flex-col gap-2">
      <legend className="font-semibold">Answers</legend>
      {answers.map((a, i) => (
        <div key={a.id} className="flex flex-col gap-1 rounded-lg border border-line p-2">
          <div className="flex items-center gap-2">
            <Input aria-label={`Answer ${i + 1}`} value={a.label} onChange={(e) => set(i, { label: e.target.value })} />
            <Button variant="ghost" aria-label={`Remove answer ${a.label}`} onClick={() => onChange(answers.filter((_, j) => j !== i))}>✕</Button>
          </div>
          <TargetSelect label={`Answer ${a.label} goes to`} value={a.next} stepIds={stepIds} onChange={(next) => set(i, { next })} />
        </div>
      ))}
      <Button variant="secondary" disabled={answers.length >= 8} onClick={() => onChange([...answers, { id: freeId(new Set(answers.map((a) => a.id)), 'answer'), label: `Answer ${answers.length + 1}`, next: UNCONNECTED }])}>Add answer</Button>
    </fieldset>
  );
}

/** Suggested parts of a Finding. */
export function PartsEditor({ parts, disabled, onChange }: { parts: Part[]; disabled: boolean; onChange: (p: Part[]) => void }) {
  const set = (i: number, patch: Partial<Part>) => onChange(parts.map((p, j) => (j === i ? { ...p, ...patch } : p)));
  return (
    <fieldset disabled={disabled} className="flex flex-col gap-2">
      <legend className="font-semibold">Parts</legend>
      {parts.map((p, i) => (
        <div key={i} className="grid grid-cols-[2fr_1fr_4rem_auto] items-center gap-1">
          <Input aria-label={`Part ${i + 1} name`} value={p.name} onChange={(e) => set(i, { name: e.target.value })} />
          <Input aria-label={`Part ${i + 1} number`} value={p.partNumber ?? ''} placeholder="Part no." onChange={(e) => set(i, { partNumber: e.target.value })} />
          <Input aria-label={`Part ${i + 1} quantity`} type="number" min={1} value={p.quantity} onChange={(e) => set(i, { quantity: Math.max(1, Number(e.target.value) || 1) })} />
          <Button variant="ghost" aria-label={`Remove part ${i + 1}`} onClick={() => onChange(parts.filter((_, j) => j !== i))}>✕</Button>
        </div>
      ))}
      <Button variant="secondary" onClick={() => onChange([...parts, { name: 'New part', quantity: 1 }])}>Add part</Button>
    </fieldset>
  );
}
