import type { Step } from '../schema/procedure';
import type { DiagnosisStepBody, RecordStep } from '../schema/bench';
import type { WalkEntry } from './walk';

/** What was entered at an answered step: the fields of a step body that the walker reads. */
export type EnteredAnswer = Pick<DiagnosisStepBody, 'stepId' | 'acknowledged'> & {
  readonly entered?: string | null | undefined;
  readonly leadEntered?: string | null | undefined;
  readonly answerId?: string | null | undefined;
};

/**
 * The walker's entry for an answered step, on the phone (its rows) and on the server (the stored
 * path and the arriving answer) alike; Formulas are computed and endings end, so they need none.
 * Example: walkEntryOf(coilStep, { stepId: 'coil', entered: '0,4' })
 * → { stepId: 'coil', acknowledged: false, answer: { kind: 'reading', text: '0,4' } }
 */
export function walkEntryOf(step: Step | undefined, a: EnteredAnswer): WalkEntry | null {
  const acknowledged = a.acknowledged ?? false;
  if (step?.kind === 'reading') return { stepId: a.stepId, acknowledged, answer: { kind: 'reading', text: a.entered ?? '', ...(a.leadEntered ? { leadText: a.leadEntered } : {}) } };
  if (step?.kind === 'observation') return { stepId: a.stepId, acknowledged, answer: { kind: 'observation', answerId: a.answerId ?? '' } };
  if (step?.kind === 'task') return { stepId: a.stepId, acknowledged, answer: { kind: 'task' } };
  return null;
}

/**
 * What was entered at a step of the record, as a step body holds it: the typed reading (Readings
 * only), the test-lead reading, the answer and the DANGER acknowledgement. A phone taking over a
 * diagnosis rebuilds its rows with it; the server's path read does the same in SQL.
 * Example: enteredOf(record.steps[0]) → { entered: '0,4', leadEntered: '0.3' }
 */
export function enteredOf(s: Pick<RecordStep, 'kind' | 'entered' | 'answerId' | 'shown'>): { entered?: string; leadEntered?: string; answerId?: string; acknowledged?: true } {
  return {
    ...(s.kind === 'reading' && s.entered !== null ? { entered: s.entered } : {}),
    ...(s.shown.leadEntered ? { leadEntered: s.shown.leadEntered } : {}),
    ...(s.answerId ? { answerId: s.answerId } : {}),
    ...(s.shown.acknowledged ? { acknowledged: true as const } : {}),
  };
}
