import type { Step } from '../schema/procedure';
import { lintOwnKind } from './kinds';
import { finding, named, type LintFinding } from './lint-types';

/** Safety: a step with a hazard needs a note that protects a person (ANSI Z535: NOTICE does not). */
function lintSafety(step: Step): LintFinding[] {
  if (step.hazards.length === 0) return [];
  if (step.safety.some((n) => n.signal !== 'NOTICE')) return [];
  return [finding('hazard-without-caution', 'error', [step.id],
    `${named(step)} involves ${step.hazards.join(', ').replace(/-/g, ' ')} but has no DANGER, WARNING or CAUTION note; add one that says how to stay safe.`)];
}

/** Checks that look at one step at a time; findings are pushed onto `out`. */
export function lintStep(step: Step, out: LintFinding[]): void {
  if (step.hazards.length > 0) out.push(...lintSafety(step));
  out.push(...lintOwnKind(step));
}
