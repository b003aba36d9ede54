import { withNext } from './common';
import type { KindTraits } from './types';

/** Task: the technician does something and confirms; one way on. */
export const task: KindTraits<'task'> = {
  kind: 'task',
  label: 'Task',
  arrival: { on: 'answer' },
  check: false,
  ends: () => false,
  takesTime: true,
  boxHeight: 110,
  outlets: (step) => [{ handle: 'next', label: step.confirmLabel, kind: 'next', ...(step.next === undefined ? {} : { to: step.next }) }],
  eachTarget(step, visit) {
    if (step.next !== undefined) visit(step.next, 0);
  },
  setBranch: (step, handle, to) => (handle === 'next' ? withNext(step, to) : step),
  lint: () => [],
  view: (step) => ({ confirmLabel: step.confirmLabel }),
};
