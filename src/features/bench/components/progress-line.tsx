import type { ProcedureDocument } from '@shared/schema/procedure';
import type { PathStep } from '@shared/engine/walk';
import type { StepFigures } from '@shared/engine/figures';
import { branchJump, stepsToGo } from '@shared/engine/progress';

export interface Progress {
  /** "about 1–8 more after this one", or null when no estimate can be given (a loop, or the end). */
  readonly toGo: string | null;
  /** Why the estimate moved with the last answer, or why it is a range. */
  readonly why: string | null;
  /** 0–100 for the bar: done against done plus the middle of the range. */
  readonly percent: number;
}

/** The branch the last answered step took: that step and the step the path went to from it. */
function lastBranch(path: readonly PathStep[], currentId: string): { from: string; to: string } | null {
  for (let i = path.length - 1; i >= 0; i--) {
    const p = path[i]!;
    if (p.outcome === 'computed' || p.outcome === 'ended') continue;
    return { from: p.stepId, to: path[i + 1]?.stepId ?? currentId };
  }
  return null;
}

/**
 * The progress line from the path figures: the steps likely after this one as a range over its
 * branches, and, when the last answer moved the estimate by a step or more, the reason.
 */
export function progressOf(doc: ProcedureDocument, perStep: Readonly<Record<string, StepFigures>>, path: readonly PathStep[], currentId: string | null, done: number): Progress {
  if (!currentId) return { toGo: null, why: null, percent: 100 };
  const range = stepsToGo(doc, perStep, currentId);
  if (!range) return { toGo: null, why: 'This part of the procedure may repeat, so no estimate of the steps left.', percent: 50 };
  const toGo = range.low === range.high ? `about ${range.low} more after this one` : `about ${range.low}–${range.high} more after this one`;
  const last = lastBranch(path, currentId);
  const jump = last ? branchJump(perStep, last.from, last.to) : 0;
  let why: string | null = null;
  if (jump >= 1) why = 'Up from before: this answer leads to the longer branch.';
  else if (jump <= -1) why = 'Down from before: this answer leads to a shorter branch.';
  else if (range.low !== range.high) why = 'Depends on the answer to this step.';
  const middle = (range.low + range.high) / 2;
  return { toGo, why, percent: Math.round((100 * done) / Math.max(1, done + 1 + middle)) };
}
