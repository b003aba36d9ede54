import type { ProcedureDocument, Step } from '../schema/procedure';
import { STEP_TRAITS, branchesOf } from './kinds';
import { depthFirst, isBackEdge, stronglyConnected, type DepthFirst } from './algorithms';
import { buildGraph, type ProcedureGraph } from './graph';
import { almostSurelyAbsorbed, expectedToEnding } from './markov';

/** Recorded branch counts from finished diagnoses: step id → branch handle → times taken. */
export type BranchCounts = Readonly<Record<string, Readonly<Record<string, number>>>>;

export interface PathFiguresOptions {
  /** Recorded frequencies; without them every ordinary branch is equally likely. */
  readonly branchCounts?: BranchCounts;
  /** Added to every count (Laplace smoothing) so an untaken branch keeps a small chance. Default 1. */
  readonly prior?: number;
}

export interface PathLength {
  /** Number of steps, the ending included. */
  readonly steps: number;
  readonly minutes: number;
}

export interface StepFigures {
  /** Expected steps still to be shown from here, this step and the ending included. */
  readonly expectedSteps: number;
  readonly expectedMinutes: number;
}

export interface PathFigures {
  /** Fewest steps and fewest minutes from the start to any ending (each minimised on its own). */
  readonly shortest: PathLength | null;
  /** Most steps and most minutes from the start to an ending without repeating a step. */
  readonly longest: PathLength | null;
  /** Expected steps and minutes from the start; null when an ending may never be reached. */
  readonly expected: PathLength | null;
  /** Expected figures from every step, for the Bench progress indicator (Infinity when an ending may never be reached). */
  readonly perStep: Readonly<Record<string, StepFigures>>;
  readonly hasLoops: boolean;
  /** False if the iterative solver stopped before its tolerance (figures are then approximate). */
  readonly converged: boolean;
}

/** Estimated minutes of a step: its own, else the procedure's default; Formulas and endings take none. */
export function stepMinutes(step: Step, minutesPerStep: number): number {
  if (step.minutes !== undefined) return step.minutes;
  return STEP_TRAITS[step.kind].takesTime ? minutesPerStep : 0;
}

function branchProbabilities(g: ProcedureGraph, options: PathFiguresOptions): Float64Array {
  const p = new Float64Array(g.targets.length);
  const prior = options.prior ?? 1;
  for (let v = 0; v < g.size; v++) {
    const counts = options.branchCounts?.[g.steps[v]!.id];
    const branches = counts || hasBorderline(g.steps[v]!) ? branchesOf(g.steps[v]!).filter((b) => g.index.has(b.to)) : null;
    let total = 0;
    for (let e = g.outStart[v]!; e < g.outStart[v + 1]!; e++) {
      const b = branches?.[e - g.outStart[v]!];
      // The borderline branch is the exception: it gets no share until diagnoses have taken it.
      const w = (b ? (counts?.[b.handle] ?? 0) : 0) + (b?.kind === 'borderline' ? 0 : prior);
      p[e] = w;
      total += w;
    }
    const degree = g.outStart[v + 1]! - g.outStart[v]!;
    for (let e = g.outStart[v]!; e < g.outStart[v + 1]!; e++) p[e] = total > 0 ? p[e]! / total : 1 / degree;
  }
  return p;
}

function hasBorderline(step: Step): boolean {
  return step.kind === 'reading' && step.borderline.action === 'branch';
}

