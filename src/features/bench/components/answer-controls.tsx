import type { ReactNode } from 'react';
import type { Step, StepKind } from '@shared/schema/procedure';
import type { StepOf } from '@shared/engine/kinds';
import type { StepView } from '@shared/engine/step-view';
import type { FormulaValue } from '@shared/measure/formula';
import { ReadingField, type ReadingValue } from './reading-field';
import type { Answer } from '../hooks/use-local-diagnosis';

const big = 'w-full min-h-16 rounded-xl px-5 text-xl font-bold text-left disabled:opacity-40';

export type Send = (a: Partial<Omit<Answer, 'startedAt'>>) => Promise<void>;

interface ControlProps<S extends Step> {
  view: StepView;
  step: S;
  values: Readonly<Record<string, FormulaValue>>;
  remeasured: number;
  locked: boolean;
  reading: ReadingValue;
  onReading(r: ReadingValue): void;
  send: Send;
}

/**
 * The control each kind asks for on the phone, keyed by kind (a kind left out does not compile).
 * Null: the technician never answers it on a step card (a Formula is computed, a link passes on
 * to its other procedure; a Finding or Hand-off shows the ending form).
 */
export const ANSWER_CONTROLS: { readonly [K in StepKind]: ((props: ControlProps<StepOf<K>>) => ReactNode) | null } = {
  reading: ({ step, values, remeasured, locked, reading, onReading, send }) => (
    <>
      <ReadingField step={step} values={values} remeasured={remeasured} disabled={locked} onChange={onReading} />
      <button type="button" className={`${big} bg-ink text-white`} disabled={!reading.valid}
        onClick={() => void send({ entered: reading.entered, ...(reading.leadEntered.trim() ? { leadEntered: reading.leadEntered } : {}) })}>
        Save reading and continue
      </button>
    </>
  ),
  observation: ({ view, send }) => (
    <>
      <p className="text-xl font-bold">{view.question}</p>
      <div className="grid gap-3">
        {view.answers?.map((a) => (
          <button key={a.id} type="button" className={`${big} border-4 border-ink bg-panel text-ink hover:bg-signal-soft`} onClick={() => void send({ answerId: a.id })}>{a.label}</button>
        ))}
      </div>
    </>
  ),
  task: ({ view, send }) => (
    <button type="button" className={`${big} bg-ink text-white`} onClick={() => void send({})}>{view.confirmLabel ?? 'Done'}</button>
  ),
  formula: null,
  finding: null,
  handoff: null,
  link: null,
};

/** The control the step's kind asks for: a reading, one answer of an observation, or done. */
export function AnswerControls(props: ControlProps<Step>) {
  // One cast: TypeScript cannot follow the union of steps into the keyed table by itself.
  const Controls = ANSWER_CONTROLS[props.step.kind] as ((p: ControlProps<Step>) => ReactNode) | null;
  return Controls ? <Controls {...props} /> : null;
}
