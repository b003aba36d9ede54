import { finding as lintFinding, named } from '../lint-types';
import { endingTraits } from './common';
import type { KindTraits } from './types';

/** Finding: ends the diagnosis with the cause, the repair and suggested parts. */
export const finding: KindTraits<'finding'> = {
  kind: 'finding',
  label: 'Finding',
  ...endingTraits('finished'),
  lint: (step) => (step.repair.trim() === ''
    ? [lintFinding('finding-without-repair', 'warning', [step.id], `The Finding ${named(step)} does not say what to repair; add the repair.`)]
    : []),
  view: (step) => ({ cause: step.cause, repair: step.repair, parts: step.parts }),
};
