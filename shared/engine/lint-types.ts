import type { Step } from '../schema/procedure';
import type { LinkCatalogue } from './lint-links';

export type LintSeverity = 'error' | 'warning';

/** Stable codes: the editor, the API and Debrief may key on them. */
export type LintCode =
  | 'duplicate-id'
  | 'start-missing'
  | 'dangling-branch'
  | 'dead-end'
  | 'unreachable-step'
  | 'no-ending-reachable'
  | 'loop-without-exit'
  | 'missing-limits'
  | 'limits-invalid'
  | 'band-gap'
  | 'band-overlap'
  | 'band-empty'
  | 'duplicate-handle'
  | 'formula-invalid'
  | 'formula-unknown-step'
  | 'formula-unmeasured'
  | 'formula-units'
  | 'formula-routing'
  | 'winding-invalid'
  | 'winding-unmeasured'
  | 'hazard-without-caution'
  | 'meter-missing'
  | 'single-answer'
  | 'finding-without-repair'
  | 'link-target-missing'
  | 'link-target-unpublished'
  | 'link-entry-missing'
  | 'link-cycle'
  | 'long-path';

export interface LintFinding {
  readonly code: LintCode;
  readonly severity: LintSeverity;
  /** Ids of the steps involved, the one to fix first. */
  readonly steps: readonly string[];
  /** One sentence a senior technician understands, saying what to do. */
  readonly message: string;
}

export interface LintOptions {
  /** A loop-free path longer than this many steps draws a warning. Default 40. */
  readonly longPathSteps?: number;
  /** The shop's procedures, for checking "Continue in" steps; without it links are checked on their own. */
  readonly links?: LinkCatalogue;
}

/** How a step is named in messages: its title, and its id when the title is not unique enough. */
export function named(step: Step): string {
  return `"${step.title}" (${step.id})`;
}

export const finding = (code: LintCode, severity: LintSeverity, steps: readonly string[], message: string): LintFinding => ({
  code, severity, steps, message,
});
