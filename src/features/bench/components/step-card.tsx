import { useRef, useState, type ReactNode } from 'react';
import type { Step } from '@shared/schema/procedure';
import type { StepView } from '@shared/engine/step-view';
import type { FormulaValue } from '@shared/measure/formula';
import { SafetyNote, LimitsNotice, saysServiceDataFirst } from '../../../components/ui/safety';
import type { ReadingValue } from './reading-field';
import { StepPictures } from './step-pictures';
import { AnswerControls, type Send } from './answer-controls';
import type { Answer } from '../hooks/use-local-diagnosis';
import { useFormat } from '../../../lib/format';


/** The mark a DANGER note keeps once acknowledged, so the step shows it was read and when. */
function AcknowledgedMark({ at }: { at: string }) {
  const fmt = useFormat();
  return (
    <p data-testid="acknowledged-mark" className="flex min-h-12 items-center gap-2 rounded-lg border-2 border-danger bg-paper px-3 text-lg font-bold text-ink">
      <span aria-hidden className="text-2xl leading-none text-danger">✓</span>Acknowledged at {fmt.time(at)}
    </p>
  );
}

/** Safety notes most severe first; a DANGER note locks the step until it is acknowledged. */
export function SafetyBlock({ view, acknowledgedAt, onAcknowledge, locks = true }: { view: StepView; acknowledgedAt: string | null; onAcknowledge(): void; locks?: boolean }) {
  const dangerAction = !locks ? undefined : acknowledgedAt
    ? <AcknowledgedMark at={acknowledgedAt} />
    : <button type="button" onClick={onAcknowledge} className="min-h-12 w-full rounded-lg bg-danger px-4 text-lg font-bold text-white">I have read this and will keep clear</button>;
  return (
    <div className="space-y-2">
      {view.safety.map((n, i) => (
        <SafetyNote key={i} signal={n.signal} action={n.signal === 'DANGER' ? dangerAction : undefined}>
          {n.text}
        </SafetyNote>
      ))}
    </div>
  );
}

export function LimitsBox({ view }: { view: StepView }) {
  const fmt = useFormat();
  if (!view.limits) return null;
  return (
    <div className="rounded-lg border-2 border-ink/20 bg-panel p-3" data-testid="limits-box">
      <p className="text-lg">Limits: <strong className="text-xl">{fmt.decimals(view.limits.text)}</strong></p>
      {/* The service-data sentence once: the procedure's own note when it says it, else ours. */}
      {view.limitsNote && <p className="text-base text-ink-soft" data-testid="limits-note">{view.limitsNote}</p>}
      {!saysServiceDataFirst(view.limitsNote) && <LimitsNotice className="text-base" />}
    </div>
  );
}

/** One step to answer: instruction, safety, limits, then the control its kind asks for. */
export function StepCard({ view, step, values, remeasure, remeasured, extras, onAnswer }: {
  view: StepView; step: Step; values: Readonly<Record<string, FormulaValue>>; remeasure: boolean; remeasured: number;
  extras: (note: string, setNote: (n: string) => void) => ReactNode;
  onAnswer(a: Omit<Answer, 'startedAt'>): Promise<void>;
}) {
  const [acknowledgedAt, setAcknowledgedAt] = useState<string | null>(null);
  const acknowledged = !view.mustAcknowledge || acknowledgedAt !== null;
  const [reading, setReading] = useState<ReadingValue>({ entered: '', leadEntered: '', valid: false });
  const [note, setNote] = useState('');
  // A second tap while the answer is being kept is ignored. A ref, not state: re-rendering the card
  // to disable it would cost a frame on a slow phone just before the next step replaces it.
  const sending = useRef(false);
  const locked = !acknowledged;
  const send: Send = async (a) => {
    if (sending.current) return;
    sending.current = true;
    performance.mark('bench:answer');
    try {
      await onAnswer({ stepId: view.id, note, acknowledged: view.mustAcknowledge ? acknowledged : false, ...(view.mustAcknowledge && acknowledgedAt ? { acknowledgedAt } : {}), ...a });
    } finally {
      sending.current = false;
    }
  };
  return (
    <article className="space-y-4" aria-labelledby="step-title" data-kind={view.kind}>
      <h2 id="step-title" className="text-2xl font-black leading-tight">{view.title}</h2>
      <SafetyBlock view={view} acknowledgedAt={acknowledgedAt} onAcknowledge={() => setAcknowledgedAt(new Date().toISOString())} />
      {view.instructions && <p className="text-xl leading-snug">{view.instructions}</p>}
      <StepPictures pictures={step.pictures} />
      {remeasure && <p className="rounded-lg bg-edge-soft p-3 text-lg font-semibold text-ink">The last reading was borderline: measure again.</p>}
      <LimitsBox view={view} />
      {extras(note, setNote)}
      <fieldset disabled={locked} className="space-y-3">
        <legend className="sr-only">Answer</legend>
        {locked && (
          <p data-testid="locked-reason" className="flex items-start gap-2 rounded-lg border-l-8 border-danger bg-paper p-3 text-lg font-semibold text-ink">
            <span aria-hidden className="inline-flex h-7 w-7 shrink-0 items-center justify-center rounded-full bg-danger text-base font-black text-white">!</span>
            <span>Answers are locked until you acknowledge the DANGER note above (“I have read this and will keep clear”).</span>
          </p>
        )}
        <AnswerControls view={view} step={step} values={values} remeasured={remeasured} locked={locked} reading={reading} onReading={setReading} send={send} />
      </fieldset>
    </article>
  );
}
