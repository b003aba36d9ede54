import type { ProcedureDocument, Step } from '@shared/schema';

export interface StepChange {
  id: string;
  title: string;
  fields: string[];
  /** Captions of pictures this step gained and lost (a picture is the same one by its stored id). */
  picturesAdded: string[];
  picturesRemoved: string[];
}
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
  // a step without pictures is the same whether the list is missing or empty
  const value = (s: Step, k: string) => (k === 'pictures' ? (s.pictures ?? []) : (s as Record<string, unknown>)[k]);
  return [...keys].filter((k) => !same(value(before, k), value(after, k))).sort();
}

/** Pictures by stored id: which captions came and went. */
function pictureChanges(before: Step, after: Step): { picturesAdded: string[]; picturesRemoved: string[] } {
  const had = new Set((before.pictures ?? []).map((p) => p.id));
  const has = new Set((after.pictures ?? []).map((p) => p.id));
  return {
    picturesAdded: (after.pictures ?? []).filter((p) => !had.has(p.id)).map((p) => p.caption),
    picturesRemoved: (before.pictures ?? []).filter((p) => !has.has(p.id)).map((p) => p.caption),
  };
}

/**
 * What a draft changes against the version it will replace: steps added, removed and changed
 * (by id), and procedure fields. Example: renaming a Finding's cause gives
 * `changed: [{ id: 'openCoil', fields: ['cause'], picturesAdded: [], picturesRemoved: [] }]`; adding a
 * picture captioned "Pins" to it gives `fields: ['pictures'], picturesAdded: ['Pins']`.
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
    if (fields.length > 0) changed.push({ id: s.id, title: s.title, fields, ...pictureChanges(old, s) });
  }
  const meta = base
    ? [...Object.keys(next.meta).filter((k) => !same((base.meta as Record<string, unknown>)[k], (next.meta as Record<string, unknown>)[k])),
      ...(base.start !== next.start ? ['start'] : [])]
    : [];
  return { added, removed, changed, meta };
}
