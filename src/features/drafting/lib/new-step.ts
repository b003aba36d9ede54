import type { Position, ProcedureDocument, Step, StepKind } from '@shared/schema';
import { UNCONNECTED } from './edits';

const BASE_NAMES: Record<StepKind, string> = {
  reading: 'reading', observation: 'observation', task: 'task', formula: 'formula', finding: 'finding', handoff: 'handoff',
};

/** The first free id `<kind><n>` in the document (ids name steps in Formulas, so keep them short). */
export function freeId(taken: ReadonlySet<string>, base: string): string {
  for (let n = 1; ; n++) if (!taken.has(`${base}${n}`)) return `${base}${n}`;
}

const common = { instructions: '', safety: [], hazards: [] };

/** A new step of a kind as the palette drops it: sensible defaults, branches not yet connected. */
export function newStep(kind: StepKind, id: string, position: Position): Step {
  switch (kind) {
    case 'reading':
      return {
        ...common, id, position, kind, title: 'New reading', quantity: 'resistance', unit: 'Ω',
        limits: { kind: 'range', min: 0.2, max: 1 }, decision: 'simple', borderline: { action: 're-measure', attempts: 1 }, leadNull: false,
        bands: [
          { id: 'below', label: 'Below limits', upper: { value: 0.2, inclusive: false }, next: UNCONNECTED },
          { id: 'within', label: 'Within limits', lower: { value: 0.2, inclusive: true }, upper: { value: 1, inclusive: true }, next: UNCONNECTED },
          { id: 'above', label: 'Above limits', lower: { value: 1, inclusive: false }, next: UNCONNECTED },
        ],
      };
    case 'observation':
      return {
        ...common, id, position, kind, title: 'New observation', question: 'What do you see?',
        answers: [{ id: 'yes', label: 'Yes', next: UNCONNECTED }, { id: 'no', label: 'No', next: UNCONNECTED }],
      };
    case 'task':
      return { ...common, id, position, kind, title: 'New task', confirmLabel: 'Done' };
    case 'formula':
      return { ...common, id, position, kind, title: 'New formula', expression: '1', quantity: 'ratio', unit: '', bands: [] };
    case 'finding':
      return { ...common, id, position, kind, title: 'New finding', cause: 'Describe the cause', repair: '', parts: [] };
    case 'handoff':
      return { ...common, id, position, kind, title: 'Hand to a senior technician', reason: 'Describe why' };
  }
}

/** Adds a step of `kind` at `position` with a free id; returns the step (not yet in the document). */
export function stepFor(doc: ProcedureDocument, kind: StepKind, position: Position): Step {
  return newStep(kind, freeId(new Set(doc.steps.map((s) => s.id)), BASE_NAMES[kind]), position);
}
