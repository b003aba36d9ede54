import { buildGraph, depthFirst, isBackEdge } from '@shared/engine';
import { handleCount, handleOffset, stepBox } from '@shared/engine/geometry';
import type { ProcedureDocument, Step } from '@shared/schema';
import { branchesOf } from '@shared/engine/kinds';

const ROW_GAP = 70;
const COLUMN_GAP = 50;

/**
 * A readable top-down layout: each step sits one row below the deepest step that leads to it
 * (loop-closing branches ignored). Rows are placed top to bottom; within a row the steps are
 * ordered by where the branches leading to them leave their parents (so branches do not cross
 * under a step) and set as near below those branches as room for each box allows.
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
  const byId = new Map(doc.steps.map((s) => [s.id, s]));
  const rows: Step[][] = [];
  for (const v of dfs.order) (rows[depth[v]!] ??= []).push(g.steps[v]!);

  const centre = new Map<string, number>();
  const top = new Map<string, number>();
  let y = 0;
  for (const row of rows) {
    // where each step is pulled from: the mean x of the handles above that lead to it
    const pull = new Map<string, number[]>();
    for (const parent of doc.steps) {
      const px = centre.get(parent.id);
      if (px === undefined) continue;
      const branches = branchesOf(parent);
      branches.forEach((b, i) => { if (byId.has(b.to) && !centre.has(b.to)) pull.set(b.to, [...(pull.get(b.to) ?? []), px + handleOffset(i, handleCount(parent))]); });
    }
    const mean = (id: string) => { const xs = pull.get(id); return xs ? xs.reduce((a, b) => a + b, 0) / xs.length : 0; };
    const ordered = row.map((s, i) => ({ s, i, key: mean(s.id) })).sort((a, b) => a.key - b.key || a.i - b.i).map((x) => x.s);
    // each step as near as it can be to its pull, side by side without overlap, then the row
    // shifted so that it is, on average, centred on its pulls
    const widths = ordered.map((s) => stepBox(s).width);
    const xs: number[] = [];
    ordered.forEach((s, i) => {
      const least = i === 0 ? -Infinity : xs[i - 1]! + widths[i - 1]! / 2 + COLUMN_GAP + widths[i]! / 2;
      xs.push(Math.max(mean(s.id), least));
    });
    const drift = xs.reduce((a, x, i) => a + x - mean(ordered[i]!.id), 0) / xs.length;
    ordered.forEach((s, i) => { centre.set(s.id, xs[i]! - drift); top.set(s.id, y); });
    y += Math.max(...ordered.map((s) => stepBox(s).height)) + ROW_GAP + 30; // + the handle labels
  }
  return {
    ...doc,
    steps: doc.steps.map((s) => {
      const c = centre.get(s.id);
      return c === undefined ? s : { ...s, position: { x: Math.round(c - stepBox(s).width / 2), y: top.get(s.id)! } };
    }),
  };
}
