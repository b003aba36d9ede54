import { endingTraits } from './common';
import type { KindTraits } from './types';

/** Hand-off: ends the diagnosis by handing the machine to a senior technician, with a reason. */
export const handoff: KindTraits<'handoff'> = {
  kind: 'handoff',
  label: 'Hand-off',
  ...endingTraits('handed_off'),
  lint: () => [],
  view: (step) => ({ reason: step.reason }),
};
