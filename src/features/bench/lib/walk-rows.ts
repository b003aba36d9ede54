import { STEP_TRAITS } from '@shared/engine/kinds';
import { ProcedureWalk, type WalkEntry, type WalkState } from '@shared/engine/walk';
import type { ProcedureDocument } from '@shared/schema/procedure';
import { walkEntryOf } from '@shared/engine/step-entry';
import type { LocalRow } from '../../../lib/offline/db';

export { withMeter, type MeterEntry } from '@shared/engine/meter';

/** The rows on the current path: each row cuts the path back to the row it follows. */
export function pathRows(rows: readonly LocalRow[]): LocalRow[] {
  let path: LocalRow[] = [];
  for (const row of rows) {
    const at = row.after === null ? -1 : path.findIndex((r) => r.id === row.after);
    path = [...path.slice(0, at + 1), row];
  }
  return path;
}

const entryOf = (doc: ProcedureDocument, row: LocalRow): WalkEntry | null => walkEntryOf(doc.steps.find((s) => s.id === row.stepId), row);

export interface Walked {
  state: WalkState;
  path: LocalRow[];
  /** The rows walked, and the walk standing after them: a later answer goes on from here. */
  rows: readonly LocalRow[];
  walk: ProcedureWalk;
}

/**
 * Goes on from `from` when `rows` only adds answers at the end of its path (the common tap):
 * one walker step per new row instead of a replay from the start. Null when it cannot.
 */
function walkOn(doc: ProcedureDocument, rows: readonly LocalRow[], from: Walked): Walked | null {
  if (rows === from.rows && from.walk.doc === doc) return from;
  if (from.walk.doc !== doc || from.walk.problem?.code === 'no-start' || rows.length < from.rows.length) return null;
  for (let i = 0; i < from.rows.length; i++) if (rows[i] !== from.rows[i]) return null;
  const path = [...from.path];
  const walk = from.walk.fork();
  for (const row of rows.slice(from.rows.length)) {
    if (row.after !== (path[path.length - 1]?.id ?? null)) return null; // going back: replay
    path.push(row);
    const entry = entryOf(doc, row);
    if (entry) walk.take(entry);
  }
  return { state: walk.state(), path, rows, walk };
}

/**
 * Where the diagnosis stands, by the shared walker over the answers on the current path. With
 * `from` (the walk of fewer rows) a tap costs one walker step; the result is the same as a replay.
 */
export function walkRows(doc: ProcedureDocument, rows: readonly LocalRow[], from?: Walked | null): Walked {
  const on = from ? walkOn(doc, rows, from) : null;
  if (on) return on;
  const path = pathRows(rows);
  const walk = ProcedureWalk.start(doc);
  if (walk.problem?.code !== 'no-start') {
    for (const r of path) {
      const entry = entryOf(doc, r);
      if (entry) walk.take(entry);
    }
  }
  return { state: walk.state(), path, rows, walk };
}

/** Rows for the steps the walker passed by itself after the last row (Formulas, links), so the server records them too. */
export function formulaRows(doc: ProcedureDocument, rows: readonly LocalRow[], now: string, from?: Walked | null): LocalRow[] {
  const added: LocalRow[] = [];
  const { state, path } = walkRows(doc, rows, from);
  let last = path[path.length - 1]?.id ?? null;
  for (let i = path.length; i < state.path.length; i++) {
    const p = state.path[i]!;
    if (STEP_TRAITS[p.kind].arrival.on !== 'compute') break;
    const row: LocalRow = { id: crypto.randomUUID(), stepId: p.stepId, after: last, note: '', startedAt: now, answeredAt: now };
    added.push(row);
    last = row.id;
  }
  return added;
}

/** The row a new answer at path position `index` follows (the row before it, or null at the start). */
export function afterFor(path: readonly LocalRow[], index: number): string | null {
  return index <= 0 ? null : path[index - 1]!.id;
}
