import type { ProcedureDocument, Step } from '@shared/schema';

export interface StepChange { id: string; title: string; fields: string[] }
export interface DocumentDiff {
  added: { id: string; title: string }[];
  removed: { id: string; title: string }[];
  changed: StepChange[];
  /** Procedure-level fields that changed (title, symptom, start ...). */
  meta: string[];
}

const same = (a: unknown, b: unknown) => JSON.stringify(a) === JSON.stringify(b);

/** Fields of a step that differ; moving a step on the canvas is not a change a reviewer needs. */
function changedFields(before: Step, after: Step): string[] {
  const keys = new Set([...Object.keys(before), ...Object.keys(after)]);
  keys.delete('position');
  return [...keys].filter((k) => !same((before as Record<string, unknown>)[k], (after as Record<string, unknown>)[k])).sort();
}

/**
 * What a draft changes against the version it will replace: steps added, removed and changed
 * (by id), and procedure fields. Example: renaming a Finding's cause gives
 * `changed: [{ id: 'openCoil', fields: ['cause'] }]`.
 */
export function diffDocuments(base: ProcedureDocument | null, next: ProcedureDocument): DocumentDiff {
  const before = new Map((base?.steps ?? []).map((s) => [s.id, s]));
  const after = new Map(next.steps.map((s) => [s.id, s]));
  const added = next.steps.filter((s) => !before.has(s.id)).map((s) => ({ id: s.id, title: s.title }));
  const removed = [...before.values()].filter((s) => !after.has(s.id)).map((s) => ({ id: s.id, title: s.title }));
  const changed: StepChange[] = [];
  for (const s of next.steps) {
    const old = before.get(s.id);
    if (!old) continue;
    const fields = changedFields(old, s);
    if (fields.length > 0) changed.push({ id: s.id, title: s.title, fields });
  }
  const meta = base
    ? [...Object.keys(next.meta).filter((k) => !same((base.meta as Record<string, unknown>)[k], (next.meta as Record<string, unknown>)[k])),
      ...(base.start !== next.start ? ['start'] : [])]
    : [];
  return { added, removed, changed, meta };
}
