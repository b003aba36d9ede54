import { stepSchema, type ProcedureDocument, type Step } from '@shared/schema';
import { branchesOf } from '@shared/engine/kinds';
import { z } from 'zod';
import { setBranch } from './edits';
import { freeId } from './free-id';

/** What copy puts on the clipboard: a marker and the steps, so paste works between procedures. */
export const CLIP_FORMAT = 'sparkwright-steps';
const clipSchema = z.object({ format: z.literal(CLIP_FORMAT), steps: z.array(stepSchema).min(1).max(5000) });

export function copySteps(doc: ProcedureDocument, ids: ReadonlySet<string>): string {
  return JSON.stringify({ format: CLIP_FORMAT, steps: doc.steps.filter((s) => ids.has(s.id)) });
}

/**
 * Steps from the clipboard, ready to add to `doc`: ids that collide get fresh ones, branches
 * between pasted steps follow the renames, branches to steps outside the copy are left open,
 * and everything is shifted by `offset` so the copy does not hide the original.
 * Returns null when the text is not a copy of steps.
 */
export function pasteSteps(doc: ProcedureDocument, text: string, offset = { x: 40, y: 40 }): Step[] | null {
  let parsed: unknown;
  try { parsed = JSON.parse(text); } catch { return null; }
  const clip = clipSchema.safeParse(parsed);
  if (!clip.success) return null;
  const taken = new Set(doc.steps.map((s) => s.id));
  const rename = new Map<string, string>();
  for (const s of clip.data.steps) {
    const base = s.id.replace(/\d+$/, '') || 'step';
    const id = taken.has(s.id) ? freeId(taken, base) : s.id;
    taken.add(id);
    rename.set(s.id, id);
  }
  return clip.data.steps.map((s) => {
    let step: Step = { ...s, id: rename.get(s.id)!, position: { x: s.position.x + offset.x, y: s.position.y + offset.y } };
    for (const b of branchesOf(s)) step = setBranch(step, b.handle, rename.get(b.to));
    return step;
  });
}

