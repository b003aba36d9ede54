import { depthFirst, reach, stronglyConnected, type Components } from './algorithms';
import type { ProcedureGraph } from './graph';

/**
 * Expected cost to absorption in an absorbing Markov chain over the procedure graph:
 * t(v) = cost(v) + Σ p(v→w)·t(w), endings absorbing with t = cost(ending).
 * Solved component by component in reverse topological order (Tarjan numbers sinks first):
 * a step outside any loop is one substitution; a small loop is solved exactly by Gaussian
 * elimination; a large loop by Gauss–Seidel iteration. Steps that may never reach an ending
 * (some positive-probability path leads where no ending is reachable) get Infinity.
 */

export interface ChainInput {
  readonly graph: ProcedureGraph;
  /** Probability of each edge (aligned with graph.targets); each step's out-edges sum to 1 or are all 0. */
  readonly probability: Float64Array;
  readonly cost: Float64Array;
}

const EXACT_LIMIT = 16;
const MAX_SWEEPS = 20_000;
const TOLERANCE = 1e-10;

/** Steps from which the chain is absorbed with probability 1. */
export function almostSurelyAbsorbed(g: ProcedureGraph, p: Float64Array): Uint8Array {
  // Work on the positive-probability subgraph: steps that cannot reach an ending there are bad,
  // and so is every step that can reach a bad one.
  const positive = { ...g, ...positiveEdges(g, p) };
  const ends: number[] = [];
  for (let v = 0; v < g.size; v++) if (g.ending[v]) ends.push(v);
  const good = reach(positive, ends, true);
  const bad: number[] = [];
  for (let v = 0; v < g.size; v++) if (!good[v]) bad.push(v);
  const doomed = reach(positive, bad, true);
  const ok = new Uint8Array(g.size);
  for (let v = 0; v < g.size; v++) ok[v] = doomed[v] ? 0 : 1;
  return ok;
}

function positiveEdges(g: ProcedureGraph, p: Float64Array): Pick<ProcedureGraph, 'outStart' | 'targets' | 'inStart' | 'sources'> {
  const outStart = new Int32Array(g.size + 1);
  const buffer = new Int32Array(g.targets.length);
  let m = 0;
  for (let v = 0; v < g.size; v++) {
    outStart[v] = m;
    if (g.ending[v]) continue;
    for (let e = g.outStart[v]!; e < g.outStart[v + 1]!; e++) if (p[e]! > 0) buffer[m++] = g.targets[e]!;
  }
  outStart[g.size] = m;
  const targets = buffer.subarray(0, m);
  const inStart = new Int32Array(g.size + 1);
  for (const w of targets) inStart[w + 1]!++;
  for (let v = 0; v < g.size; v++) inStart[v + 1]! += inStart[v]!;
  const fill = inStart.slice(0, g.size);
  const sources = new Int32Array(m);
  for (let v = 0; v < g.size; v++) for (let e = outStart[v]!; e < outStart[v + 1]!; e++) sources[fill[targets[e]!]!++] = v;
  return { outStart, targets, inStart, sources };
}

/** A step outside any loop (or looping only on itself): one substitution. */
function solveSingle(v: number, input: ChainInput, t: Float64Array): number {
  const g = input.graph;
  let self = 0;
  let sum = input.cost[v]!;
  for (let e = g.outStart[v]!; e < g.outStart[v + 1]!; e++) {
    const p = input.probability[e]!;
    if (p === 0) continue;
    const w = g.targets[e]!;
    if (w === v) self += p;
    else sum += p * t[w]!;
  }
  return sum / (1 - self);
}

