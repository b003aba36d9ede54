import { limitsView } from '../limits-view';
import { lintFormulaShape } from '../lint-values';
import { bandOutlets, setBandBranch, withNext } from './common';
import type { KindTraits, Outlet } from './types';

/** Formula: the app computes a value from earlier ones and routes by its bands, or goes on to `next`. */
export const formula: KindTraits<'formula'> = {
  kind: 'formula',
  label: 'Formula',
  arrival: { on: 'compute' },
  check: false,
  ends: () => false,
  takesTime: false,
  boxHeight: 110,
  outlets(step) {
    const out: Outlet[] = bandOutlets(step.bands);
    // Both bands and a next is a soundness error; the canvas still shows the next so it can be removed.
    if (step.next !== undefined || out.length === 0) out.push({ handle: 'next', label: 'Next', kind: 'next', ...(step.next === undefined ? {} : { to: step.next }) });
    return out;
  },
  eachTarget(step, visit) {
    let i = 0;
    for (const b of step.bands) visit(b.next, i++);
    if (step.next !== undefined) visit(step.next, i);
  },
  setBranch(step, handle, to) {
    if (handle === 'next') return withNext(step, to);
    const bands = setBandBranch(step.bands, handle, to);
    return bands ? { ...step, bands } : step;
  },
  lint: lintFormulaShape,
  view: (step) => ({ quantity: step.quantity, unit: step.unit, ...(step.limits ? { limits: limitsView(step.limits, step.quantity, step.unit) } : {}) }),
};
