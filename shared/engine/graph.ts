import { branchesOf, isEnding, type Branch } from '../schema/branches';
import type { ProcedureDocument, Step } from '../schema/procedure';

/**
 * A procedure compiled to index-based adjacency (compressed rows) so that every graph algorithm
 * in the engine is a loop over typed arrays: linear in steps + branches, no recursion.
 */
export interface ProcedureGraph {
  readonly size: number;
  /** Steps by index; a duplicated id keeps its first step, later ones are left out. */
  readonly steps: readonly Step[];
  readonly index: ReadonlyMap<string, number>;
  /** −1 when the start step does not exist. */
  readonly start: number;
  readonly ending: Uint8Array;
  /** Out-edges of v: targets[outStart[v] .. outStart[v + 1]), with their branch. */
  readonly outStart: Int32Array;
  readonly targets: Int32Array;
  readonly edgeBranch: readonly Branch[];
  /** In-edges of v: sources[inStart[v] .. inStart[v + 1]). */
  readonly inStart: Int32Array;
  readonly sources: Int32Array;
  /** Branches whose target does not exist. */
  readonly dangling: readonly Branch[];
  /** Ids used by more than one step. */
  readonly duplicates: readonly string[];
}

function buildIndex(doc: ProcedureDocument): { steps: Step[]; index: Map<string, number>; duplicates: string[] } {
  const steps: Step[] = [];
  const index = new Map<string, number>();
  const duplicates = new Set<string>();
  for (const step of doc.steps) {
    if (index.has(step.id)) duplicates.add(step.id);
    else {
      index.set(step.id, steps.length);
      steps.push(step);
    }
  }
  return { steps, index, duplicates: [...duplicates] };
}

/** Compiles a document once; the soundness check, the walker's helpers and path figures share it. */
export function buildGraph(doc: ProcedureDocument): ProcedureGraph {
  const { steps, index, duplicates } = buildIndex(doc);
  const n = steps.length;
  const outStart = new Int32Array(n + 1);
  const edges: Branch[] = [];
  const targetList: number[] = [];
  const dangling: Branch[] = [];
  const ending = new Uint8Array(n);
  for (let v = 0; v < n; v++) {
    const step = steps[v]!;
    ending[v] = isEnding(step) ? 1 : 0;
    outStart[v] = edges.length;
    for (const b of branchesOf(step)) {
      const w = index.get(b.to);
      if (w === undefined) dangling.push(b);
      else {
        edges.push(b);
        targetList.push(w);
      }
    }
  }
  outStart[n] = edges.length;
  const targets = Int32Array.from(targetList);
  const inStart = new Int32Array(n + 1);
  for (const w of targets) inStart[w + 1]!++;
  for (let v = 0; v < n; v++) inStart[v + 1]! += inStart[v]!;
  const fill = inStart.slice(0, n);
  const sources = new Int32Array(targets.length);
  for (let v = 0; v < n; v++) {
    for (let e = outStart[v]!; e < outStart[v + 1]!; e++) sources[fill[targets[e]!]!++] = v;
  }
  return {
    size: n, steps, index, start: index.get(doc.start) ?? -1, ending,
    outStart, targets, edgeBranch: edges, inStart, sources, dangling, duplicates,
  };
}
