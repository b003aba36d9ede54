import type { Position, ProcedureDocument, ProcedureMeta, Step, StepId } from '@shared/schema';
import { UNCONNECTED, retarget, setBranch } from '@shared/engine/kinds';

/** Where a drawn but unconnected branch points until the author connects it (the soundness check names it). */
export { UNCONNECTED };

/** Every change an author makes, as data: undo/redo and tests come from applying these. */
export type Edit =
  | { type: 'add-steps'; steps: Step[] }
  | { type: 'remove-steps'; ids: StepId[] }
  | { type: 'update-step'; id: StepId; step: Step }
  | { type: 'move-steps'; moves: { id: StepId; position: Position }[] }
  | { type: 'connect'; from: StepId; handle: string; to: StepId }
  | { type: 'disconnect'; from: StepId; handle: string }
  | { type: 'set-start'; id: StepId }
  | { type: 'set-meta'; meta: ProcedureMeta }
  | { type: 'replace'; document: ProcedureDocument };

/** Sets (or with `to` undefined, clears) the branch behind one handle of a step. */
export { setBranch };

function mapSteps(doc: ProcedureDocument, fn: (s: Step) => Step): ProcedureDocument {
  return { ...doc, steps: doc.steps.map(fn) };
}

function removeSteps(doc: ProcedureDocument, ids: StepId[]): ProcedureDocument {
  const gone = new Set(ids);
  let steps = doc.steps.filter((s) => !gone.has(s.id));
  if (steps.length === 0) return doc; // a document keeps at least one step
  for (const id of gone) steps = steps.map((s) => retarget(s, id, undefined));
  const start = gone.has(doc.start) ? steps[0]!.id : doc.start;
  return { ...doc, start, steps };
}

function updateStep(doc: ProcedureDocument, id: StepId, step: Step): ProcedureDocument {
  const renamed = step.id !== id;
  const steps = doc.steps.map((s) => (s.id === id ? step : renamed ? retarget(s, id, step.id) : s));
  return { ...doc, steps, start: renamed && doc.start === id ? step.id : doc.start };
}

/**
 * Applies one edit; pure, so the editor's history is a list of documents.
 * Example: `applyEdit(doc, { type: 'connect', from: 'plugGap', handle: 'next', to: 'coil' })`.
 */
export function applyEdit(doc: ProcedureDocument, edit: Edit): ProcedureDocument {
  switch (edit.type) {
    case 'add-steps':
      return { ...doc, steps: [...doc.steps, ...edit.steps] };
    case 'remove-steps':
      return removeSteps(doc, edit.ids);
    case 'update-step':
      return updateStep(doc, edit.id, edit.step);
    case 'move-steps': {
      const at = new Map(edit.moves.map((m) => [m.id, m.position]));
      return mapSteps(doc, (s) => (at.has(s.id) ? { ...s, position: at.get(s.id)! } : s));
    }
    case 'connect':
      if (edit.from === edit.to) return doc;
      return mapSteps(doc, (s) => (s.id === edit.from ? setBranch(s, edit.handle, edit.to) : s));
    case 'disconnect':
      return mapSteps(doc, (s) => (s.id === edit.from ? setBranch(s, edit.handle, undefined) : s));
    case 'set-start':
      return doc.steps.some((s) => s.id === edit.id) ? { ...doc, start: edit.id } : doc;
    case 'set-meta':
      return { ...doc, meta: edit.meta };
    case 'replace':
      return edit.document;
  }
}

export interface History {
  readonly past: readonly ProcedureDocument[];
  readonly present: ProcedureDocument;
  readonly future: readonly ProcedureDocument[];
}

export type HistoryAction = { type: 'edit'; edit: Edit } | { type: 'undo' } | { type: 'redo' } | { type: 'reset'; document: ProcedureDocument };

const DEPTH = 200;

/** Undo/redo over applyEdit; an edit that changes nothing leaves no history entry. */
export function historyReducer(h: History, action: HistoryAction): History {
  switch (action.type) {
    case 'edit': {
      const next = applyEdit(h.present, action.edit);
      if (next === h.present) return h;
      return { past: [...h.past, h.present].slice(-DEPTH), present: next, future: [] };
    }
    case 'undo':
      if (h.past.length === 0) return h;
      return { past: h.past.slice(0, -1), present: h.past[h.past.length - 1]!, future: [h.present, ...h.future] };
    case 'redo':
      if (h.future.length === 0) return h;
      return { past: [...h.past, h.present], present: h.future[0]!, future: h.future.slice(1) };
    case 'reset':
      return { past: [], present: action.document, future: [] };
  }
}

export const initialHistory = (document: ProcedureDocument): History => ({ past: [], present: document, future: [] });
