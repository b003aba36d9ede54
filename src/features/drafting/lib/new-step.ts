import type { Position, ProcedureDocument, Step, StepKind } from '@shared/schema';
import { KIND_EDITORS } from '../kinds';
import { freeId } from './free-id';

/** A new step of a kind as the palette drops it: sensible defaults, branches not yet connected. */
export function newStep(kind: StepKind, id: string, position: Position): Step {
  return KIND_EDITORS[kind].fresh(id, position);
}

/** Adds a step of `kind` at `position` with a free id; returns the step (not yet in the document). */
export function stepFor(doc: ProcedureDocument, kind: StepKind, position: Position): Step {
  return newStep(kind, freeId(new Set(doc.steps.map((s) => s.id)), KIND_EDITORS[kind].baseName), position);
}
