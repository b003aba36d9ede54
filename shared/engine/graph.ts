import { branchesOf, forEachTarget, isEnding, type Branch } from './kinds';
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
  /** Out-edges of v: targets[outStart[v] .. outStart[v + 1]). */
  readonly outStart: Int32Array;
  readonly targets: Int32Array;
  /** The branch behind edge e (label, handle, kind); built on demand. */
  readonly edgeBranch: (e: number) => Branch;
  /** In-edges of v: sources[inStart[v] .. inStart[v + 1]). */
  readonly inStart: Int32Array;
  readonly sources: Int32Array;
  /** Branches whose target does not exist. */
  readonly dangling: readonly Branch[];
  /** Ids used by more than one step. */
  readonly duplicates: readonly string[];
}

function buildIndex(doc: ProcedureDocument): { steps: readonly Step[]; index: Map<string, number>; duplicates: string[] } {
  const index = new Map<string, number>();
  const duplicates = new Set<string>();
  for (let i = 0; i < doc.steps.length; i++) {
    const id = doc.steps[i]!.id;
    if (index.has(id)) duplicates.add(id);
    else index.set(id, index.size);
  }
  // Without duplicates the document's own array serves; otherwise keep each id's first step.
  if (duplicates.size === 0) return { steps: doc.steps, index, duplicates: [] };
  const seen = new Set<string>();
  const steps = doc.steps.filter((s) => {
    if (seen.has(s.id)) return false;
    seen.add(s.id);
    return true;
  });
  return { steps, index, duplicates: [...duplicates] };
}

function branchCount(step: Step): number {
  let n = 0;
  forEachTarget(step, () => n++);
  return n;
}

interface OutEdges {
  readonly outStart: Int32Array;
  readonly targets: Int32Array;
  /** Position of each edge among its step's branches (`branchesOf` order). */
  readonly local: Int32Array;
  readonly ending: Uint8Array;
  /** Steps with a branch to an id that does not exist (once per such branch). */
  readonly danglingFrom: readonly number[];
}

/** Out-edges in compressed rows; a branch to a missing step is left out and noted. */
function outEdges(steps: readonly Step[], index: ReadonlyMap<string, number>): OutEdges {
  const n = steps.length;
  const outStart = new Int32Array(n + 1);
  let capacity = 0;
  for (const step of steps) capacity += branchCount(step);
  const targetBuffer = new Int32Array(capacity);
  const local = new Int32Array(capacity);
  const danglingFrom: number[] = [];
  const ending = new Uint8Array(n);
  let m = 0;
  for (let v = 0; v < n; v++) {
    const step = steps[v]!;
    ending[v] = isEnding(step) ? 1 : 0;
    outStart[v] = m;
    forEachTarget(step, (to, branch) => {
      const w = index.get(to);
      if (w === undefined) danglingFrom.push(v);
      else {
        targetBuffer[m] = w;
        local[m++] = branch;
      }
    });
  }
  outStart[n] = m;
  return { outStart, targets: targetBuffer.slice(0, m), local, ending, danglingFrom };
}

/** In-edges: the out-edges turned round by a counting sort on their targets. */
function inEdges(size: number, outStart: Int32Array, targets: Int32Array): { inStart: Int32Array; sources: Int32Array } {
  const inStart = new Int32Array(size + 1);
  for (const w of targets) inStart[w + 1]!++;
  for (let v = 0; v < size; v++) inStart[v + 1]! += inStart[v]!;
  const fill = inStart.slice(0, size);
  const sources = new Int32Array(targets.length);
  for (let v = 0; v < size; v++) {
    for (let e = outStart[v]!; e < outStart[v + 1]!; e++) sources[fill[targets[e]!]!++] = v;
  }
  return { inStart, sources };
}

// Branch objects (labels, handles) are built only when asked for: most callers need targets only.
function branchOfEdge(steps: readonly Step[], outStart: Int32Array, local: Int32Array): (e: number) => Branch {
  const n = steps.length;
  return (e) => {
    // the step whose row holds edge e: the last v with outStart[v] <= e, then past empty rows
    let v = 0;
    let lo = 0;
    let hi = n - 1;
    while (lo <= hi) {
      const mid = (lo + hi) >> 1;
      if (outStart[mid]! <= e) {
        v = mid;
        lo = mid + 1;
      } else hi = mid - 1;
    }
    while (v < n && outStart[v + 1]! <= e) v++;
    return branchesOf(steps[v]!)[local[e]!]!;
  };
}

/** Compiles a document once; the soundness check, the walker's helpers and path figures share it. */
export function buildGraph(doc: ProcedureDocument): ProcedureGraph {
  const { steps, index, duplicates } = buildIndex(doc);
  const { outStart, targets, local, ending, danglingFrom } = outEdges(steps, index);
  const { inStart, sources } = inEdges(steps.length, outStart, targets);
  const dangling = [...new Set(danglingFrom)].flatMap((v) => branchesOf(steps[v]!).filter((b) => !index.has(b.to)));
  const edgeBranch = branchOfEdge(steps, outStart, local);
  return { size: steps.length, steps, index, start: index.get(doc.start) ?? -1, ending, outStart, targets, edgeBranch, inStart, sources, dangling, duplicates };
}
