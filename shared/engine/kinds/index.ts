import type { Step, StepId, StepKind } from '../../schema/procedure';
import type { LintFinding } from '../lint-types';
import { finding } from './finding';
import { formula } from './formula';
import { handoff } from './handoff';
import { link } from './link';
import { observation } from './observation';
import { reading } from './reading';
import { task } from './task';
import type { Branch, KindTraits, KindView, Outlet, StepOf } from './types';

export type { Arrival, Branch, KindTraits, KindView, Outlet, StepOf } from './types';
export { unknownKind } from './types';
export { UNCONNECTED } from './common';

/**
 * Every step kind's traits, keyed by kind. A kind added to `STEP_KINDS` without an entry here
 * does not compile; everything else the engine knows about a kind is read from this table.
 */
export const STEP_TRAITS: { readonly [K in StepKind]: KindTraits<K> } = { reading, observation, task, formula, finding, handoff, link };

/**
 * Calls a trait method with the step it belongs to. The one cast of the table: TypeScript cannot
 * follow a union of steps into the mapped table by itself.
 */
function call<R>(step: Step, f: (t: KindTraits<StepKind>, s: StepOf<StepKind>) => R): R {
  return f(STEP_TRAITS[step.kind] as unknown as KindTraits<StepKind>, step as never);
}

/**
 * The handle of the branch a recorded step took, from the record's `band_id` and `answer_id`:
 * what Debrief counts per branch and the phone's path figures weigh branches by.
 * Example: recordedHandle('borderline', null) === 'borderline'; recordedHandle(null, 'none') === 'answer:none'.
 */
export function recordedHandle(bandId: unknown, answerId: unknown): string {
  if (typeof answerId === 'string') return `answer:${answerId}`;
  if (bandId === 'borderline') return 'borderline';
  if (typeof bandId === 'string') return `band:${bandId}`;
  return 'next';
}

/** The name a person reads for a kind. Example: `kindLabel('handoff')` → 'Hand-off'. */
export const kindLabel = (kind: StepKind): string => STEP_TRAITS[kind].label;

/** The diagnosis may end at this step: a Finding, a Hand-off, or a link on its own (its other procedure ends it). */
export function isEnding(step: Step): boolean {
  return call(step, (t, s) => t.ends(s));
}

/**
 * The branches leaving a step, in the order the author wrote them (open handles left out).
 * Example: a Task with `next: 'plugGap'` gives `[{ from, to: 'plugGap', handle: 'next', ... }]`.
 */
export function branchesOf(step: Step): Branch[] {
  const out: Branch[] = [];
  for (const o of outletsOf(step)) {
    if (o.to !== undefined) out.push({ from: step.id, to: o.to, handle: o.handle, label: o.label, kind: o.kind });
  }
  return out;
}

/** Calls `visit(to, local)` for each branch of a step, in `branchesOf` order, without allocating. */
export function forEachTarget(step: Step, visit: (to: StepId, local: number) => void): void {
  call(step, (t, s) => t.eachTarget(s, visit));
}

/** Every handle of a step, open ones included, in branch order (the canvas draws one per outlet). */
export function outletsOf(step: Step): Outlet[] {
  return call(step, (t, s) => t.outlets(s));
}

/** How many branch handles the canvas draws under a step, open ones included. */
export function handleCount(step: Step): number {
  return outletsOf(step).length;
}

/** Sets (or with `to` undefined, clears) the branch behind one handle of a step. */
export function setBranch<S extends Step>(step: S, handle: string, to: StepId | undefined): S {
  return call(step, (t, s) => t.setBranch(s, handle, to)) as S;
}

/** Points every branch of a step that goes to `from` at `to`, or clears it (renames, removals, reordering). */
export function retarget<S extends Step>(step: S, from: StepId, to: StepId | undefined): S {
  let out = step;
  for (const o of outletsOf(step)) if (o.to === from) out = setBranch(out, o.handle, to);
  return out;
}

/** The kind's own soundness findings for a step. */
export function lintOwnKind(step: Step): LintFinding[] {
  return call(step, (t, s) => t.lint(s));
}

/** What the Bench shows for a step beyond the common fields. */
export function viewOf(step: Step): KindView {
  return call(step, (t, s) => t.view(s));
}
