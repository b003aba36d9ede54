import { walkProcedure, type WalkEntry, type WalkState } from '@shared/engine/walk';
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

export interface Walked { state: WalkState; path: LocalRow[] }

/** Where the diagnosis stands, by the shared walker over the answers on the current path. */
export function walkRows(doc: ProcedureDocument, rows: readonly LocalRow[]): Walked {
  const path = pathRows(rows);
  const entries = path.map((r) => entryOf(doc, r)).filter((e): e is WalkEntry => e !== null);
  return { state: walkProcedure(doc, entries), path };
}

/** Rows for the Formula steps the walker computed past the last row, so the server records them too. */
export function formulaRows(doc: ProcedureDocument, rows: readonly LocalRow[], now: string): LocalRow[] {
  const added: LocalRow[] = [];
  const { state, path } = walkRows(doc, rows);
  let last = path[path.length - 1]?.id ?? null;
  for (let i = path.length; i < state.path.length; i++) {
    const p = state.path[i]!;
    if (p.kind !== 'formula') break;
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
