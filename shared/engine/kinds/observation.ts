import { duplicateHandles } from '../lint-values';
import { finding, named, type LintFinding } from '../lint-types';
import { UNCONNECTED } from './common';
import type { KindTraits } from './types';

/** Observation: the technician says what they see or hear; one branch per answer. */
export const observation: KindTraits<'observation'> = {
  kind: 'observation',
  label: 'Observation',
  arrival: { on: 'answer' },
  check: true,
  ends: () => false,
  takesTime: true,
  boxHeight: 150,
  outlets: (step) => step.answers.map((a) => ({ handle: `answer:${a.id}`, label: a.label, kind: 'answer', to: a.next })),
  eachTarget(step, visit) {
    let i = 0;
    for (const a of step.answers) visit(a.next, i++);
  },
  setBranch(step, handle, to) {
    if (!handle.startsWith('answer:')) return step;
    const id = handle.slice(7);
    return { ...step, answers: step.answers.map((a) => (a.id === id ? { ...a, next: to ?? UNCONNECTED } : a)) };
  },
  lint(step) {
    const out: LintFinding[] = duplicateHandles(step, step.answers.map((a) => a.id), 'answers');
    if (step.answers.length === 1) {
      out.push(finding('single-answer', 'warning', [step.id], `${named(step)} offers only one answer; make it a Task, or add the other answers.`));
    }
    return out;
  },
  view: (step) => ({ question: step.question, answers: step.answers.map(({ id, label }) => ({ id, label })) }),
};