/** Solves the component's equations exactly: (I − P_cc)·t = cost + P_out·t_out. */
function solveExact(members: number[], input: ChainInput, comp: Int32Array, c: number, t: Float64Array): void {
  const g = input.graph;
  const k = members.length;
  const local = new Map(members.map((v, i) => [v, i]));
  const a = Array.from({ length: k }, () => new Float64Array(k + 1));
  members.forEach((v, i) => {
    const row = a[i]!;
    row[i] = 1;
    row[k] = input.cost[v]!;
    for (let e = g.outStart[v]!; e < g.outStart[v + 1]!; e++) {
      const w = g.targets[e]!;
      const p = input.probability[e]!;
      if (p === 0) continue;
      if (comp[w] === c) row[local.get(w)!]! -= p;
      else row[k]! += p * t[w]!;
    }
  });
  for (let col = 0; col < k; col++) {
    let pivot = col;
    for (let r = col + 1; r < k; r++) if (Math.abs(a[r]![col]!) > Math.abs(a[pivot]![col]!)) pivot = r;
    [a[col], a[pivot]] = [a[pivot]!, a[col]!];
    const pr = a[col]!;
    for (let r = 0; r < k; r++) {
      if (r === col) continue;
      const f = a[r]![col]! / pr[col]!;
      if (f === 0) continue;
      for (let j = col; j <= k; j++) a[r]![j]! -= f * pr[j]!;
    }
  }
  members.forEach((v, i) => (t[v] = a[i]![k]! / a[i]![i]!));
}

/** Gauss–Seidel sweeps; converges because every step in the component is absorbed with probability 1. */
function solveIterative(members: number[], input: ChainInput, t: Float64Array): boolean {
  const g = input.graph;
  for (const v of members) t[v] = 0;
  for (let sweep = 0; sweep < MAX_SWEEPS; sweep++) {
    let change = 0;
    for (const v of members) {
      let self = 0;
      let sum = input.cost[v]!;
      for (let e = g.outStart[v]!; e < g.outStart[v + 1]!; e++) {
        const w = g.targets[e]!;
        const p = input.probability[e]!;
        if (p === 0) continue;
        if (w === v) self += p;
        else sum += p * t[w]!;
      }
      const next = sum / (1 - self);
      change = Math.max(change, Math.abs(next - t[v]!) / Math.max(1, Math.abs(next)));
      t[v] = next;
    }
    if (change < TOLERANCE) return true;
  }
  return false;
}

export interface ChainResult {
  readonly expected: Float64Array;
  /** False when an iterative solve stopped before reaching the tolerance. */
  readonly converged: boolean;
}

/** Expected cost from every step to an ending. */
/** Work that several solves over one graph and one set of probabilities can share. */
export interface ChainPrepared {
  readonly scc: Components;
  /** Depth-first order from the start (reverse postorder). */
  readonly order: Int32Array;
  /** Steps absorbed with probability 1 (`almostSurelyAbsorbed`). */
  readonly ok: Uint8Array;
}

export function prepareChain(g: ProcedureGraph, probability: Float64Array): ChainPrepared {
  return { scc: stronglyConnected(g), order: depthFirst(g, g.start).order, ok: almostSurelyAbsorbed(g, probability) };
}

export function expectedToEnding(input: ChainInput, prepared: ChainPrepared = prepareChain(input.graph, input.probability)): ChainResult {
  const { scc, order, ok } = prepared;
  const g = input.graph;
  const t = new Float64Array(g.size);
  // Steps grouped by component (counting sort). Within a component, Gauss–Seidel converges in a
  // few sweeps when a step is updated after the steps it leads to: depth-first postorder gives
  // that for every branch except the ones that close a loop.
  const compStart = new Int32Array(scc.count + 1);
  for (let v = 0; v < g.size; v++) compStart[scc.comp[v]! + 1]!++;
  for (let c = 0; c < scc.count; c++) compStart[c + 1]! += compStart[c]!;
  const fill = compStart.slice(0, scc.count);
  const byComp = new Int32Array(g.size);
  const placed = new Uint8Array(g.size);
  const put = (v: number) => ((placed[v] = 1), (byComp[fill[scc.comp[v]!]!++] = v));
  for (let i = order.length - 1; i >= 0; i--) put(order[i]!);
  for (let v = 0; v < g.size; v++) if (!placed[v]) put(v);
  let converged = true;
  for (let c = 0; c < scc.count; c++) {
    const from = compStart[c]!;
    const to = compStart[c + 1]!;
    if (to - from === 1) {
      const v = byComp[from]!;
      t[v] = ok[v] ? solveSingle(v, input, t) : Infinity;
      continue;
    }
    const list: number[] = [];
    for (let i = from; i < to; i++) {
      const v = byComp[i]!;
      if (ok[v]) list.push(v);
      else t[v] = Infinity;
    }
    if (list.length === 0) continue;
    if (list.length <= EXACT_LIMIT) solveExact(list, input, scc.comp, c, t);
    else converged = solveIterative(list, input, t) && converged;
  }
  return { expected: t, converged };
}
