import type { ProcedureDocument, SafetyNote, Step, StepKind } from '../schema/procedure';
import { viewOf, type KindView } from './kinds';

export { limitsView, type LimitsView } from './limits-view';

/** Everything the Bench shows for one step: the common fields and those of its kind. */
export interface StepView extends KindView {
  readonly id: string;
  readonly kind: StepKind;
  readonly title: string;
  readonly instructions: string;
  /** Most severe first. */
  readonly safety: readonly SafetyNote[];
  /** A DANGER note must be acknowledged before the step can be answered. */
  readonly mustAcknowledge: boolean;
  readonly limitsNote: string;
}

const ORDER = { DANGER: 0, WARNING: 1, CAUTION: 2, NOTICE: 3 } as const;

/**
 * What the technician must see at a step. Example: `stepView(doc, doc.steps[0]).safety[0].signal` is 'DANGER'
 * for a step with a DANGER note.
 */
export function stepView(doc: ProcedureDocument, step: Step): StepView {
  const safety = [...step.safety].sort((a, b) => ORDER[a.signal] - ORDER[b.signal]);
  const base = {
    id: step.id, kind: step.kind, title: step.title, instructions: step.instructions, safety,
    mustAcknowledge: safety.some((n) => n.signal === 'DANGER'), limitsNote: doc.meta.limitsNote,
  };
  return { ...base, ...viewOf(step) };
}
