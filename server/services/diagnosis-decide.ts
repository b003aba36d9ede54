import type { ProcedureDocument, Step } from '@shared/schema/procedure';
import { ProcedureWalk, type PathStep, type WalkProblem } from '@shared/engine/walk';
import { walkEntryOf } from '@shared/engine/step-entry';
import { limitsView } from '@shared/engine/step-view';
import type { DiagnosisStepBody, StepShown } from '@shared/schema/bench';
import { recordedBranch, resolveLimits, type Verdict } from '@shared/measure/verdict';
import { QUANTITY_INFO } from '@shared/measure/quantities';
import { AppError, badRequest } from '../lib/errors';

/** An answered step on the current path (not superseded), oldest first, as stored. */
export interface PathRow {
  id: string; seq: number; stepId: string; next: string | null;
  entered: string | null; lead: string | null; answerId: string | null; acknowledged: boolean;
}

/** The fields of an arriving step body that decide it (the Bench contract's step body). */
export type StepAnswer = Pick<DiagnosisStepBody, 'stepId' | 'entered' | 'leadEntered' | 'answerId' | 'acknowledged' | 'acknowledgedAt'>;

export interface DecidedStep {
  entered: string | null; value: number | null; unit: string | null; verdict: Verdict | null;
  bandId: string | null; answerId: string | null; next: string | null;
  shown: StepShown;
}

export { withMeter, type MeterEntry } from '@shared/engine/meter';

// The record keeps the limits in the words the step screen showed them (the shared limitsView).
function limitsText(step: Extract<Step, { kind: 'reading' | 'formula' }>): string {
  return step.limits ? limitsView(step.limits, step.quantity, step.unit).text : '';
}

/** What the screen showed for a step, rebuilt from the pinned version so the record can be trusted. */
export function shownOf(step: Step): StepShown {
  const base = { title: step.title, instructions: step.instructions, safety: step.safety };
  switch (step.kind) {
    case 'reading':
    case 'formula':
      return { ...base, quantity: step.quantity, unit: step.unit, limits: step.limits ? resolveLimits(step.limits) : {}, limitsText: limitsText(step) };
    case 'observation': return { ...base, question: step.question, answers: step.answers.map((a) => ({ id: a.id, label: a.label })) };
    case 'task': return { ...base, confirmLabel: step.confirmLabel };
    case 'finding': return { ...base, cause: step.cause, repair: step.repair, parts: step.parts };
    case 'handoff': return { ...base, reason: step.reason };
    case 'link': return { ...base, procedure: step.procedure, ...(step.procedureTitle ? { procedureTitle: step.procedureTitle } : {}), ...(step.entry ? { entry: step.entry } : {}) };
  }
}

function refusal(p: WalkProblem): AppError {
  if (p.code === 'bad-reading') {
    const e = p.readingError;
    return badRequest(e ? `${e.message} ${e.suggestion}` : p.message, [{ path: 'entered', message: p.message }]);
  }
  if (p.code === 'unknown-answer' || p.code === 'wrong-kind') return badRequest(p.message, [{ path: 'answerId', message: p.message }]);
  if (p.code === 'wrong-step') return new AppError(422, 'branch_not_allowed', `The procedure does not lead there from the step this answer follows: ${p.message} Reload the diagnosis.`);
  const code = p.code === 'not-acknowledged' ? 'not_acknowledged' : p.code.replace(/-/g, '_');
  return new AppError(422, code, p.message);
}

function decided(step: Step, p: PathStep, answer: StepAnswer): DecidedStep {
  const route = p.decision?.route;
  const isValue = step.kind === 'reading' || step.kind === 'formula';
  return {
    entered: step.kind === 'reading' ? answer.entered ?? null : null,
    value: p.value ?? null,
    unit: isValue ? QUANTITY_INFO[step.quantity].base : null,
    verdict: p.decision?.verdict ?? null,
    bandId: recordedBranch(route),
    answerId: step.kind === 'observation' ? answer.answerId ?? null : null,
    next: p.next,
    shown: {
      ...shownOf(step),
      ...(p.decision ? { interval: p.decision.interval, corrections: p.decision.corrections, route: p.outcome } : {}),
      ...(answer.leadEntered ? { leadEntered: answer.leadEntered } : {}),
      ...(answer.acknowledged ? { acknowledged: true, ...(answer.acknowledgedAt ? { acknowledgedAt: answer.acknowledgedAt } : {}) } : {}),
    },
  };
}

/** The walk over the stored path, checked to replay exactly as stored. */
function replay(doc: ProcedureDocument, steps: ReadonlyMap<string, Step>, keep: readonly PathRow[]): ProcedureWalk {
  const walk = ProcedureWalk.start(doc);
  for (const r of keep) {
    const entry = walkEntryOf(steps.get(r.stepId), { ...r, leadEntered: r.lead });
    if (entry && walk.take(entry).status !== 'applied') break;
  }
  const replayed = walk.record.every((r) => r.status === 'applied') && keep.every((r, i) => walk.path[i]?.stepId === r.stepId);
  if (!replayed) throw new AppError(422, 'record_mismatch', 'The stored answers no longer replay on this procedure version. Hand the machine to a senior technician.');
  return walk;
}

/**
 * Re-decides an arriving answer with the shared walker over the pinned version: the stored path
 * up to the step it follows, then this answer. The walker parses the reading, applies lead null,
 * temperature correction and the meter's uncertainty, computes Formulas and picks the branch, so
 * the server and the phone cannot disagree. Throws a 400/422 AppError the technician can act on.
 *
 * `prior` is the walk over exactly `keep`, when the caller kept one from the previous answer: it is
 * forked, not replayed. The returned walk includes this answer.
 */
export function decideStep(
  doc: ProcedureDocument, steps: ReadonlyMap<string, Step>, keep: readonly PathRow[], answer: StepAnswer, prior?: ProcedureWalk,
): { decided: DecidedStep; walk: ProcedureWalk } {
  const step = steps.get(answer.stepId)!;
  const walk = prior ? prior.fork() : replay(doc, steps, keep);
  const at = keep.length;
  const entry = walkEntryOf(step, answer);
  // An answer is for the step the walk stands at; going back is said with `after`, not here. An
  // answer for another step is not taken: the path check below names the step that comes next.
  const forAnotherStep = walk.status === 'in-progress' && walk.current?.id !== answer.stepId;
  if (entry && !forAnotherStep) {
    const taken = walk.take(entry);
    if (taken.status === 'rejected' && taken.problem) throw refusal(taken.problem);
  }
  const p = walk.path[at];
  if (!p || p.stepId !== answer.stepId) {
    if (walk.status === 'stuck' && walk.problem) throw refusal(walk.problem);
    throw new AppError(422, 'branch_not_allowed', `The procedure does not lead to "${answer.stepId}" from there${walk.path[at] ? `; the next step is "${walk.path[at]!.stepId}"` : walk.current ? `; the next step is "${walk.current.id}"` : ''}. Reload the diagnosis.`);
  }
  if (p.outcome === 'stuck') throw refusal(walk.problem ?? { code: 'no-band', message: `No band of ${step.title} covers that value.` });
  return { decided: decided(step, p, answer), walk };
}
