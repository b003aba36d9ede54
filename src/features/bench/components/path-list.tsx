import { memo, useState } from 'react';
import type { ProcedureDocument } from '@shared/schema/procedure';
import type { PathStep } from '@shared/engine/walk';
import type { LocaleFormat } from '@shared/format/locale';
import { useFormat } from '../../../lib/format';

const VERDICT: Record<string, string> = {
  within: 'within', below: 'below', above: 'above', 'borderline-low': 'borderline', 'borderline-high': 'borderline',
};

function answerText(doc: ProcedureDocument, p: PathStep, fmt: LocaleFormat): string {
  const step = doc.steps.find((s) => s.id === p.stepId);
  if (p.kind === 'observation' && step?.kind === 'observation' && p.answer?.kind === 'observation') {
    const id = p.answer.answerId;
    return step.answers.find((a) => a.id === id)?.label ?? id;
  }
  if ((p.kind === 'reading' || p.kind === 'formula') && p.value !== undefined && step && (step.kind === 'reading' || step.kind === 'formula')) {
    const shown = fmt.reading({ value: p.value, quantity: step.quantity, significantDigits: 3 });
    const typed = p.reading ? `${p.reading.text} → ` : 'computed: ';
    return `${typed}${shown}${p.decision?.verdict ? ` (${VERDICT[p.decision.verdict]})` : ''}`;
  }
  if (p.kind === 'link') return `continued in ${step?.kind === 'link' ? (step.procedureTitle ?? step.procedure) : 'another procedure'}`;
  return p.kind === 'task' ? 'done' : '';
}

/**
 * One step of the path. Memoised: the walk goes on from the last step, so the steps before keep
 * their objects and a tap draws only the new one.
 */
const PathItem = memo(function PathItem({ doc, fmt, step: p, place: i, change }: { doc: ProcedureDocument; fmt: LocaleFormat; step: PathStep; place: number; change: ((i: number) => void) | null }) {
  const title = doc.steps.find((s) => s.id === p.stepId)?.title ?? p.stepId;
  return (
    <li className="flex items-center gap-3 rounded-lg border border-line bg-panel p-2">
      <span className="flex h-8 w-8 shrink-0 items-center justify-center rounded-full bg-ink text-base font-bold text-white">{i + 1}</span>
      <span className="min-w-0 flex-1"><span className="block font-semibold">{title}</span><span className="block text-ink-soft">{answerText(doc, p, fmt)}</span></span>
      {change && (
        <button type="button" onClick={() => change(i)} className="min-h-12 min-w-20 rounded-lg border-2 border-ink px-3 font-semibold" aria-label={`Change ${title}`}>Change</button>
      )}
    </li>
  );
});

/**
 * The path so far. Going back sits behind one control, so a gloved tap near the main button never
 * reopens a step; once the diagnosis has ended (`closed`) nothing can be changed from here.
 */
export function PathList({ doc, path, closed, onChange }: { doc: ProcedureDocument; path: readonly PathStep[]; closed: boolean; onChange(index: number): void }) {
  const [choosing, setChoosing] = useState(false);
  const fmt = useFormat();
  const shown = path.filter((p) => p.outcome !== 'ended');
  if (!shown.length) return null;
  const changeable = !closed && shown.some((p) => p.entryIndex !== null);
  const choose = (i: number) => { setChoosing(false); onChange(i); };
  return (
    // Below the step on a phone: skipped by layout and paint until scrolled near (drawing the next step costs less).
    <section aria-labelledby="path-title" className="space-y-2 [contain-intrinsic-size:auto_30rem] [content-visibility:auto]">
      <h2 id="path-title" className="text-xl font-bold">Steps so far</h2>
      <ol className="space-y-2">
        {shown.map((p, i) => <PathItem key={i} doc={doc} fmt={fmt} step={p} place={i} change={choosing && changeable && p.entryIndex !== null ? choose : null} />)}
      </ol>
      {changeable && (
        <button type="button" aria-expanded={choosing} onClick={() => setChoosing(!choosing)}
          className="min-h-12 w-full rounded-lg border-2 border-dashed border-ink/60 bg-paper px-3 text-lg font-semibold">
          {choosing ? 'Keep the answers as they are' : 'Change an earlier answer…'}
        </button>
      )}
    </section>
  );
}
