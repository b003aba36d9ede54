import { withNext } from './common';
import type { KindTraits, Outlet } from './types';

/**
 * "Continue in": the diagnosis goes on in another procedure of the shop. On its own it is a
 * possible ending (the other procedure may end the diagnosis) with an optional way back; joined
 * with the other procedure (`joinLinked`) it passes straight on to that procedure's first step.
 */
export const link: KindTraits<'link'> = {
  kind: 'link',
  label: 'Continue in',
  arrival: { on: 'compute' },
  check: false,
  ends: (step) => step.next === undefined,
  takesTime: false,
  boxHeight: 110,
  outlets(step) {
    const out: Outlet[] = [];
    if (step.next !== undefined) out.push({ handle: 'next', label: 'Continue', kind: 'next', to: step.next });
    else out.push({ handle: 'back', label: 'Back here', kind: 'next', ...(step.back === undefined ? {} : { to: step.back }) });
    return out;
  },
  eachTarget(step, visit) {
    const to = step.next ?? step.back;
    if (to !== undefined) visit(to, 0);
  },
  setBranch(step, handle, to) {
    if (handle === 'next') return withNext(step, to);
    if (handle !== 'back') return step;
    const { back: _drop, ...rest } = step;
    return to === undefined ? rest : { ...rest, back: to };
  },
  lint: () => [],
  view: (step) => ({ procedure: step.procedure }),
};
