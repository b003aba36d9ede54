import { buildGraph, depthFirst, isBackEdge } from '@shared/engine';
import type { ProcedureDocument } from '@shared/schema';

const ROW = 170;
const COLUMN = 290;

/**
 * A readable top-down layout: each step sits one row below the deepest step that leads to it
 * (loop-closing branches ignored), and the steps of a row are centred side by side in the
 * order a depth-first walk meets them.
 */
export function layoutTopDown(doc: ProcedureDocument): ProcedureDocument {
  const g = buildGraph(doc);
  const dfs = depthFirst(g, g.start);
  const depth = new Int32Array(g.size);
  for (const v of dfs.order) {
    for (let e = g.outStart[v]!; e < g.outStart[v + 1]!; e++) {
      const w = g.targets[e]!;
      if (!isBackEdge(dfs, v, w)) depth[w] = Math.max(depth[w]!, depth[v]! + 1);
    }
  }
  const rows = new Map<number, number[]>();
  for (const v of dfs.order) rows.set(depth[v]!, [...(rows.get(depth[v]!) ?? []), v]);
  const position = new Map<string, { x: number; y: number }>();
  for (const [d, members] of rows) {
    members.forEach((v, i) => position.set(g.steps[v]!.id, { x: Math.round((i - (members.length - 1) / 2) * COLUMN), y: d * ROW }));
  }
  return { ...doc, steps: doc.steps.map((s) => ({ ...s, position: position.get(s.id) ?? s.position })) };
}
