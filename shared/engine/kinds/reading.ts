import { limitsView } from '../limits-view';
import { lintReading } from '../lint-values';
import { bandOutlets, setBandBranch } from './common';
import type { KindTraits, Outlet } from './types';

/** Reading: the technician measures a value; its bands (and a borderline branch) route on. */
export const reading: KindTraits<'reading'> = {
  kind: 'reading',
  label: 'Reading',
  arrival: { on: 'answer' },
  check: true,
  ends: () => false,
  takesTime: true,
  boxHeight: 150,
  outlets(step) {
    const out: Outlet[] = bandOutlets(step.bands);
    if (step.borderline.action === 'branch') out.push({ handle: 'borderline', label: step.borderline.label, kind: 'borderline', to: step.borderline.next });
    return out;
  },
  eachTarget(step, visit) {
    let i = 0;
    for (const b of step.bands) visit(b.next, i++);
    if (step.borderline.action === 'branch') visit(step.borderline.next, i);
  },
  setBranch(step, handle, to) {
    if (handle === 'borderline') {
      const label = step.borderline.action === 'branch' ? step.borderline.label : 'Borderline';
      return { ...step, borderline: to ? { action: 'branch', next: to, label } : { action: 're-measure', attempts: 1 } };
    }
    const bands = setBandBranch(step.bands, handle, to);
    return bands ? { ...step, bands } : step;
  },
  lint: lintReading,
  view: (step) => ({
    quantity: step.quantity, unit: step.unit, leadNull: step.leadNull,
    ...(step.limits ? { limits: limitsView(step.limits, step.quantity, step.unit) } : {}),
    ...(step.winding ? { temperatureStep: step.winding.temperatureStep } : {}),
  }),
};
