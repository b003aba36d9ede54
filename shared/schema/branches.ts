import type { Step, StepId } from './procedure';

/** One arrow of the graph. `handle` is stable per source step (the editor's connection point). */
export interface Branch {
  readonly from: StepId;
  readonly to: StepId;
  /** `band:<id>`, `answer:<id>`, `next` or `borderline`. */
  readonly handle: string;
  readonly label: string;
  readonly kind: 'band' | 'answer' | 'next' | 'borderline';
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

/** Finding and Hand-off end a diagnosis. */
export function isEnding(step: Step): boolean {
  return step.kind === 'finding' || step.kind === 'handoff';
}

/**
 * The branches leaving a step, in the order the author wrote them.
 * Example: a Task with `next: 'plugGap'` gives `[{ from, to: 'plugGap', handle: 'next', ... }]`.
 */
export function branchesOf(step: Step): Branch[] {
  const from = step.id;
  switch (step.kind) {
    case 'reading': {
      const out: Branch[] = step.bands.map((b) => ({ from, to: b.next, handle: `band:${b.id}`, label: b.label, kind: 'band' }));
      if (step.borderline.action === 'branch') {
        out.push({ from, to: step.borderline.next, handle: 'borderline', label: step.borderline.label, kind: 'borderline' });
      }
      return out;
    }
    case 'formula': {
      const out: Branch[] = step.bands.map((b) => ({ from, to: b.next, handle: `band:${b.id}`, label: b.label, kind: 'band' }));
      if (step.next !== undefined) out.push({ from, to: step.next, handle: 'next', label: 'Next', kind: 'next' });
      return out;
    }
    case 'observation':
      return step.answers.map((a) => ({ from, to: a.next, handle: `answer:${a.id}`, label: a.label, kind: 'answer' }));
    case 'task':
      return step.next === undefined ? [] : [{ from, to: step.next, handle: 'next', label: step.confirmLabel, kind: 'next' }];
    case 'finding':
    case 'handoff':
      return [];
  }
}