/** Binary-heap Dijkstra over step costs (node weights ≥ 0) from the start to the nearest ending. */
function cheapestToEnding(g: ProcedureGraph, cost: Float64Array): number | null {
  const dist = new Float64Array(g.size).fill(Infinity);
  // Lazy-deletion heap in two typed arrays: at most one entry per relaxed edge plus the start.
  const keys = new Float64Array(g.targets.length + 1);
  const nodes = new Int32Array(g.targets.length + 1);
  let size = 0;
  const swap = (i: number, j: number) => {
    [keys[i], keys[j]] = [keys[j]!, keys[i]!];
    [nodes[i], nodes[j]] = [nodes[j]!, nodes[i]!];
  };
  const push = (d: number, v: number) => {
    let i = size++;
    keys[i] = d;
    nodes[i] = v;
    while (i > 0 && keys[(i - 1) >> 1]! > keys[i]!) {
      swap(i, (i - 1) >> 1);
      i = (i - 1) >> 1;
    }
  };
  const pop = () => {
    swap(0, --size);
    for (let i = 0; ; ) {
      const l = 2 * i + 1;
      let m = i;
      if (l < size && keys[l]! < keys[m]!) m = l;
      if (l + 1 < size && keys[l + 1]! < keys[m]!) m = l + 1;
      if (m === i) break;
      swap(i, m);
      i = m;
    }
  };
  dist[g.start] = cost[g.start]!;
  push(dist[g.start]!, g.start);
  while (size > 0) {
    const d = keys[0]!;
    const v = nodes[0]!;
    pop();
    if (d > dist[v]!) continue;
    if (g.ending[v]) return d;
    for (let e = g.outStart[v]!; e < g.outStart[v + 1]!; e++) {
      const w = g.targets[e]!;
      if (d + cost[w]! < dist[w]!) push((dist[w] = d + cost[w]!), w);
    }
  }
  return null;
}

/** Longest loop-free path to an ending, in the graph with loop-closing branches dropped. */
function longestToEnding(g: ProcedureGraph, dfs: DepthFirst, cost: Float64Array): number | null {
  const best = new Float64Array(g.size).fill(-Infinity);
  let answer = -Infinity;
  if (g.start >= 0) best[g.start] = cost[g.start]!;
  for (const v of dfs.order) {
    if (g.ending[v]) answer = Math.max(answer, best[v]!);
    for (let e = g.outStart[v]!; e < g.outStart[v + 1]!; e++) {
      const w = g.targets[e]!;
      if (!isBackEdge(dfs, v, w)) best[w] = Math.max(best[w]!, best[v]! + cost[w]!);
    }
  }
  return answer === -Infinity ? null : answer;
}

/**
 * Shortest, longest and expected path to an ending, and expected steps/minutes left from every
 * step, by an absorbing Markov chain over the branches (uniform, or from recorded counts).
 * Example: `pathFigures(doc).expected` → `{ steps: 7.5, minutes: 14 }`;
 * `pathFigures(doc).perStep.coilPrimary.expectedSteps` → 4.
 */
export function pathFigures(doc: ProcedureDocument, options: PathFiguresOptions = {}): PathFigures {
  const g = buildGraph(doc);
  const ones = new Float64Array(g.size).fill(1);
  const minutes = new Float64Array(g.size);
  for (let v = 0; v < g.size; v++) minutes[v] = stepMinutes(g.steps[v]!, doc.meta.minutesPerStep);
  const probability = branchProbabilities(g, options);
  const scc = stronglyConnected(g);
  const dfs = depthFirst(g, g.start);
  const prepared = { scc, order: dfs.order, ok: almostSurelyAbsorbed(g, probability) };
  const bySteps = expectedToEnding({ graph: g, probability, cost: ones }, prepared);
  const byMinutes = expectedToEnding({ graph: g, probability, cost: minutes }, prepared);
  // The record is built on first access: 20 000 small objects cost more than the solve itself,
  // and most callers read a handful of steps, or none.
  let perStep: Record<string, StepFigures> | undefined;
  const buildPerStep = () => {
    const out: Record<string, StepFigures> = {};
    for (let v = 0; v < g.size; v++) out[g.steps[v]!.id] = { expectedSteps: bySteps.expected[v]!, expectedMinutes: byMinutes.expected[v]! };
    return out;
  };
  const pair = (a: number | null, b: number | null): PathLength | null => (a === null || b === null ? null : { steps: a, minutes: b });
  const startOk = g.start >= 0 && Number.isFinite(bySteps.expected[g.start]!);
  return {
    shortest: g.start < 0 ? null : pair(cheapestToEnding(g, ones), cheapestToEnding(g, minutes)),
    longest: g.start < 0 ? null : pair(longestToEnding(g, dfs, ones), longestToEnding(g, dfs, minutes)),
    expected: startOk ? { steps: bySteps.expected[g.start]!, minutes: byMinutes.expected[g.start]! } : null,
    get perStep() {
      return (perStep ??= buildPerStep());
    },
    hasLoops: Array.prototype.some.call(scc.cyclic, (c: number) => c === 1),
    converged: bySteps.converged && byMinutes.converged,
  };
}
