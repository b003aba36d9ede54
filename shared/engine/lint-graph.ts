import { canReachEnding, isBackEdge, stronglyConnected, type DepthFirst } from './algorithms';
import type { ProcedureGraph } from './graph';
import { finding, named, type LintFinding } from './lint-types';

/** Duplicate ids, a missing start, dangling branches and dead ends. */
export function lintStructure(g: ProcedureGraph, startId: string): LintFinding[] {
  const out: LintFinding[] = [];
  for (const id of g.duplicates) {
    out.push(finding('duplicate-id', 'error', [id], `More than one step has the id "${id}"; give each step its own id.`));
  }
  if (g.start < 0) {
    out.push(finding('start-missing', 'error', [startId], `The procedure starts at "${startId}", but no step has that id; choose the first step.`));
  }
  for (const b of g.dangling) {
    out.push(finding('dangling-branch', 'error', [b.from, b.to],
      `The branch "${b.label}" of ${named(g.steps[g.index.get(b.from)!]!)} points to "${b.to}", which does not exist; point it at a step.`));
  }
  const withDangling = new Set(g.dangling.map((b) => b.from));
  for (let v = 0; v < g.size; v++) {
    const step = g.steps[v]!;
    const hasOut = g.outStart[v + 1]! > g.outStart[v]!;
    if (!g.ending[v] && !hasOut && !withDangling.has(step.id)) {
      out.push(finding('dead-end', 'error', [step.id],
        `${named(step)} has no way forward; give it a next step, or end the path with a Finding or a Hand-off.`));
    }
  }
  return out;
}

/** Unreachable steps, steps that cannot reach an ending, and loops without a way out. */
export function lintReachability(g: ProcedureGraph, dfs: DepthFirst): LintFinding[] {
  const out: LintFinding[] = [];
  const reachable = dfs.rank;
  const toEnding = canReachEnding(g);
  for (let v = 0; v < g.size; v++) {
    if (g.start >= 0 && reachable[v]! < 0) {
      out.push(finding('unreachable-step', 'error', [g.steps[v]!.id],
        `No path from the start reaches ${named(g.steps[v]!)}; connect it to the procedure or delete it.`));
    }
  }
  const scc = stronglyConnected(g);
  const trapped = new Map<number, string[]>();
  for (let v = 0; v < g.size; v++) {
    if (toEnding[v]) continue;
    const c = scc.comp[v]!;
    if (scc.cyclic[c]) {
      const ids = trapped.get(c) ?? [];
      ids.push(g.steps[v]!.id);
      trapped.set(c, ids);
    } else if (g.ending[v] === 0 && g.outStart[v + 1]! > g.outStart[v]!) {
      // Dead ends are already reported; this is a step whose every branch leads into trouble.
      out.push(finding('no-ending-reachable', 'error', [g.steps[v]!.id],
        `From ${named(g.steps[v]!)} no Finding or Hand-off can be reached; the technician would be stuck.`));
    }
  }
  for (const ids of trapped.values()) {
    const shown = ids.slice(0, 5).map((id) => `"${id}"`).join(', ') + (ids.length > 5 ? ` and ${ids.length - 5} more` : '');
    out.push(finding('loop-without-exit', 'error', ids,
      `The steps ${shown} go round in a loop with no way out to a Finding or a Hand-off; add an exit, e.g. a Hand-off after a second try.`));
  }
  return out;
}

/** Longest loop-free path from the start, in steps (back edges dropped). O(steps + branches). */
export function longestLoopFreePath(g: ProcedureGraph, dfs: DepthFirst): number {
  const dist = new Int32Array(g.size);
  let best = 0;
  for (const v of dfs.order) {
    const d = (dist[v] = Math.max(dist[v]!, 1));
    if (d > best) best = d;
    for (let e = g.outStart[v]!; e < g.outStart[v + 1]!; e++) {
      const w = g.targets[e]!;
      if (!isBackEdge(dfs, v, w) && dist[w]! < d + 1) dist[w] = d + 1;
    }
  }
  return best;
}
